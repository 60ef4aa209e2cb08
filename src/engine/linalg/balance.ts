// Balancing of a matrix pencil (A, B) before the QZ iteration, in the manner of LAPACK dggbal:
//  1. permutation: rows/columns that already isolate an eigenvalue (a row or column with a single
//     nonzero of A|B inside the active window) are moved to the bottom/top, leaving an active
//     block [ilo, ihi] and a block-triangular pencil around it;
//  2. scaling (Ward 1981, "Balancing the generalized eigenvalue problem"): row and column factors
//     2^ρ_i, 2^γ_j minimising Σ (log2|a_ij| + ρ_i + γ_j)² + Σ (log2|b_ij| + ρ_i + γ_j)² over the
//     nonzeros of the active block, solved by preconditioned conjugate gradients and rounded to
//     powers of two (so scaling adds no rounding error).
// The balanced pencil is Ã[i][j] = rowScale[i]·A[rowPerm[i]][colPerm[j]]·colScale[j] (same for B).

export interface BalancedPencil {
  n: number;
  A: Float64Array;
  B: Float64Array;
  /** Active block [ilo, ihi] (inclusive); outside it the pencil is block triangular with 1×1
   *  diagonal blocks, whose eigenvalues are A[i][i]/B[i][i]. */
  ilo: number;
  ihi: number;
  rowPerm: Int32Array;
  colPerm: Int32Array;
  rowScale: Float64Array;
  colScale: Float64Array;
}

function swapRows(M: Float64Array, n: number, p: number, q: number): void {
  if (p === q) return;
  const a = p * n, b = q * n;
  for (let k = 0; k < n; k++) { const t = M[a + k]; M[a + k] = M[b + k]; M[b + k] = t; }
}

function swapCols(M: Float64Array, n: number, p: number, q: number): void {
  if (p === q) return;
  for (let r = 0; r < n * n; r += n) { const t = M[r + p]; M[r + p] = M[r + q]; M[r + q] = t; }
}

function swapInt(v: Int32Array, p: number, q: number): void { const t = v[p]; v[p] = v[q]; v[q] = t; }

/** Balance (A, B): permutation and/or power-of-two scaling. Inputs are not modified. */
export function balancePencil(A: Float64Array, B: Float64Array, n: number,
  opts: { permute?: boolean; scale?: boolean } = {}): BalancedPencil {
  const a = Float64Array.from(A);
  const b = Float64Array.from(B);
  const rowPerm = new Int32Array(n);
  const colPerm = new Int32Array(n);
  for (let i = 0; i < n; i++) { rowPerm[i] = i; colPerm[i] = i; }
  const rowScale = new Float64Array(n).fill(1);
  const colScale = new Float64Array(n).fill(1);
  let ilo = 0;
  let ihi = n - 1;
  if (opts.permute !== false) [ilo, ihi] = isolate(a, b, n, rowPerm, colPerm);
  if (opts.scale !== false && ihi > ilo) wardScaling(a, b, n, ilo, ihi, rowScale, colScale);
  return { n, A: a, B: b, ilo, ihi, rowPerm, colPerm, rowScale, colScale };
}

/** Permutation step. Returns the active window [ilo, ihi]. */
function isolate(a: Float64Array, b: Float64Array, n: number, rowPerm: Int32Array, colPerm: Int32Array): [number, number] {
  let ilo = 0;
  let ihi = n - 1;
  // Rows with at most one nonzero among the active columns go to the bottom.
  let found = true;
  while (found && ihi > ilo) {
    found = false;
    for (let i = ihi; i >= ilo; i--) {
      let jp = -1;
      let count = 0;
      for (let j = ilo; j <= ihi && count < 2; j++) {
        if (a[i * n + j] !== 0 || b[i * n + j] !== 0) { count++; jp = j; }
      }
      if (count >= 2) continue;
      if (jp < 0) jp = i;
      swapRows(a, n, i, ihi); swapRows(b, n, i, ihi); swapInt(rowPerm, i, ihi);
      swapCols(a, n, jp, ihi); swapCols(b, n, jp, ihi); swapInt(colPerm, jp, ihi);
      ihi--;
      found = true;
      break;
    }
  }
  // Columns with at most one nonzero among the active rows go to the top.
  found = true;
  while (found && ihi > ilo) {
    found = false;
    for (let j = ilo; j <= ihi; j++) {
      let ip = -1;
      let count = 0;
      for (let i = ilo; i <= ihi && count < 2; i++) {
        if (a[i * n + j] !== 0 || b[i * n + j] !== 0) { count++; ip = i; }
      }
      if (count >= 2) continue;
      if (ip < 0) ip = j;
      swapCols(a, n, j, ilo); swapCols(b, n, j, ilo); swapInt(colPerm, j, ilo);
      swapRows(a, n, ip, ilo); swapRows(b, n, ip, ilo); swapInt(rowPerm, ip, ilo);
      ilo++;
      found = true;
      break;
    }
  }
  return [ilo, ihi];
}

