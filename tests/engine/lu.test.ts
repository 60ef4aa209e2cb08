import { describe, it, expect } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { luReal, solveReal, solveRealTransposed, luComplex, solveComplex, solveComplexAdjoint } from '../../src/engine/linalg/lu';
import { rng } from '../seeded'; // mulberry32, common practice


describe('dense LU', () => {
  it('real solve matches ml-matrix (independent library) on random systems', () => {
    const r = rng(7);
    for (const n of [1, 3, 10, 40]) {
      const A = new Float64Array(n * n).map(() => r() - 0.5);
      const b = new Float64Array(n).map(() => r() - 0.5);
      const x = solveReal(luReal(A, n), b);
      const rows = Array.from({ length: n }, (_, i) => Array.from(A.slice(i * n, i * n + n)));
      const ref = solve(new Matrix(rows), Matrix.columnVector(Array.from(b))).to1DArray();
      for (let i = 0; i < n; i++) expect(x[i]).toBeCloseTo(ref[i], 9);
      const xt = solveRealTransposed(luReal(A, n), b);
      const refT = solve(new Matrix(rows).transpose(), Matrix.columnVector(Array.from(b))).to1DArray();
      for (let i = 0; i < n; i++) expect(xt[i]).toBeCloseTo(refT[i], 9);
    }
  });

  it('complex solve and adjoint solve leave a small residual (residual check, common practice)', () => {
    const r = rng(11);
    const n = 25;
    const Ar = new Float64Array(n * n).map(() => r() - 0.5);
    const Ai = new Float64Array(n * n).map(() => r() - 0.5);
    const br = new Float64Array(n).map(() => r());
    const bi = new Float64Array(n).map(() => r());
    const f = luComplex(Ar, Ai, n);
    const [xr, xi] = solveComplex(f, br, bi);
    const [yr, yi] = solveComplexAdjoint(f, br, bi);
    for (let i = 0; i < n; i++) {
      let sr = 0, si = 0, tr = 0, ti = 0;
      for (let j = 0; j < n; j++) {
        const ar = Ar[i * n + j], ai = Ai[i * n + j];
        sr += ar * xr[j] - ai * xi[j];
        si += ar * xi[j] + ai * xr[j];
        // (Aᴴ y)_i = Σ_j conj(A[j][i]) y_j
        const cr = Ar[j * n + i], ci = -Ai[j * n + i];
        tr += cr * yr[j] - ci * yi[j];
        ti += cr * yi[j] + ci * yr[j];
      }
      expect(Math.abs(sr - br[i]) + Math.abs(si - bi[i])).toBeLessThan(1e-11);
      expect(Math.abs(tr - br[i]) + Math.abs(ti - bi[i])).toBeLessThan(1e-11);
    }
  });

  it('reports the column where a singular matrix loses rank', () => {
    const A = new Float64Array([1, 2, 2, 4]);
    expect(luReal(A, 2).singularAt).toBe(1);
  });
});
