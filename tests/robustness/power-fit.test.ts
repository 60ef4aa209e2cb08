// The growth-exponent fit used by the scaling benchmark (tests/bench/scaling-bench.ts), checked on
// exact power laws and on a known noisy case (least squares on log t vs log n, common practice).
import { describe, expect, it } from 'vitest';
import { fitPowerLaw } from '../bench/scaling-bench';

describe('fitPowerLaw', () => {
  it('recovers k and c of t = c·n^k exactly', () => {
    const ns = [10, 20, 40, 60, 100, 150, 200];
    for (const [c, k] of [[2e-3, 3], [0.5, 1], [7, 2.4]]) {
      const f = fitPowerLaw(ns, ns.map((n) => c * n ** k))!;
      expect(f.exponent).toBeCloseTo(k, 12);
      expect(f.prefactor / c).toBeCloseTo(1, 10);
      expect(f.r2).toBeCloseTo(1, 12);
    }
  });

  it('is the ordinary least-squares slope: for two points, the secant in log–log', () => {
    // two points (10, 1) and (100, 50): k = log10(50) = 1.69897 (definition of the slope)
    const f = fitPowerLaw([10, 100], [1, 50])!;
    expect(f.exponent).toBeCloseTo(Math.log10(50), 12);
    // a symmetric ±10 % wobble about n² leaves the slope at 2 (residuals cancel in the normal equations)
    const g = fitPowerLaw([10, 100, 1000], [100 * 1.1, 10000 / 1.1 / 1.1, 1e6 * 1.1])!;
    expect(g.exponent).toBeCloseTo(2, 12);
    expect(g.r2).toBeLessThan(1);
  });

  it('returns null when a fit is not defined (fewer than two points, all n equal)', () => {
    expect(fitPowerLaw([10], [1])).toBeNull();
    expect(fitPowerLaw([10, 10], [1, 2])).toBeNull();
    expect(fitPowerLaw([10, 20], [0, 0])).toBeNull();
  });
});