/** Ward's least-squares scaling of the active block, applied in place to a and b. */
function wardScaling(a: Float64Array, b: Float64Array, n: number, ilo: number, ihi: number,
  rowScale: Float64Array, colScale: Float64Array): void {
  const m = ihi - ilo + 1;
  // Nonzero pattern of the active block: weight w = [a≠0] + [b≠0], log-sum L = Σ log2|·|.
  const ri: number[] = [], ci: number[] = [], w: number[] = [], L: number[] = [];
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      const k = (i + ilo) * n + (j + ilo);
      const x = a[k], y = b[k];
      if (x === 0 && y === 0) continue;
      ri.push(i); ci.push(j);
      w.push((x !== 0 ? 1 : 0) + (y !== 0 ? 1 : 0));
      L.push((x !== 0 ? Math.log2(Math.abs(x)) : 0) + (y !== 0 ? Math.log2(Math.abs(y)) : 0));
    }
  }
  // Unknowns z = (ρ_0..ρ_{m-1}, γ_0..γ_{m-1}); normal equations M z = rhs with
  // M = [diag(rowCount) W; Wᵀ diag(colCount)], rhs = −(row sums of L, column sums of L).
  const dim = 2 * m;
  const diag = new Float64Array(dim);
  const rhs = new Float64Array(dim);
  for (let e = 0; e < ri.length; e++) {
    diag[ri[e]] += w[e]; diag[m + ci[e]] += w[e];
    rhs[ri[e]] -= L[e]; rhs[m + ci[e]] -= L[e];
  }
  const mul = (x: Float64Array, out: Float64Array) => {
    for (let k = 0; k < dim; k++) out[k] = diag[k] * x[k];
    for (let e = 0; e < ri.length; e++) {
      out[ri[e]] += w[e] * x[m + ci[e]];
      out[m + ci[e]] += w[e] * x[ri[e]];
    }
  };
  // Jacobi-preconditioned conjugate gradients (M is positive semidefinite, rhs in its range).
  const z = new Float64Array(dim);
  const r = Float64Array.from(rhs);
  const s = new Float64Array(dim);
  const p = new Float64Array(dim);
  const q = new Float64Array(dim);
  for (let k = 0; k < dim; k++) s[k] = diag[k] > 0 ? r[k] / diag[k] : 0;
  p.set(s);
  let rs = 0;
  for (let k = 0; k < dim; k++) rs += r[k] * s[k];
  const rs0 = rs;
  for (let it = 0; it < dim + 2 && rs > 1e-6 * rs0 && rs > 1e-20; it++) {
    mul(p, q);
    let pq = 0;
    for (let k = 0; k < dim; k++) pq += p[k] * q[k];
    if (!(pq > 0)) break;
    const alpha = rs / pq;
    for (let k = 0; k < dim; k++) { z[k] += alpha * p[k]; r[k] -= alpha * q[k]; }
    for (let k = 0; k < dim; k++) s[k] = diag[k] > 0 ? r[k] / diag[k] : 0;
    let rsNew = 0;
    for (let k = 0; k < dim; k++) rsNew += r[k] * s[k];
    const beta = rsNew / rs;
    rs = rsNew;
    for (let k = 0; k < dim; k++) p[k] = s[k] + beta * p[k];
  }
  // Round to powers of two, clamped well inside the exponent range.
  const LIM = 400;
  for (let i = 0; i < m; i++) {
    rowScale[i + ilo] = 2 ** Math.max(-LIM, Math.min(LIM, Math.round(z[i])));
    colScale[i + ilo] = 2 ** Math.max(-LIM, Math.min(LIM, Math.round(z[m + i])));
  }
  for (let i = 0; i < n; i++) {
    const rsI = rowScale[i];
    for (let j = 0; j < n; j++) {
      const f = rsI * colScale[j];
      if (f !== 1) { a[i * n + j] *= f; b[i * n + j] *= f; }
    }
  }
}

/** Map a right eigenvector of the balanced pencil back to the original: x = P_c·D_r·x̃. */
export function unbalanceRight(bal: BalancedPencil, xt: Float64Array): Float64Array {
  const x = new Float64Array(bal.n);
  for (let j = 0; j < bal.n; j++) x[bal.colPerm[j]] = bal.colScale[j] * xt[j];
  return x;
}

/** Map a left eigenvector of the balanced pencil back to the original: y = P_rᵀ·D_l·ỹ. */
export function unbalanceLeft(bal: BalancedPencil, yt: Float64Array): Float64Array {
  const y = new Float64Array(bal.n);
  for (let i = 0; i < bal.n; i++) y[bal.rowPerm[i]] = bal.rowScale[i] * yt[i];
  return y;
}
