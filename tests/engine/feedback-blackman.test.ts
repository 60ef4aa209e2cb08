import { describe, it, expect } from 'vitest';
import { blackmanAt, fullPencil } from '../../src/engine/feedback/blackman';
import { regulationOf, loopRegulation } from '../../src/engine/feedback/regulation';
import { discoverLoops } from '../../src/engine/feedback/loops';
import { returnRatioDirect } from '../../src/engine/feedback/returnRatio';
import { sourceStamps } from '../../src/engine/feedback/pencil';
import { cabs, cdiv, cmul, cadd, cx } from '../../src/engine/feedback/cx';
import type { MnaSystem } from '../../src/engine/types';
import { build, R, Cap, Gm, Vcvs, Vsrc, nmos } from './feedback-fixtures';
import { regulatedCascode } from './feedback-fixtures';

/** The network with node i shorted to ground by a 0 V source (one extra MNA branch, Ho et al. 1975). */
function shorted(sys: MnaSystem, i: number): MnaSystem {
  const n = sys.n, m = n + 1;
  const G = new Float64Array(m * m);
  const C = new Float64Array(m * m);
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) { G[r * m + c] = sys.G[r * n + c]; C[r * m + c] = sys.C[r * n + c]; }
  G[n * m + i] = 1;
  G[i * m + n] = 1;
  return { ...sys, n: m, G, C, b: new Float64Array(m), c: new Float64Array(m), branchNames: [...sys.branchNames, 'short'] };
}

