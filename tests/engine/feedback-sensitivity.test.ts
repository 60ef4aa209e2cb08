import { describe, it, expect } from 'vitest';
import { poleSensitivity } from '../../src/engine/feedback/sensitivity';
import { computePoles } from '../../src/engine/analyses/poles';
import { build, R, Cap, Gm, Vcvs, Ind, Vsrc } from './feedback-fixtures';

type Vals = Record<string, number>;
// Two-stage Miller amplifier with an inductive load branch and a vcvs buffer (invented values):
// enough different element kinds to exercise every stamp of the sensitivity formula.
function net(v: Vals) {
  return build([
    Vsrc('V1', 'in', '0'),
    Gm('G1', 'a', '0', 'in', 'out', v.gm1), R('R1', 'a', '0', v.R1), Cap('C1', 'a', '0', v.C1),
    Gm('G2', 'out', '0', 'a', '0', v.gm2), R('R2', 'out', '0', v.R2), Cap('CL', 'out', '0', v.CL),
    Cap('Cc', 'a', 'out', v.Cc),
    Vcvs('E1', 'buf', '0', 'out', '0', v.E1), R('R3', 'buf', 'l', v.R3), Ind('L1', 'l', '0', v.L1),
  ], { input: 'V1', output: { kind: 'voltage', node: 'out' } });
}
const base: Vals = { gm1: 1e-4, R1: 1e6, C1: 50e-15, gm2: 2e-3, R2: 1e5, CL: 1e-12, Cc: 0.5e-12, E1: 0.8, R3: 1e3, L1: 1e-6 };
const key: Record<string, string> = { G1: 'gm1', R1: 'R1', C1: 'C1', G2: 'gm2', R2: 'R2', CL: 'CL', Cc: 'Cc', E1: 'E1', R3: 'R3', L1: 'L1' };

describe('pole sensitivity from eigenvectors', () => {
  it('single RC pole: d ln p / d ln R = d ln p / d ln C = −1 (p = −1/RC, common practice)', () => {
    const sys = build([Vsrc('V1', 'in', '0'), R('R', 'in', 'out', 1e3), Cap('C', 'out', '0', 1e-9)], { input: 'V1' });
    const s = poleSensitivity(sys);
    expect(s.status).toBe('ok');
    const r = s.ranked.find((e) => e.part === 'R')!;
    const c = s.ranked.find((e) => e.part === 'C')!;
    expect(r.value).toBe('R');
    expect(r.dlnp.re).toBeCloseTo(-1, 8);
    expect(c.dlnp.re).toBeCloseTo(-1, 8);
  });

  it('matches central finite differences of the QZ poles for every element (slowest and a fast pole)', () => {
    const sys = net(base);
    const poles = computePoles(sys).poles.filter((p) => p.kind !== 'origin').sort((a, b) => a.omegaN - b.omegaN);
    for (const target of [undefined, { re: poles[poles.length - 1].re, im: poles[poles.length - 1].im }]) {
      const s = poleSensitivity(sys, { target });
      expect(s.status).toBe('ok');
      expect(s.residual!).toBeLessThan(1e-10);
      const lam = s.pole!;
      for (const e of s.ranked) {
        const name = key[e.part];
        const h = 1e-6;
        const at = (f: number) => {
          const ps = computePoles(net({ ...base, [name]: base[name] * f })).poles;
          // nearest pole to λ (the perturbation is tiny)
          return ps.reduce((a, b) => (Math.hypot(a.re - lam.re, a.im - lam.im) < Math.hypot(b.re - lam.re, b.im - lam.im) ? a : b));
        };
        const up = at(1 + h), dn = at(1 - h);
        // d ln λ/d ln v ≈ (λ(v(1+h)) − λ(v(1−h)))/(2h·λ)
        const dr = (up.re - dn.re) / (2 * h), di = (up.im - dn.im) / (2 * h);
        const d2 = lam.re * lam.re + lam.im * lam.im;
        const fre = (dr * lam.re + di * lam.im) / d2, fim = (di * lam.re - dr * lam.im) / d2;
        expect(Math.abs(e.dlnp.re - fre)).toBeLessThan(1e-4 * Math.max(1, e.magnitude));
        expect(Math.abs(e.dlnp.im - fim)).toBeLessThan(1e-4 * Math.max(1, e.magnitude));
      }
      // ranked, largest first
      for (let i = 1; i < s.ranked.length; i++) expect(s.ranked[i - 1].magnitude).toBeGreaterThanOrEqual(s.ranked[i].magnitude);
    }
  });

  it('unity-feedback Miller amplifier: closed-loop pole at ωu = gm1/Cc, so d ln p/d ln gm1 ≈ +1, d ln p/d ln Cc ≈ −1 (Gray & Meyer)', () => {
    // second stage made fast (gm2 = 20 mS) so p2 and the zero sit far above ωu, as the rule assumes
    const s = poleSensitivity(net({ ...base, gm2: 20e-3 }));
    const of = (part: string) => s.ranked.find((x) => x.part === part)!.dlnp.re;
    expect(Math.abs(of('G1') - 1)).toBeLessThan(0.1);
    expect(Math.abs(of('Cc') + 1)).toBeLessThan(0.1);
    expect(Math.abs(of('R1'))).toBeLessThan(0.1);
    expect(['G1', 'Cc']).toContain(s.ranked[0].part);
  });
});
