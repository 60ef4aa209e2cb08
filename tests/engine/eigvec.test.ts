import { describe, it, expect } from 'vitest';
import { finiteEigenvalues } from '../../src/engine/linalg/qz';
import { eigenvectorPair } from '../../src/engine/linalg/eigvec';
import * as linalg from '../../src/engine/linalg';
import { dggev } from '../bench/emlapack';
import { randomNetworkPencil } from '../bench/eig-bench';

/** ‖yᴴ(A − λB)‖ / ((‖A‖ + |λ|‖B‖)‖y‖), computed here independently of eigvec.ts. */
function leftResidual(A: Float64Array, B: Float64Array, n: number, l: { re: number; im: number },
  yr: Float64Array, yi: Float64Array): number {
  let s = 0, nA = 0, nB = 0, yn = 0;
  for (let k = 0; k < n * n; k++) { nA += A[k] * A[k]; nB += B[k] * B[k]; }
  for (let j = 0; j < n; j++) {
    // (yᴴM)_j = Σ_i conj(y_i)·M_ij with M = A − λB (complex)
    let rr = 0, ri = 0;
    for (let i = 0; i < n; i++) {
      const mr = A[i * n + j] - l.re * B[i * n + j], mi = -l.im * B[i * n + j];
      rr += yr[i] * mr + yi[i] * mi; ri += yr[i] * mi - yi[i] * mr;
    }
    s += rr * rr + ri * ri;
    yn += yr[j] * yr[j] + yi[j] * yi[j];
  }
  return Math.sqrt(s) / ((Math.sqrt(nA) + Math.hypot(l.re, l.im) * Math.sqrt(nB)) * Math.sqrt(yn));
}

function rightResidual(A: Float64Array, B: Float64Array, n: number, l: { re: number; im: number },
  xr: Float64Array, xi: Float64Array): number {
  let s = 0, nA = 0, nB = 0, xn = 0;
  for (let k = 0; k < n * n; k++) { nA += A[k] * A[k]; nB += B[k] * B[k]; }
  for (let i = 0; i < n; i++) {
    let rr = 0, ri = 0;
    for (let j = 0; j < n; j++) {
      const mr = A[i * n + j] - l.re * B[i * n + j], mi = -l.im * B[i * n + j];
      rr += mr * xr[j] - mi * xi[j]; ri += mr * xi[j] + mi * xr[j];
    }
    s += rr * rr + ri * ri;
    xn += xr[i] * xr[i] + xi[i] * xi[i];
  }
  return Math.sqrt(s) / ((Math.sqrt(nA) + Math.hypot(l.re, l.im) * Math.sqrt(nB)) * Math.sqrt(xn));
}

describe('eigenvectorPair', () => {
  it('right and left vectors of every pole of a network leave a tiny residual', () => {
    // Residual check (backward error of an eigenpair, Golub & Van Loan §7.7; common practice).
    const n = 40;
    const p = randomNetworkPencil(n, 606);
    const { values } = finiteEigenvalues(p.A, p.B, n);
    expect(values.some((v) => v.im !== 0)).toBe(true);
    for (const l of values) {
      const v = eigenvectorPair(p.A, p.B, n, l);
      expect(v.residual).toBeLessThan(1e-12);
      expect(rightResidual(p.A, p.B, n, l, v.rightRe, v.rightIm)).toBeLessThan(1e-12);
      expect(leftResidual(p.A, p.B, n, l, v.leftRe, v.leftIm)).toBeLessThan(1e-12);
    }
  });

  it('unit 2-norm, largest right entry real and positive', () => {
    const n = 25;
    const p = randomNetworkPencil(n, 11);
    for (const l of finiteEigenvalues(p.A, p.B, n).values) {
      const v = eigenvectorPair(p.A, p.B, n, l);
      let nx = 0, ny = 0, best = -1, k = 0;
      for (let i = 0; i < n; i++) {
        const m = v.rightRe[i] ** 2 + v.rightIm[i] ** 2;
        nx += m; ny += v.leftRe[i] ** 2 + v.leftIm[i] ** 2;
        if (m > best) { best = m; k = i; }
      }
      expect(Math.abs(nx - 1)).toBeLessThan(1e-12);
      expect(Math.abs(ny - 1)).toBeLessThan(1e-12);
      expect(v.rightIm[k]).toBe(0);
      expect(v.rightRe[k]).toBeGreaterThan(0);
    }
  });

  it('right vectors span the same direction as dggev’s (|cos| = 1)', () => {
    // Reference: LAPACK dggev right eigenvectors (real pencil, real eigenvalues compared).
    const n = 20;
    const p = randomNetworkPencil(n, 1234);
    const ref = dggev(p.A, p.B, n, { vectors: true });
    let compared = 0;
    for (let j = 0; j < n; j++) {
      if (ref.alphaIm[j] !== 0 || ref.beta[j] === 0 || Math.abs(ref.beta[j]) < 1e-12 * Math.abs(ref.alphaRe[j])) continue;
      const l = { re: ref.alphaRe[j] / ref.beta[j], im: 0 };
      const v = eigenvectorPair(p.A, p.B, n, l);
      let dot = 0, nr = 0;
      for (let i = 0; i < n; i++) { const r = ref.vr![j * n + i]; dot += r * v.rightRe[i]; nr += r * r; }
      expect(Math.abs(Math.abs(dot) / Math.sqrt(nr) - 1)).toBeLessThan(1e-9);
      compared++;
    }
    expect(compared).toBeGreaterThan(3);
  });

  it('stiff diagonal pencil: the vector of the 1 rad/s pole is the unit vector', () => {
    // Closed form: diagonal pencil, eigenvector of a_i/b_i is e_i (common practice).
    const a = [-1, -1e6, -1e12], b = [1, 1, 1];
    const A = new Float64Array(9), B = new Float64Array(9);
    for (let i = 0; i < 3; i++) { A[i * 4] = a[i]; B[i * 4] = b[i]; }
    const v = eigenvectorPair(A, B, 3, { re: -1, im: 0 });
    expect(v.rightRe[0]).toBeCloseTo(1, 14);
    expect(Math.abs(v.rightRe[1]) + Math.abs(v.rightRe[2])).toBeLessThan(1e-12);
  });

  it('bad input gives Infinity residual and zero vectors, never NaN', () => {
    const v = eigenvectorPair(new Float64Array([1, NaN, 0, 1]), new Float64Array(4), 2, { re: 1, im: 0 });
    expect(v.residual).toBe(Infinity);
    expect(Array.from(v.rightRe)).toEqual([0, 0]);
    expect(eigenvectorPair(new Float64Array(3), new Float64Array(4), 2, { re: 0, im: 0 }).residual).toBe(Infinity);
  });

  it('index re-exports the solver, vectors and LU', () => {
    expect(linalg.finiteEigenvalues).toBe(finiteEigenvalues);
    expect(linalg.eigenvectorPair).toBe(eigenvectorPair);
    expect(typeof linalg.luComplex).toBe('function');
  });
});
