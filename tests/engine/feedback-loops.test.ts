import { describe, it, expect } from 'vitest';
import { discoverLoops } from '../../src/engine/feedback/loops';
import { build, R, Cap, Gm, Vsrc, nmos, regulatedCascode } from './feedback-fixtures';

describe('loop discovery', () => {
  it('source follower: only local loops (Razavi: follower = local feedback through the source)', () => {
    const sys = build([Vsrc('V1', 'in', '0'), ...nmos('M1', '0', 'in', 'out', 2e-3, 50e3, 4e-4), R('RB', 'out', '0', 20e3)], { input: 'V1' });
    const d = discoverLoops(sys);
    expect(d.loops.length).toBeGreaterThan(0);
    for (const l of d.loops) expect(l.kind).toBe('local');
    // one part, one loop: gm and gmb both sense the source node
    expect(d.loops.length).toBe(1);
    const gmLoop = d.loops.find((l) => l.id === 'M1.gm')!;
    expect(gmLoop.parts).toEqual(['M1']);
    expect(gmLoop.sources.map((m) => m.id)).toEqual(['M1.gm', 'M1.gmb']);
    // the device's local loop with gm and gmb together: (gm + gmb)·(ro ∥ RB) — common practice
    // (follower output resistance 1/(gm + gmb) ∥ ro ∥ RB, Razavi)
    const rpar = 1 / (1 / 50e3 + 1 / 20e3);
    expect(gmLoop.cycleGainDc.re).toBeCloseTo((2e-3 + 4e-4) * rpar, 8);
    // Bode return ratio of gm with gmb present: gm / (1/ro + 1/RB + gmb) — common practice
    expect(gmLoop.returnRatioDc.value!.re).toBeCloseTo(2e-3 / (1 / 50e3 + 1 / 20e3 + 4e-4), 8);
    expect(gmLoop.nets).toEqual(['out']);
  });

  it('regulated cascode: a global loop A1 → M2 keyed at the amplifier, plus M2 local degeneration', () => {
    const A = 50;
    const d = discoverLoops(regulatedCascode(A, 10e6));
    const global = d.loops.filter((l) => l.kind === 'global');
    expect(global.length).toBe(1);
    const g = global[0];
    expect(g.key).toBe('A1.A0');
    expect(g.members.map((m) => m.id)).toEqual(['A1.A0', 'M2.gm']);
    expect(g.nets).toEqual(['gx', 'x']);
    expect(g.band!.fromHz).toBe(0);
    // hand nodal analysis of the small-signal model (common practice): with the loop broken at A1,
    // T = A·gm2 / (gm2 + 1/ro1 + 1/ro2 + RL/(ro1·ro2)); the load RL starves M2, so T ≈ A/2 here.
    const gm2 = 1e-3, go = 1e-5, RL = 10e6;
    expect(g.returnRatioDc.value!.re).toBeCloseTo((A * gm2) / (gm2 + 2 * go + RL * go * go), 8);
    expect(d.loops.some((l) => l.id === 'M2.gm' && l.kind === 'local')).toBe(true);
    expect(d.truncated).toBe(false);
    expect(d.groups.some((grp) => grp.includes('A1.A0') && grp.includes('M2.gm'))).toBe(true);
  });

  it('a loop closed only through a capacitor is active only above a frequency (Miller coupling)', () => {
    // common-source stage M1 with gate driven from a resistive source and Cgd to its drain: the only
    // way back from drain to gate is Cgd, so |T| = 0 at DC and grows with frequency (common practice).
    const sys = build([Vsrc('V1', 'in', '0'), R('RS', 'in', 'g', 10e3), ...nmos('M1', 'd', 'g', '0', 2e-3, 50e3),
      R('RD', 'd', '0', 10e3), Cap('Cgd', 'g', 'd', 20e-15), Cap('Cgs', 'g', '0', 50e-15)], { input: 'V1' });
    const d = discoverLoops(sys, { threshold: 0.01 });
    const m = d.loops.find((l) => l.id === 'M1.gm')!;
    expect(Math.abs(m.cycleGainDc.re)).toBeLessThan(1e-12);
    expect(m.band).not.toBeNull();
    // |T(jω)| ≈ ω·RS·Cgd·gm·(RD∥ro) at low frequency (Miller, common practice): crosses 0.01 near
    const rd = 1 / (1 / 10e3 + 1 / 50e3);
    const fCross = 0.01 / (2 * Math.PI * 10e3 * 20e-15 * 2e-3 * rd);
    expect(m.band!.fromHz).toBeGreaterThan(0.5 * fCross);
    expect(m.band!.fromHz).toBeLessThan(2 * fCross);
  });

  it('reports a cut when the cap is smaller than the number of loops', () => {
    const d = discoverLoops(regulatedCascode(50, 10e6), { cap: 1 });
    expect(d.loops.length).toBe(1);
    expect(d.truncated).toBe(true);
  });
});

