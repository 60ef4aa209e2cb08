import { describe, it, expect } from 'vitest';
import { assembleMna, buildMna, expandNetlist } from '../../src/engine/mna';
import { luComplex, luReal, solveComplex, solveReal } from '../../src/engine/linalg/lu';
import type { MnaSystem, Netlist, NetlistPart, OutputSpec } from '../../src/engine/types';

const net = (parts: NetlistPart[], input?: string, output?: OutputSpec): Netlist => ({ format: 'polesketch-netlist', version: 1, parts, input, output });
const part = (name: string, kind: NetlistPart['kind'], pins: Record<string, string>, values: Record<string, string | number> = {}): NetlistPart => ({ name, kind, pins, values });
const R = (name: string, p: string, n: string, v: string | number) => part(name, 'resistor', { p, n }, { value: v });

function matrixRows(M: Float64Array, n: number): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from(M.slice(i * n, i * n + n)));
}
function expectMatrix(M: Float64Array, n: number, want: number[][]) {
  const got = matrixRows(M, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(got[i][j], `entry (${i},${j})`).toBeCloseTo(want[i][j], 12);
}
/** DC transfer y/u from G·x = b. */
function dcGain(sys: MnaSystem): number {
  const f = luReal(sys.G, sys.n);
  expect(f.singularAt).toBe(-1);
  const x = solveReal(f, sys.b);
  return x.reduce((s, v, i) => s + v * sys.c[i], 0);
}
/** Transfer y/u at s = jω from (G + jωC)·x = b. */
function acGain(sys: MnaSystem, w: number): { re: number; im: number } {
  const im = sys.C.map((v) => v * w);
  const [xr, xi] = solveComplex(luComplex(sys.G, im, sys.n), sys.b, new Float64Array(sys.n));
  let re = 0, ii = 0;
  for (let i = 0; i < sys.n; i++) { re += xr[i] * sys.c[i]; ii += xi[i] * sys.c[i]; }
  return { re, im: ii };
}
function system(n: Netlist): MnaSystem {
  const r = buildMna(n);
  expect(r.issues.filter((i) => i.severity === 'error')).toEqual([]);
  return r.system!;
}

describe('MNA stamps written out by hand (Vlach & Singhal, stamp tables of ch. 3)', () => {
  it('voltage divider: matrix, vectors and DC solution v(out) = R2/(R1 + R2)', () => {
    const sys = system(net([part('V1', 'vsource', { p: 'in', n: '0' }), R('R1', 'in', 'out', '1k'), R('R2', 'out', 'gnd', '3k')], 'V1', { kind: 'voltage', node: 'out' }));
    expect(sys.nodeNames).toEqual(['in', 'out']);
    expect(sys.branchNames).toEqual(['V1']);
    expectMatrix(sys.G, 3, [
      [1e-3, -1e-3, 1],
      [-1e-3, 1e-3 + 1 / 3e3, 0],
      [1, 0, 0],
    ]);
    expect(Array.from(sys.b)).toEqual([0, 0, 1]);
    expect(Array.from(sys.c)).toEqual([0, 1, 0]);
    expect(dcGain(sys)).toBeCloseTo(0.75, 12); // divider: 3k / (1k + 3k)
  });

  it('capacitor, inductor and VCVS stamps', () => {
    const sys = system(net([
      part('V1', 'vsource', { p: 'a', n: '0' }),
      part('C1', 'capacitor', { p: 'a', n: 'b' }, { value: '2p' }),
      part('L1', 'inductor', { p: 'b', n: '0' }, { value: '5n' }),
      part('E1', 'vcvs', { p: 'c', n: '0', cp: 'b', cn: 'a' }, { gain: 4 }),
      R('R1', 'c', '0', 10),
    ], 'V1', { kind: 'current', part: 'L1' }));
    expect(sys.nodeNames).toEqual(['a', 'b', 'c']);
    expect(sys.branchNames).toEqual(['V1', 'L1', 'E1']);
    // unknowns: va vb vc iV1 iL1 iE1
    expectMatrix(sys.G, 6, [
      [0, 0, 0, 1, 0, 0],
      [0, 0, 0, 0, 1, 0],
      [0, 0, 0.1, 0, 0, 1],
      [1, 0, 0, 0, 0, 0],
      [0, 1, 0, 0, 0, 0],
      [4, -4, 1, 0, 0, 0], // vc − 4·(vb − va) = 0
    ]);
    expectMatrix(sys.C, 6, [
      [2e-12, -2e-12, 0, 0, 0, 0],
      [-2e-12, 2e-12, 0, 0, 0, 0],
      [0, 0, 0, 0, 0, 0],
      [0, 0, 0, 0, 0, 0],
      [0, 0, 0, 0, -5e-9, 0],
      [0, 0, 0, 0, 0, 0],
    ]);
    expect(Array.from(sys.c)).toEqual([0, 0, 0, 0, 1, 0]);
  });

  it('VCCS stamp and isource input: current gm·(v(cp) − v(cn)) leaves p and enters n (types.ts convention)', () => {
    const sys = system(net([
      part('I1', 'isource', { p: 'c', n: '0' }),
      R('R1', 'c', '0', '1k'),
      part('G1', 'vccs', { p: 'a', n: 'b', cp: 'c', cn: '0' }, { gm: '2m' }),
      R('R2', 'a', '0', '1k'),
      R('R3', 'b', '0', '1k'),
    ], 'I1', { kind: 'voltage', node: 'b', ref: 'a' }));
    expect(sys.nodeNames).toEqual(['c', 'a', 'b']);
    expectMatrix(sys.G, 3, [
      [1e-3, 0, 0],
      [2e-3, 1e-3, 0],
      [-2e-3, 0, 1e-3],
    ]);
    expect(Array.from(sys.b)).toEqual([1, 0, 0]);
    expect(Array.from(sys.c)).toEqual([0, -1, 1]);
    // 1 A into c → v(c) = 1 kV; 2 A out of a → v(a) = −2 kV; 2 A into b → v(b) = +2 kV.
    expect(dcGain(sys)).toBeCloseTo(4000, 6);
  });

  it('scale switches a controlled source by its id (0 = off, k = ×k)', () => {
    const n = net([part('V1', 'vsource', { p: 'g', n: '0' }), part('G1', 'vccs', { p: 'd', n: '0', cp: 'g', cn: '0' }, { gm: '1m' }), R('R1', 'd', '0', '10k')], 'V1', { kind: 'voltage', node: 'd' });
    const x = expandNetlist(n);
    expect(dcGain(assembleMna(x))).toBeCloseTo(-10, 10); // −gm·R (common practice)
    expect(dcGain(assembleMna(x, { scale: { 'G1.gm': 0.5 } }))).toBeCloseTo(-5, 10);
    expect(dcGain(assembleMna(x, { scale: { 'G1.gm': 0 } }))).toBe(0);
  });

  it('non-input sources are zeroed: vsource short, isource open', () => {
    const n = net([
      part('V1', 'vsource', { p: 'in', n: '0' }), R('R1', 'in', 'out', '1k'), R('R2', 'out', 'x', '1k'),
      part('V2', 'vsource', { p: 'x', n: '0' }), part('I2', 'isource', { p: 'out', n: '0' }),
    ], 'V1', { kind: 'voltage', node: 'out' });
    expect(dcGain(system(n))).toBeCloseTo(0.5, 12);
    const sys = assembleMna(expandNetlist(n), { input: 'I2' });
    expect(dcGain(sys)).toBeCloseTo(500, 9); // 1 A into 1k ∥ 1k
  });
});

describe('DC solves of small stages (textbook closed forms)', () => {
  it('transconductor with load: gain = −gm·R (Razavi, common-source stage)', () => {
    const sys = system(net([
      part('V1', 'vsource', { p: 'g', n: '0' }),
      part('M1', 'nmos', { d: 'out', g: 'g', s: '0' }, { gm: '2mS' }),
      R('RD', 'out', '0', '10k'),
    ], 'V1', { kind: 'voltage', node: 'out' }));
    expect(dcGain(sys)).toBeCloseTo(-20, 10);
  });

  it('common source with ro: gain = −gm·(RD ∥ ro) (Razavi)', () => {
    const sys = system(net([
      part('V1', 'vsource', { p: 'g', n: '0' }),
      part('M1', 'pmos', { d: 'out', g: 'g', s: '0' }, { gm: '1m', ro: '40k' }),
      R('RD', 'out', '0', '10k'),
    ], 'V1', { kind: 'voltage', node: 'out' }));
    expect(dcGain(sys)).toBeCloseTo(-1e-3 * 8e3, 9);
  });

  it('cascode output resistance ro1 + ro2 + gm2·ro1·ro2 by a test current (Gray, Hurst, Lewis & Meyer)', () => {
    const gm2 = 1e-3, ro1 = 50e3, ro2 = 80e3;
    const parts = [
      part('M1', 'nmos', { d: 'x', g: '0', s: '0' }, { gm: '1.2m', ro: ro1 }),
      part('M2', 'nmos', { d: 'out', g: '0', s: 'x' }, { gm: gm2, ro: ro2 }),
      part('IT', 'isource', { p: 'out', n: '0' }),
    ];
    const rout = dcGain(system(net(parts, 'IT', { kind: 'voltage', node: 'out' })));
    expect(rout).toBeCloseTo(ro1 + ro2 + gm2 * ro1 * ro2, 3);
    // With body effect (bulk of M2 at ground): gm2 → gm2 + gmb2 (Gray, Hurst, Lewis & Meyer).
    const gmb2 = 0.2e-3;
    parts[1] = part('M2', 'nmos', { d: 'out', g: '0', s: 'x', b: '0' }, { gm: gm2, gmb: gmb2, ro: ro2 });
    const rb = dcGain(system(net(parts, 'IT', { kind: 'voltage', node: 'out' })));
    expect(rb).toBeCloseTo(ro1 + ro2 + (gm2 + gmb2) * ro1 * ro2, 3);
  });

  it('bipolar common emitter: gain = −gm·(RC ∥ ro) with gm = Ic/VT (Gray, Hurst, Lewis & Meyer)', () => {
    const sys = system(net([
      part('V1', 'vsource', { p: 'b', n: '0' }),
      part('Q1', 'npn', { c: 'out', b: 'b', e: '0' }, { ic: '1m', beta: 100, va: 50 }),
      R('RC', 'out', '0', '5k'),
    ], 'V1', { kind: 'voltage', node: 'out' }));
    const gm = 1e-3 / 0.025852;
    const rl = (5e3 * 50e3) / 55e3;
    expect(dcGain(sys)).toBeCloseTo(-gm * rl, 2);
  });

  it('current output through a 0 V vsource', () => {
    const sys = system(net([part('V1', 'vsource', { p: 'in', n: '0' }), R('R1', 'in', 'm', '2k'), part('VM', 'vsource', { p: 'm', n: '0' })], 'V1', { kind: 'current', part: 'VM' }));
    expect(dcGain(sys)).toBeCloseTo(0.5e-3, 15); // Ohm's law; current flows p → n inside VM
  });
});

describe('amplifier macro', () => {
  const amp = (values: Record<string, string | number>, extra: NetlistPart[] = []) =>
    net([part('V1', 'vsource', { p: 'in', n: '0' }), part('A1', 'amplifier', { out: 'out', inp: 'in', inn: '0' }, values), ...extra], 'V1', { kind: 'voltage', node: 'out' });

  it('DC gain A0 (also given in dB) and scaling of the A0 element scales the whole gain', () => {
    expect(dcGain(system(amp({ A0: 2000, p1: '10' })))).toBeCloseTo(2000, 6);
    expect(dcGain(system(amp({ A0: '60dB' })))).toBeCloseTo(1000, 6); // 20·log10(1000) = 60 dB
    const x = expandNetlist(amp({ A0: 2000, p1: 10, p2: '1M' }));
    expect(x.elements.filter((e) => e.type === 'vccs' || e.type === 'vcvs').map((e) => (e as { id: string }).id)).toEqual(['A1.A0', 'A1.stage2', 'A1.out']);
    expect(x.nodeNames).toEqual(['in', 'out', 'A1#1', 'A1#2']);
    expect(dcGain(assembleMna(x, { scale: { 'A1.A0': 0.25 } }))).toBeCloseTo(500, 6);
  });

  it('two-pole response matches A0 / ((1 + jω/ω1)(1 + jω/ω2)) (closed form)', () => {
    const A0 = 1e4, f1 = 100, f2 = 1e6;
    const sys = system(amp({ A0, p1: f1, p2: f2 }));
    for (const f of [10, 1e3, 3e5, 1e7]) {
      const w = 2 * Math.PI * f;
      // 1/((1 + ja)(1 + jb)) = 1/((1 − ab) + j(a + b))
      const a = f / f1, b = f / f2;
      const dr = 1 - a * b, di = a + b, d2 = dr * dr + di * di;
      const want = { re: (A0 * dr) / d2, im: (-A0 * di) / d2 };
      const got = acGain(sys, w);
      const mag = Math.hypot(want.re, want.im);
      expect(Math.abs(got.re - want.re) / mag).toBeLessThan(1e-9);
      expect(Math.abs(got.im - want.im) / mag).toBeLessThan(1e-9);
    }
  });

  it('output resistance forms a divider with a load: A0·RL/(RL + rout)', () => {
    expect(dcGain(system(amp({ A0: 100, rout: '1k' }, [R('RL', 'out', '0', '3k')])))).toBeCloseTo(75, 9);
  });

  it('a follower built from it has closed-loop gain A0/(1 + A0) (negative feedback, common practice)', () => {
    const n = net([part('V1', 'vsource', { p: 'in', n: '0' }), part('A1', 'amplifier', { out: 'out', inp: 'in', inn: 'out' }, { A0: 999 })], 'V1', { kind: 'voltage', node: 'out' });
    expect(dcGain(system(n))).toBeCloseTo(0.999, 12);
  });
});
