import { describe, it, expect } from 'vitest';
import { refineRealEigenvalue, refineComplexEigenvalue } from '../../src/engine/linalg/refine';
import { finiteEigenvalues } from '../../src/engine/linalg/qz';

/** Buffered RC ladder: stage k is gm_k·v_{k−1} into R_k ∥ C_k,
 *  so G is lower bidiagonal, C diagonal and the poles are −1/(R_k C_k) (common practice). */
function bufferedLadder(tau: number[]) {
  const n = tau.length;
  const A = new Float64Array(n * n), B = new Float64Array(n * n);
  for (let k = 0; k < n; k++) {
    const g = 10 ** (-3 - (k % 3));
    A[k * n + k] = -g;
    B[k * n + k] = tau[k] * g;
    if (k > 0) A[k * n + k - 1] = 2e-3; // −G entry of the transconductance from node k−1
  }
  return { n, A, B };
}

describe('refinement on the original pencil', () => {
  it('a real pole given 1e-7 off comes back to full relative accuracy (stiff, 1 ps … 1 s)', () => {
    // Closed form: poles −1/τ_k of the buffered ladder (see above).
    const tau = Array.from({ length: 13 }, (_, k) => 10 ** (-12 + k));
    const { n, A, B } = bufferedLadder(tau);
    const scale = { normA: Math.hypot(...A), normB: Math.hypot(...B) };
    for (const t of tau) {
      const exact = -1 / t;
      const got = refineRealEigenvalue(A, B, n, exact * (1 + 1e-7), scale);
      expect(got).not.toBeNull();
      expect(Math.abs((got! - exact) / exact)).toBeLessThan(1e-13);
    }
  });

  it('a complex pole given 1e-7 off comes back to the closed form of a gm-C biquad', () => {
    // Closed form: s² + (G1/C1)s + gm1·gm2/(C1·C2) = 0 (two-integrator loop, common practice).
    const gm1 = 1e-3, gm2 = 2e-3, G1 = 1e-5, C1 = 1e-12, C2 = 2e-12;
    const A = new Float64Array([-G1, -gm2, gm1, 0]), B = new Float64Array([C1, 0, 0, C2]);
    const p = G1 / C1 / 2, w = Math.sqrt((gm1 * gm2) / (C1 * C2) - p * p);
    const got = refineComplexEigenvalue(A, B, 2, -p * (1 + 1e-7), w * (1 - 1e-7), { normA: 1, normB: 1 });
    expect(got).not.toBeNull();
    expect(Math.hypot(got!.re + p, got!.im - w) / Math.hypot(p, w)).toBeLessThan(1e-13);
  });

  it('finiteEigenvalues polishes the small poles of a dense stiff pencil', () => {
    // The ladder times a dense unit lower-triangular L (row operations): L·A and L·B stay lower
    // triangular with the same diagonal, so even the rounded pencil has exactly the poles
    // A_kk/B_kk = −1/τ_k (closed form). With balancing off the permutation cannot isolate them
    // and QZ alone misses the small poles by ~1e-2 (seen while writing this test); the polish
    // on the original pencil must bring them all to 1e-9.
    const tau = Array.from({ length: 13 }, (_, k) => 10 ** (-12 + k));
    const { n, A, B } = bufferedLadder(tau);
    const LA = new Float64Array(n * n), LB = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
      let sa = 0, sb = 0;
      for (let k = 0; k <= i; k++) {
        const l = k === i ? 1 : 2 ** -(i - k);
        sa += l * A[k * n + j]; sb += l * B[k * n + j];
      }
      LA[i * n + j] = sa; LB[i * n + j] = sb;
    }
    const expected = tau.map((t) => -1 / t).sort((a, b) => Math.abs(a) - Math.abs(b));
    for (const balance of [false, true]) {
      const res = finiteEigenvalues(LA, LB, n, { balance });
      expect(res.values.length).toBe(n);
      res.values.forEach((v, k) => expect(Math.abs((v.re - expected[k]) / expected[k])).toBeLessThan(1e-9));
    }
  });
});
