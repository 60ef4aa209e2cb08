// Rank-revealing LU with complete pivoting (Golub & Van Loan, Alg. 3.4.2): P·A·Q = L·U with the
// largest remaining entry as pivot, stopped when it falls below tol. The rank r is then the number
// of pivots taken; U = [[U11, U12], [0, 0]] with U11 (r×r) regular. Null vectors follow directly:
//   right: A·Q·[w1; e_j] = 0 with U11·w1 = −U12·e_j;
//   left:  yᵀA = 0 with y = Pᵀ·L⁻ᵀ·e_(r+j).

import { GROWTH_LIMIT } from '../linalg/lu';

export interface RankRevealingLU {
  n: number;
  rank: number;
  /** L (unit lower, below the diagonal) and U (upper) packed, row-major. */
  lu: Float64Array;
  /** Row k of P·A is row rowPerm[k] of A; column k of A·Q is column colPerm[k] of A. */
  rowPerm: Int32Array;
  colPerm: Int32Array;
}

export function rrlu(A: Float64Array, n: number, tol: number): RankRevealingLU {
  const lu = Float64Array.from(A);
  const rowPerm = Int32Array.from({ length: n }, (_, i) => i);
  const colPerm = Int32Array.from({ length: n }, (_, i) => i);
  let rank = 0;
  for (let k = 0; k < n; k++) {
    let best = -1, pi = k, pj = k;
    for (let i = k; i < n; i++) {
      for (let j = k; j < n; j++) {
        const v = Math.abs(lu[i * n + j]);
        if (v > best) { best = v; pi = i; pj = j; }
      }
    }
    if (!(best > tol)) break;
    if (pi !== k) {
      for (let j = 0; j < n; j++) { const t = lu[k * n + j]; lu[k * n + j] = lu[pi * n + j]; lu[pi * n + j] = t; }
      const t = rowPerm[k]; rowPerm[k] = rowPerm[pi]; rowPerm[pi] = t;
    }
    if (pj !== k) {
      for (let i = 0; i < n; i++) { const t = lu[i * n + k]; lu[i * n + k] = lu[i * n + pj]; lu[i * n + pj] = t; }
      const t = colPerm[k]; colPerm[k] = colPerm[pj]; colPerm[pj] = t;
    }
    const p = lu[k * n + k];
    for (let i = k + 1; i < n; i++) {
      const f = lu[i * n + k] / p;
      lu[i * n + k] = f;
      if (f === 0) continue;
      for (let j = k + 1; j < n; j++) lu[i * n + j] -= f * lu[k * n + j];
    }
    rank++;
  }
  // Below the rank the remaining block is (numerically) zero: clear it so it reads as U = 0.
  for (let i = rank; i < n; i++) for (let j = rank; j < n; j++) lu[i * n + j] = 0;
  return { n, rank, lu, rowPerm, colPerm };
}

/** LU with row pivoting that keeps the diagonal pivot while it is at least `u` times the largest
 *  entry of its column (threshold pivoting, as circuit simulators factor MNA matrices; Duff,
 *  Erisman & Reid, Direct Methods for Sparse Matrices, §5.4). On a unilateral chain (a cascade
 *  of transconductors, each loading the next only through its gate) this follows the signal and
 *  its pivots stay of the size of the conductances, where complete pivoting picks the gm entries
 *  and leaves a pivot as small as 1/(product of the stage gains). Returns the factor in the
 *  rank-revealing layout (rank n, no column permutation), or null when a pivot is ≤ tol. */
