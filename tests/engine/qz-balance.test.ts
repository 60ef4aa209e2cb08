import { describe, it, expect } from 'vitest';
import { balancePencil, unbalanceRight, unbalanceLeft } from '../../src/engine/linalg/balance';
import { eigenvectorPair } from '../../src/engine/linalg/eigvec';
import { finiteEigenvalues } from '../../src/engine/linalg/qz';
import { randomNetworkPencil } from '../bench/eig-bench';

/** Ward's objective Σ log2²|a_ij| + Σ log2²|b_ij| over the nonzeros (Ward 1981). */
function wardObjective(A: Float64Array, B: Float64Array): number {
  let s = 0;
  for (let k = 0; k < A.length; k++) {
    if (A[k] !== 0) s += Math.log2(Math.abs(A[k])) ** 2;
    if (B[k] !== 0) s += Math.log2(Math.abs(B[k])) ** 2;
  }
  return s;
}

// Balancing as LAPACK dggbal defines it (permutation to isolate eigenvalues, then Ward 1981
// power-of-two scaling); the checks follow those definitions.
describe('pencil balancing', () => {
  const n = 30;
  const p = randomNetworkPencil(n, 4711);
  const bal = balancePencil(p.A, p.B, n);

  it('is the stated permutation and power-of-two scaling of the input', () => {
    for (let i = 0; i < n; i++) {
      expect(Number.isInteger(Math.log2(bal.rowScale[i]))).toBe(true);
      expect(Number.isInteger(Math.log2(bal.colScale[i]))).toBe(true);
      for (let j = 0; j < n; j++) {
        const f = bal.rowScale[i] * bal.colScale[j];
        expect(bal.A[i * n + j]).toBe(f * p.A[bal.rowPerm[i] * n + bal.colPerm[j]]);
        expect(bal.B[i * n + j]).toBe(f * p.B[bal.rowPerm[i] * n + bal.colPerm[j]]);
      }
    }
  });

  it('isolated rows and columns leave a block-triangular pencil around [ilo, ihi]', () => {
    // Grounded voltage-source rows have a single nonzero, so something must be isolated.
    expect(bal.ihi - bal.ilo + 1).toBeLessThan(n);
    for (let i = bal.ihi + 1; i < n; i++) for (let j = 0; j < i; j++) {
      expect(Math.abs(bal.A[i * n + j])).toBe(0);
      expect(Math.abs(bal.B[i * n + j])).toBe(0);
    }
    for (let j = 0; j < bal.ilo; j++) for (let i = j + 1; i < n; i++) {
      expect(Math.abs(bal.A[i * n + j])).toBe(0);
      expect(Math.abs(bal.B[i * n + j])).toBe(0);
    }
  });

  it('Ward scaling lowers the log-magnitude objective it minimises', () => {
    const permOnly = balancePencil(p.A, p.B, n, { scale: false });
    expect(wardObjective(bal.A, bal.B)).toBeLessThan(0.5 * wardObjective(permOnly.A, permOnly.B));
  });

  it('eigenvectors of the balanced pencil map back to eigenvectors of the original', () => {
    // Residual check of the mapped vectors on the original pencil (common practice).
    const l = finiteEigenvalues(p.A, p.B, n).values.find((v) => v.im === 0)!;
    const v = eigenvectorPair(bal.A, bal.B, n, l);
    const x = unbalanceRight(bal, v.rightRe), y = unbalanceLeft(bal, v.leftRe);
    let rx = 0, ry = 0, nx = 0, ny = 0, scaleA = 0;
    for (let i = 0; i < n; i++) {
      let sx = 0, sy = 0;
      for (let j = 0; j < n; j++) {
        sx += (p.A[i * n + j] - l.re * p.B[i * n + j]) * x[j];
        sy += y[j] * (p.A[j * n + i] - l.re * p.B[j * n + i]);
        scaleA += Math.abs(p.A[i * n + j]) + Math.abs(l.re * p.B[i * n + j]);
      }
      rx += sx * sx; ry += sy * sy; nx += x[i] * x[i]; ny += y[i] * y[i];
    }
    expect(Math.sqrt(rx / nx)).toBeLessThan(1e-10 * scaleA);
    expect(Math.sqrt(ry / ny)).toBeLessThan(1e-10 * scaleA);
  });
});
