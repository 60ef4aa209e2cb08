// Rank-revealing LU with complete pivoting (Golub & Van Loan, Alg. 3.4.2): P·A·Q = L·U with the
// largest remaining entry as pivot, stopped when it falls below tol. The rank r is then the number
// of pivots taken; U = [[U11, U12], [0, 0]] with U11 (r×r) regular. Null vectors follow directly:
//   right: A·Q·[w1; e_j] = 0 with U11·w1 = −U12·e_j;
//   left:  yᵀA = 0 with y = Pᵀ·L⁻ᵀ·e_(r+j).

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