export function thresholdLu(A: Float64Array, n: number, tol: number, order?: Int32Array, u = 0.1): RankRevealingLU | null {
  // Work on A(order, order): the caller's symmetric ordering (e.g. a source branch next to its node).
  const ord = order ?? Int32Array.from({ length: n }, (_, i) => i);
  const lu = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) lu[i * n + j] = A[ord[i] * n + ord[j]];
  const p = Int32Array.from({ length: n }, (_, i) => i);
  let scale = 0;
  for (let i = 0; i < n * n; i++) scale = Math.max(scale, Math.abs(lu[i]));
  for (let k = 0; k < n; k++) {
    let best = 0, pi = k;
    for (let i = k; i < n; i++) { const v = Math.abs(lu[i * n + k]); if (v > best) { best = v; pi = i; } }
    const diag = Math.abs(lu[k * n + k]);
    if (diag > 0 && pi !== k) {
      // As in luComplex (lu.ts): keep the diagonal when large enough or when its growth is bounded.
      let rest = 0;
      for (let j = k + 1; j < n; j++) rest = Math.max(rest, Math.abs(lu[k * n + j]));
      if (diag >= u * best || (best / diag) * rest <= GROWTH_LIMIT * scale) pi = k;
    }
    const p0 = lu[pi * n + k];
    if (!(Math.abs(p0) > tol)) return null;
    if (pi !== k) {
      for (let j = 0; j < n; j++) { const t = lu[k * n + j]; lu[k * n + j] = lu[pi * n + j]; lu[pi * n + j] = t; }
      const t = p[k]; p[k] = p[pi]; p[pi] = t;
    }
    for (let i = k + 1; i < n; i++) {
      const f = lu[i * n + k] / p0;
      lu[i * n + k] = f;
      if (f === 0) continue;
      for (let j = k + 1; j < n; j++) lu[i * n + j] -= f * lu[k * n + j];
    }
  }
  return { n, rank: n, lu, rowPerm: Int32Array.from(p, (r) => ord[r]), colPerm: Int32Array.from(ord) };
}

/** The n − rank right null vectors of A (max-norm 1). */
export function rightNullVectors(f: RankRevealingLU): Float64Array[] {
  const { n, rank: r, lu, colPerm } = f;
  const out: Float64Array[] = [];
  for (let j = r; j < n; j++) {
    const y = new Float64Array(n);
    y[j] = 1;
    for (let i = r - 1; i >= 0; i--) {
      let s = lu[i * n + j];
      for (let k = i + 1; k < r; k++) s += lu[i * n + k] * y[k];
      y[i] = -s / lu[i * n + i];
    }
    const w = new Float64Array(n);
    for (let k = 0; k < n; k++) w[colPerm[k]] = y[k];
    out.push(normalizeMax(w));
  }
  return out;
}

/** The n − rank left null vectors of A (yᵀA = 0, max-norm 1). */
export function leftNullVectors(f: RankRevealingLU): Float64Array[] {
  const { n, rank: r, lu, rowPerm } = f;
  const out: Float64Array[] = [];
  for (let j = r; j < n; j++) {
    // Lᵀ·z = e_j, L unit lower triangular: back substitution.
    const z = new Float64Array(n);
    z[j] = 1;
    for (let i = n - 1; i >= 0; i--) {
      if (i === j) continue;
      let s = 0;
      for (let k = i + 1; k < n; k++) s += lu[k * n + i] * z[k];
      z[i] = -s;
    }
    const y = new Float64Array(n);
    for (let k = 0; k < n; k++) y[rowPerm[k]] = z[k];
    out.push(normalizeMax(y));
  }
  return out;
}

/** A particular solution of A·x = u (free variables 0); meaningful when u is in the range of A. */
export function solveParticular(f: RankRevealingLU, u: Float64Array): Float64Array {
  const { n, rank: r, lu, rowPerm, colPerm } = f;
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) z[i] = u[rowPerm[i]];
  for (let i = 0; i < n; i++) {
    let s = z[i];
    for (let k = 0; k < Math.min(i, r); k++) s -= lu[i * n + k] * z[k];
    z[i] = s;
  }
  const y = new Float64Array(n);
  for (let i = r - 1; i >= 0; i--) {
    let s = z[i];
    for (let k = i + 1; k < r; k++) s -= lu[i * n + k] * y[k];
    y[i] = s / lu[i * n + i];
  }
  const x = new Float64Array(n);
  for (let k = 0; k < n; k++) x[colPerm[k]] = y[k];
  return x;
}

function normalizeMax(v: Float64Array): Float64Array {
  let m = 0;
  for (let i = 0; i < v.length; i++) m = Math.max(m, Math.abs(v[i]));
  if (m > 0) for (let i = 0; i < v.length; i++) v[i] /= m;
  return v;
}
