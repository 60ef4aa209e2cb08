import { describe, it, expect } from 'vitest';
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { rrlu, rightNullVectors, leftNullVectors, solveParticular } from '../../src/engine/analyses/rrlu';
import { rng } from '../seeded'; // mulberry32, common practice


describe('rank-revealing LU (Golub & Van Loan, complete pivoting)', () => {
  it('finds the rank of random low-rank matrices like the SVD of ml-matrix (independent library), with exact null vectors', () => {
    const r = rng(9);
    for (const [n, k] of [[6, 6], [6, 4], [9, 5], [12, 1], [15, 11]]) {
      // A = X·Yᵀ with X, Y n×k: rank k.
      const X = Array.from({ length: n }, () => Array.from({ length: k }, () => r() - 0.5));
      const Y = Array.from({ length: n }, () => Array.from({ length: k }, () => r() - 0.5));
      const A = new Float64Array(n * n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let m = 0; m < k; m++) A[i * n + j] += X[i][m] * Y[j][m];
      const f = rrlu(A, n, 1e-12);
      const svdRank = new SingularValueDecomposition(new Matrix(Array.from({ length: n }, (_, i) => Array.from(A.slice(i * n, i * n + n))))).rank;
      expect(f.rank).toBe(svdRank);
      expect(f.rank).toBe(k);
      for (const w of rightNullVectors(f)) {
        for (let i = 0; i < n; i++) { let s = 0; for (let j = 0; j < n; j++) s += A[i * n + j] * w[j]; expect(Math.abs(s)).toBeLessThan(1e-12); }
      }
      for (const v of leftNullVectors(f)) {
        for (let j = 0; j < n; j++) { let s = 0; for (let i = 0; i < n; i++) s += v[i] * A[i * n + j]; expect(Math.abs(s)).toBeLessThan(1e-12); }
      }
      // A consistent right-hand side (u = A·t) is solved exactly.
      const t = Float64Array.from({ length: n }, () => r());
      const u = new Float64Array(n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) u[i] += A[i * n + j] * t[j];
      const x = solveParticular(f, u);
      for (let i = 0; i < n; i++) { let s = 0; for (let j = 0; j < n; j++) s += A[i * n + j] * x[j]; expect(Math.abs(s - u[i])).toBeLessThan(1e-11); }
    }
  });
});
