import { describe, it, expect } from 'vitest';
import { findDoublets, boosterChecks } from '../../src/engine/feedback/doublets';
import { discoverLoops } from '../../src/engine/feedback/loops';
import { loopMargins } from '../../src/engine/feedback/margins';
import { build, R, Cap, Gm, Vcvs, Vsrc } from './feedback-fixtures';

// Gain-boosted cascode stage in unity feedback (invented values): input device M1 (control out − in,
// an ideal differential pair folded into one transconductance), cascode M2, booster A1 (one-pole
// amplifier macro: A0 into 1 Ω ∥ C, unity buffer to M2's gate) sensing x = M2's source.
function boosted(boosterPoleHz: number, A = 50) {
  return build([
    Vsrc('V1', 'in', '0'),
    Gm('M1', 'x', '0', 'out', 'in', 1e-3), R('M1.ro', 'x', '0', 100e3),
    Gm('M2', 'out', 'x', 'gx', 'x', 2e-3), R('M2.ro', 'out', 'x', 100e3),
    Gm('A1', '0', 'A1#1', '0', 'x', A, 'A0'), R('A1.r1', 'A1#1', '0', 1), Cap('A1.c1', 'A1#1', '0', 1 / (2 * Math.PI * boosterPoleHz)),
    Vcvs('A1', 'gx', '0', 'A1#1', '0', 1, 'out'),
    R('RL', 'out', '0', 500e3), Cap('CL', 'out', '0', 1e-12), Cap('Cx', 'x', '0', 100e-15), Cap('Cg', 'gx', '0', 20e-15),
  ], { input: 'V1', output: { kind: 'voltage', node: 'out' } });
}

describe('doublets', () => {
  it('lag network: finds the pole–zero pair 1/((R1 + R2)C), 1/(R2·C) (common practice)', () => {
    const R1 = 500, R2 = 10e3, Cl = 1e-9;
    const sys = build([Vsrc('V1', 'in', '0'), R('R1', 'in', 'out', R1), R('R2', 'out', 'm', R2), Cap('C', 'm', '0', Cl)],
      { input: 'V1', output: { kind: 'voltage', node: 'out' } });
    const d = findDoublets(sys);
    expect(d.status).toBe('ok');
    expect(d.doublets.length).toBe(1);
    expect(d.doublets[0].pole.re * (R1 + R2) * Cl).toBeCloseTo(-1, 8);
    expect(d.doublets[0].zero.re * R2 * Cl).toBeCloseTo(-1, 8);
    expect(d.doublets[0].spacing).toBeCloseTo(R1 / R2, 8);
    expect(d.doublets[0].tailSeconds / ((R1 + R2) * Cl)).toBeCloseTo(1, 8);
    // pairs farther apart than the limit are not doublets
    expect(findDoublets(sys, { spacing: 0.04 }).doublets.length).toBe(0);
  });
});

describe('gain-boosted cascode placement (Bult & Geelen, IEEE JSSC 1990)', () => {
  const check = (poleHz: number) => {
    const sys = boosted(poleHz);
    const d = discoverLoops(sys);
    return { sys, checks: boosterChecks(sys, d.loops) };
  };

  it('finds the booster around M2 and judges its unity-gain frequency against BW and p2', () => {
    for (const [poleHz, expectOk] of [[12e6, true], [0.3e6, false], [2e9, false]] as const) {
      const { sys, checks } = check(poleHz);
      expect(checks.length).toBe(1);
      const c = checks[0];
      expect(c.amplifier).toBe('A1');
      expect(c.device).toBe('M2');
      // the figures it compares are the loop's own crossover and the bounds of the rule
      expect(c.boosterUnityGainHz).toBeCloseTo(loopMargins(sys, 'A1.A0').unityGainHz!, 0);
      // closed-loop BW of a unity-feedback single-stage OTA ≈ gm1/(2π·CL) (common practice), within 15 %
      expect(Math.abs(c.mainBandwidthHz! / (1e-3 / (2 * Math.PI * 1e-12)) - 1)).toBeLessThan(0.15);
      // non-dominant pole at the cascode source ≈ gm2/(2π·Cx) (Razavi), within 15 %
      expect(Math.abs(c.mainNonDominantHz! / (2e-3 / (2 * Math.PI * 100e-15)) - 1)).toBeLessThan(0.15);
      const inside = c.boosterUnityGainHz! > c.mainBandwidthHz! && c.boosterUnityGainHz! < c.mainNonDominantHz!;
      expect(c.ok).toBe(inside);
      expect(c.ok).toBe(expectOk);
      expect(c.verdict).toMatch(/A1 around M2/);
    }
  });

  it('a too-slow booster leaves a doublet near its unity-gain frequency in the closed-loop transfer', () => {
    const { sys, checks } = check(0.3e6);
    const d = findDoublets(sys);
    const near = d.doublets.filter((x) => x.poleHz > checks[0].boosterUnityGainHz! / 4 && x.poleHz < checks[0].boosterUnityGainHz! * 4);
    expect(near.length).toBeGreaterThan(0);
  });
});