describe('Blackman impedance formula (Blackman 1943)', () => {
  it('Z⁰(1 + T_sc)/(1 + T_oc) equals the directly solved impedance, and T_sc matches a literal short', () => {
    const sys = regulatedCascode(40, 3e6);
    for (const key of ['A1.A0', 'M2.gm', 'M1.gm']) {
      for (const fHz of [0, 2e8, 3e9]) {
        const b = blackmanAt(sys, key, { fHz });
        expect(b.status).toBe('ok');
        for (const nd of b.nodes) {
          // Blackman 1943: consistency of the product with the direct solve
          const prod = cmul(nd.z0, cdiv(cadd(cx(1), nd.tSc), cadd(cx(1), nd.tOc))!);
          expect(cabs({ re: prod.re - nd.z.re, im: prod.im - nd.z.im })).toBeLessThan(1e-8 * cabs(nd.z) + 1e-9);
          // Bode's definition with the node literally shorted
          const sh = shorted(sys, nd.index);
          const st = sourceStamps(sh).find((s) => s.id === key)!;
          const lit = returnRatioDirect(sh, sh.G, st, 2 * Math.PI * fHz);
          expect(lit.value!.re).toBeCloseTo(nd.tSc.re, 6);
          expect(lit.value!.im).toBeCloseTo(nd.tSc.im, 6);
        }
      }
    }
  });

  it('regulated cascode, unloaded: Rout = ro1 + ro2 + (1 + A)·gm2·ro2·ro1, about (1 + A) × the plain cascode', () => {
    const A = 50, gm2 = 1e-3, ro = 100e3;
    const sys = regulatedCascode(A, null);
    const zOut = (scale?: Record<string, number>) =>
      blackmanAt(sys, 'M1.gm', { scale }).nodes.find((x) => x.node === 'out')!.z.re;
    // Razavi, Design of Analog CMOS ICs (regulated cascode); Gray, Hurst, Lewis & Meyer (cascode Rout)
    expect(zOut() / (ro + ro + (1 + A) * gm2 * ro * ro)).toBeCloseTo(1, 9);
    const plain = zOut({ 'A1.A0': 0 });
    expect(plain / (ro + ro + gm2 * ro * ro)).toBeCloseTo(1, 9);
    expect(Math.abs(zOut() / plain / (1 + A) - 1)).toBeLessThan(0.03);
    const reg = regulationOf(sys, 'A1.A0');
    expect(reg.holdsCurrent!.node).toBe('out');
    expect(Math.abs(reg.holdsCurrent!.factor / (1 + A) - 1)).toBeLessThan(0.05);
  });

  it('regulated cascode, output at AC ground: the held node x is (1 + A) × lower', () => {
    const A = 50, gm2 = 1e-3, go = 1e-5;
    const sys = build([
      ...nmos('M1', 'x', '0', '0', 1e-3, 1 / go), ...nmos('M2', '0', 'gx', 'x', gm2, 1 / go),
      Gm('A1', '0', 'gx', '0', 'x', A / 10e3, 'A0'), R('A1.ro', 'gx', '0', 10e3),
    ]);
    const b = blackmanAt(sys, 'A1.A0');
    const x = b.nodes.find((nd) => nd.node === 'x')!;
    // hand nodal analysis (common practice): Z_x = 1/((1 + A)gm2 + 2/ro), Z⁰_x = 1/(gm2 + 2/ro)
    expect(x.z.re * ((1 + A) * gm2 + 2 * go)).toBeCloseTo(1, 9);
    expect(x.z0.re * (gm2 + 2 * go)).toBeCloseTo(1, 9);
    expect(Math.abs(x.z0.re / x.z.re / (1 + A) - 1)).toBeLessThan(0.03);
    expect(regulationOf(sys, 'A1.A0').holdsVoltage!.node).toBe('x');
  });

  it('regulated cascode with a load: the loop holds V(x) and the current into out', () => {
    const d = discoverLoops(regulatedCascode(50, 10e6));
    const loop = d.loops.find((l) => l.kind === 'global')!;
    const reg = loopRegulation(regulatedCascode(50, 10e6), loop);
    expect(reg.holdsVoltage!.node).toBe('x');
    expect(reg.holdsCurrent!.node).toBe('out');
    expect(reg.holdsVoltage!.text).toMatch(/^holds V\(x\) — impedance ÷ \d/);
    expect(reg.holdsCurrent!.text).toMatch(/^holds the current into out — impedance × \d/);
    expect(reg.summary).toMatch(/small-signal/);
  });

  it('source follower: local loop holds V(source), Rout = 1/(gm + gmb) ∥ ro ∥ RB (Razavi)', () => {
    const gm = 2e-3, gmb = 4e-4, ro = 50e3, RB = 20e3;
    const sys = build([Vsrc('V1', 'in', '0'), ...nmos('M1', '0', 'in', 'out', gm, ro, gmb), R('RB', 'out', '0', RB), Cap('CL', 'out', '0', 1e-12)], { input: 'V1' });
    const reg = regulationOf(sys, 'M1.gm');
    expect(reg.holdsVoltage!.node).toBe('out');
    const z = reg.nodes.find((nd) => nd.node === 'out')!.z.re;
    expect(z * (gm + gmb + 1 / ro + 1 / RB)).toBeCloseTo(1, 10);
  });

  it('non-inverting amplifier: output impedance Ro/(1 + Aβ) (common practice)', () => {
    const A = 2000, Ro = 50, R1 = 300e3, R2 = 100e3;
    const sys = build([Vsrc('V1', 'in', '0'), Vcvs('E1', 'x', '0', 'in', 'fb', A, 'A0'), R('Ro', 'x', 'out', Ro),
      R('R1', 'out', 'fb', R1), R('R2', 'fb', '0', R2)], { input: 'V1' });
    const b = blackmanAt(sys, 'E1.A0');
    const out = b.nodes.find((nd) => nd.node === 'out')!;
    const beta = R2 / (R1 + R2);
    // common practice, valid for R1 + R2 ≫ Ro: within 0.1 %
    expect(Math.abs(out.z.re / (Ro / (1 + A * beta)) - 1)).toBeLessThan(1e-3);
    expect(b.nodes.find((nd) => nd.node === 'x')!.status).toBe('held');
  });

  it('names a missing source instead of failing', () => {
    const r = blackmanAt(regulatedCascode(10, null), 'Q9.gm');
    expect(r.status).toBe('unknown-source');
    expect(r.message).toMatch(/Q9\.gm/);
  });
});

describe('shared full factor (Sherman–Morrison)', () => {
  it('gives the same Z⁰, T_sc, T_oc as factoring the source-removed network (Sherman & Morrison 1950)', () => {
    const sys = regulatedCascode(50, 10e6);
    for (const fHz of [0, 3e6, 2e8]) {
      const shared = fullPencil(sys, sys.G, fHz);
      for (const key of ['A1.A0', 'M2.gm']) {
        const direct = blackmanAt(sys, key, { fHz });
        const viaShared = blackmanAt(sys, key, { fHz, shared });
        expect(viaShared.status).toBe('ok');
        direct.nodes.forEach((nd, i) => {
          const o = viaShared.nodes[i];
          const rel = (a: { re: number; im: number }, b: { re: number; im: number }) => Math.hypot(a.re - b.re, a.im - b.im) / Math.max(1e-30, Math.hypot(b.re, b.im));
          expect(rel(o.z0, nd.z0)).toBeLessThan(1e-9);
          expect(rel(o.factor, nd.factor)).toBeLessThan(1e-9);
        });
      }
    }
  });
});