describe('coupling graph semantics', () => {
  it('edges are direct transfers: d(G1→G2) = gm1·R1, and the two-stage cycle gain is gm1R1·gm2R2 (common practice)', () => {
    const gm1 = 1e-4, R1 = 1e6, gm2 = 2e-3, R2 = 1e5;
    const sys = build([
      Vsrc('V1', 'in', '0'),
      Gm('G1', 'a', '0', 'in', 'out', gm1), R('R1', 'a', '0', R1),
      Gm('G2', 'out', '0', 'a', '0', gm2), R('R2', 'out', '0', R2),
    ], { input: 'V1' });
    const d = discoverLoops(sys);
    const g = d.graph;
    const i1 = g.stamps.findIndex((s) => s.id === 'G1.gm'), i2 = g.stamps.findIndex((s) => s.id === 'G2.gm');
    const N = g.stamps.length;
    // G1 takes gm1·vc out of a: its unit-control excitation drives a to −gm1·R1
    expect(g.re[0][i1 * N + i2]).toBeCloseTo(-gm1 * R1, 9);
    const loop = d.loops.find((l) => l.kind === 'global')!;
    expect(loop.cycleGainDc.re).toBeCloseTo(gm1 * R1 * gm2 * R2, 6);
    expect(loop.returnRatioDc.value!.re).toBeCloseTo(gm1 * R1 * gm2 * R2, 6);
  });

  it('the key\'s Bode return ratio follows from the graph by signal-flow algebra (Mason 1953)', () => {
    // two coupled sources A (A1.A0) and M (M2.gm): T_A = −d_AA − d_AM·d_MA/(1 − d_MM)
    const sys = regulatedCascode(30, 2e6);
    const d = discoverLoops(sys, { freqsHz: [3e7, 1e9] });
    const g = d.graph;
    const N = g.stamps.length;
    const a = g.stamps.findIndex((s) => s.id === 'A1.A0'), m = g.stamps.findIndex((s) => s.id === 'M2.gm');
    expect(N).toBe(2); // M1's control is grounded, so it is not in the graph
    const loop = d.loops.find((l) => l.key === 'A1.A0')!;
    for (let fi = 0; fi < g.fHz.length; fi++) {
      const dd = (i: number, j: number) => ({ re: g.re[fi][i * N + j], im: g.im[fi][i * N + j] });
      const mul = (x: { re: number; im: number }, y: { re: number; im: number }) => ({ re: x.re * y.re - x.im * y.im, im: x.re * y.im + x.im * y.re });
      const num = mul(dd(a, m), dd(m, a));
      const den = { re: 1 - dd(m, m).re, im: -dd(m, m).im };
      const q = den.re * den.re + den.im * den.im;
      const ratio = { re: (num.re * den.re + num.im * den.im) / q, im: (num.im * den.re - num.re * den.im) / q };
      const T = { re: -dd(a, a).re - ratio.re, im: -dd(a, a).im - ratio.im };
      const exact = fi === 0 ? loop.returnRatioDc.value! : loop.returnRatio.points[fi - 1].value!;
      expect(T.re).toBeCloseTo(exact.re, 8);
      expect(T.im).toBeCloseTo(exact.im, 8);
    }
  });
});
