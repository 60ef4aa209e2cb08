// Dense LU factorisation with partial pivoting (Golub & Van Loan, Alg. 3.4.1), real and complex.
// Matrices are row-major Float64Array (see src/engine/types.ts). The factor is stored in place of
// a copy of the input; `perm[k]` is the original row placed at row k.
// MNA matrices hold a few entries per row, so the elimination updates only the pivot row's nonzero
// columns and the solves run over the factor's nonzero pattern (compressed rows, built once per
// factor on first use): same arithmetic as the dense loops, without the multiplications by zero.

/** Nonzero pattern of a factor by rows: strictly lower (L) and strictly upper (U) parts. */
export interface FactorRows { lStart: Int32Array; lIdx: Int32Array; uStart: Int32Array; uIdx: Int32Array }

function factorRows(n: number, nonzero: (k: number) => boolean): FactorRows {
  const lStart = new Int32Array(n + 1), uStart = new Int32Array(n + 1);
  const l: number[] = [], u: number[] = [];
  for (let i = 0; i < n; i++) {
    lStart[i] = l.length; uStart[i] = u.length;
    for (let j = 0; j < i; j++) if (nonzero(i * n + j)) l.push(j);
    for (let j = i + 1; j < n; j++) if (nonzero(i * n + j)) u.push(j);
  }
  lStart[n] = l.length; uStart[n] = u.length;
  return { lStart, lIdx: Int32Array.from(l), uStart, uIdx: Int32Array.from(u) };
}

/** Columns j > k where row k of the row-major matrix(es) is nonzero, into `out`; returns the count. */
function nonzeroColumns(a: Float64Array, b: Float64Array | null, n: number, k: number, out: Int32Array): number {
  let m = 0;
  for (let j = k + 1; j < n; j++) if (a[k * n + j] !== 0 || (b !== null && b[k * n + j] !== 0)) out[m++] = j;
  return m;
}

export interface RealLU {
  n: number;
  lu: Float64Array;
  rows?: FactorRows;
  /** When factored in a symmetric order (pairedOrder): column k of the factor is unknown cols[k];
   *  `perm` then already names original rows. The solves below honour it. */
  cols?: Int32Array;
  perm: Int32Array;
  /** Index of the first column whose pivot was (numerically) zero, or −1. */
  singularAt: number;
  /** Smallest |pivot| relative to the largest entry of the matrix. */
  minPivotRatio: number;
}

export interface ComplexLU {
  n: number;
  re: Float64Array;
  im: Float64Array;
  rows?: FactorRows;
  perm: Int32Array;
  singularAt: number;
  minPivotRatio: number;
}

const TINY = 1e-300;
/** Largest entry growth (relative to the matrix's largest entry) a kept diagonal pivot may cause. */
export const GROWTH_LIMIT = 10;
/** Diagonal-preference threshold of the circuit-order factors (see luComplex). */
export const CIRCUIT_PIVOT_THRESHOLD = 0.1;

/** A symmetric elimination order for MNA-like matrices: each unknown whose diagonal is
 *  structurally zero (a voltage-source or VCVS branch current) is placed right after the first
 *  unknown with a nonzero diagonal that its row touches, so the source's incidence pair is
 *  eliminated together instead of dragging the branch column through the whole network.
 *  order[k] = original index at position k. `nonzero(i, j)` tells the pattern. */
export function pairedOrder(n: number, nonzero: (i: number, j: number) => boolean): Int32Array {
  const after: number[][] = Array.from({ length: n }, () => []);
  const loose: number[] = [];
  const zeroDiag = (i: number) => !nonzero(i, i);
  for (let b = 0; b < n; b++) {
    if (!zeroDiag(b)) continue;
    let at = -1;
    for (let j = 0; j < n && at < 0; j++) if (j !== b && !zeroDiag(j) && nonzero(b, j)) at = j;
    if (at >= 0) after[at].push(b); else loose.push(b);
  }
  const order: number[] = [];
  for (let k = 0; k < n; k++) if (!zeroDiag(k)) order.push(k, ...after[k]);
  return Int32Array.from([...order, ...loose]);
}

export function luReal(A: Float64Array, n: number, relTol = 1e-14, inPlace = false, order?: Int32Array, threshold = 0): RealLU {
  let lu = inPlace ? A : Float64Array.from(A);
  if (order) {
    const src = lu;
    lu = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) lu[i * n + j] = src[order[i] * n + order[j]];
  }
  const cols = new Int32Array(n);
  const perm = new Int32Array(n);
  for (let i = 0; i < n; i++) perm[i] = i;
  let maxAbs = 0;
  for (let i = 0; i < n * n; i++) maxAbs = Math.max(maxAbs, Math.abs(lu[i]));
  let singularAt = -1;
  let minPivot = Infinity;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(lu[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k]);
      if (v > best) { best = v; p = i; }
    }
    const diag = Math.abs(lu[k * n + k]);
    if (threshold > 0 && diag > 0 && p !== k) {
      // Diagonal kept as in luComplex: large enough, or with bounded growth.
      let rest = 0;
      for (let j = k + 1; j < n; j++) rest = Math.max(rest, Math.abs(lu[k * n + j]));
      if (diag >= threshold * best || (best / diag) * rest <= GROWTH_LIMIT * maxAbs) { p = k; best = diag; }
    }
    minPivot = Math.min(minPivot, best);
    if (best <= Math.max(TINY, relTol * maxAbs)) {
      if (singularAt < 0) singularAt = k;
      continue;
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = lu[k * n + j]; lu[k * n + j] = lu[p * n + j]; lu[p * n + j] = t;
      }
      const t = perm[k]; perm[k] = perm[p]; perm[p] = t;
    }
    const pivot = lu[k * n + k];
    const m = nonzeroColumns(lu, null, n, k, cols);
    for (let i = k + 1; i < n; i++) {
      const f = lu[i * n + k] / pivot;
      if (f === 0) continue;
      lu[i * n + k] = f;
      for (let t = 0; t < m; t++) { const j = cols[t]; lu[i * n + j] -= f * lu[k * n + j]; }
    }
  }
  if (order) for (let k = 0; k < n; k++) perm[k] = order[perm[k]];
  return { n, lu, perm, singularAt, minPivotRatio: maxAbs > 0 ? minPivot / maxAbs : 0, ...(order ? { cols: Int32Array.from(order) } : {}) };
}

/** Real LU in the circuit's own order (pairedOrder, growth-bounded diagonal pivots): the factor
 *  for MNA matrices whose signal path may carry a very high gain. */
export function luRealCircuit(A: Float64Array, n: number, relTol = 1e-14): RealLU {
  return luReal(A, n, relTol, false, pairedOrder(n, (i, j) => A[i * n + j] !== 0), CIRCUIT_PIVOT_THRESHOLD);
}

/** Solve A·x = b for one right-hand side (b is not modified). */
function realRows(f: RealLU): FactorRows {
  return (f.rows ??= factorRows(f.n, (k) => f.lu[k] !== 0));
}

/** In place y ← L⁻¹y over rows first..n−1 (entries above `first` taken as zero), real factor. */
export function forwardReal(f: RealLU, x: Float64Array, first = 0): void {
  const { n, lu } = f;
  const { lStart, lIdx } = realRows(f);
  for (let i = first + 1; i < n; i++) {
    let s = x[i];
    for (let t = lStart[i]; t < lStart[i + 1]; t++) { const j = lIdx[t]; if (j >= first) s -= lu[i * n + j] * x[j]; }
    x[i] = s;
  }
}

/** In place x ← U⁻¹x for rows n−1 down to `last`, real factor. */
export function backwardReal(f: RealLU, x: Float64Array, last = 0): void {
  const { n, lu } = f;
  const { uStart, uIdx } = realRows(f);
  for (let i = n - 1; i >= last; i--) {
    let s = x[i];
    for (let t = uStart[i]; t < uStart[i + 1]; t++) { const j = uIdx[t]; s -= lu[i * n + j] * x[j]; }
    x[i] = s / lu[i * n + i];
  }
}

export function solveReal(f: RealLU, b: Float64Array): Float64Array {
  const { n, perm } = f;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = b[perm[i]];
  forwardReal(f, x);
  backwardReal(f, x);
  if (!f.cols) return x;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[f.cols[i]] = x[i];
  return out;
}

/** (A⁻¹)_kk for k < count of a real factor without a symmetric order (see complexInverseDiagonal). */
export function realInverseDiagonal(f: RealLU, count: number): Float64Array {
  const { n, perm } = f;
  const at = new Int32Array(n);
  for (let i = 0; i < n; i++) at[perm[i]] = i;
  const x = new Float64Array(n);
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    x.fill(0);
    x[at[k]] = 1;
    forwardReal(f, x, at[k]);
    backwardReal(f, x, k);
    out[k] = x[k];
  }
  return out;
}

/** Solve Aᵀ·x = b (used for left eigenvectors and adjoint sensitivities). */
export function solveRealTransposed(f: RealLU, b: Float64Array): Float64Array {
  const { n, lu, perm } = f;
  const { lStart, lIdx, uStart, uIdx } = realRows(f);
  const z = f.cols ? Float64Array.from(f.cols, (c) => b[c]) : Float64Array.from(b);
  // Uᵀz = b forward and Lᵀw = z backward, column-oriented: row j of U (L) is column j of Uᵀ (Lᵀ).
  for (let j = 0; j < n; j++) {
    const zj = (z[j] /= lu[j * n + j]);
    if (zj !== 0) for (let t = uStart[j]; t < uStart[j + 1]; t++) { const i = uIdx[t]; z[i] -= lu[j * n + i] * zj; }
  }
  for (let j = n - 1; j >= 0; j--) {
    const zj = z[j];
    if (zj !== 0) for (let t = lStart[j]; t < lStart[j + 1]; t++) { const i = lIdx[t]; z[i] -= lu[j * n + i] * zj; }
  }
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[perm[i]] = z[i];
  return x;
}

/** Complex LU of (Ar + i·Ai) with partial pivoting on |a|; `inPlace` factors into Ar, Ai.
 *  With threshold u > 0 the diagonal pivot is kept while |a_kk| ≥ u·max_i |a_ik| (threshold
 *  pivoting, Duff, Erisman & Reid §5.4) or while the growth it allows stays below GROWTH_LIMIT,
 *  which follows a circuit's own elimination order. */
export function luComplex(Ar: Float64Array, Ai: Float64Array, n: number, relTol = 1e-14, inPlace = false, threshold = 0): ComplexLU {
  const re = inPlace ? Ar : Float64Array.from(Ar);
  const im = inPlace ? Ai : Float64Array.from(Ai);
  const cols = new Int32Array(n);
  const perm = new Int32Array(n);
  for (let i = 0; i < n; i++) perm[i] = i;
  let max2 = 0;
  for (let i = 0; i < n * n; i++) { const v = re[i] * re[i] + im[i] * im[i]; if (v > max2) max2 = v; }
  const maxAbs = Math.sqrt(max2);
  let singularAt = -1;
  let minPivot = Infinity;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best2 = re[k * n + k] * re[k * n + k] + im[k * n + k] * im[k * n + k];
    for (let i = k + 1; i < n; i++) {
      const v = re[i * n + k] * re[i * n + k] + im[i * n + k] * im[i * n + k];
      if (v > best2) { best2 = v; p = i; }
    }
    const diag2 = re[k * n + k] * re[k * n + k] + im[k * n + k] * im[k * n + k];
    if (threshold > 0 && diag2 > 0 && p !== k) {
      // Keep the diagonal when it is large enough, or when the growth it allows, |multiplier| ·
      // the rest of row k, stays below the matrix's own scale (a unilateral stage: nothing right
      // of the diagonal, any multiplier harmless).
      let rest2 = 0;
      for (let j = k + 1; j < n; j++) { const v = re[k * n + j] * re[k * n + j] + im[k * n + j] * im[k * n + j]; if (v > rest2) rest2 = v; }
      if (diag2 >= threshold * threshold * best2 || (best2 / diag2) * rest2 <= GROWTH_LIMIT * GROWTH_LIMIT * max2) { p = k; best2 = diag2; }
    }
    const best = Math.sqrt(best2);
    minPivot = Math.min(minPivot, best);
    if (best <= Math.max(TINY, relTol * maxAbs)) {
      if (singularAt < 0) singularAt = k;
      continue;
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        let t = re[k * n + j]; re[k * n + j] = re[p * n + j]; re[p * n + j] = t;
        t = im[k * n + j]; im[k * n + j] = im[p * n + j]; im[p * n + j] = t;
      }
      const t = perm[k]; perm[k] = perm[p]; perm[p] = t;
    }
    const pr = re[k * n + k];
    const pi = im[k * n + k];
    const d = pr * pr + pi * pi;
    const m = nonzeroColumns(re, im, n, k, cols);
    for (let i = k + 1; i < n; i++) {
      const ar = re[i * n + k];
      const ai = im[i * n + k];
      if (ar === 0 && ai === 0) continue;
      const fr = (ar * pr + ai * pi) / d;
      const fi = (ai * pr - ar * pi) / d;
      re[i * n + k] = fr;
      im[i * n + k] = fi;
      for (let t = 0; t < m; t++) {
        const j = cols[t];
        const br = re[k * n + j];
        const bi = im[k * n + j];
        re[i * n + j] -= fr * br - fi * bi;
        im[i * n + j] -= fr * bi + fi * br;
      }
    }
  }
  return { n, re, im, perm, singularAt, minPivotRatio: maxAbs > 0 ? minPivot / maxAbs : 0 };
}

function complexRows(f: ComplexLU): FactorRows {
  return (f.rows ??= factorRows(f.n, (k) => f.re[k] !== 0 || f.im[k] !== 0));
}

/** In place y ← L⁻¹y (unit lower factor) over rows first..n−1; entries above `first` are taken
 *  as zero (a right-hand side that starts at permuted row `first`). */
export function forwardComplex(f: ComplexLU, xr: Float64Array, xi: Float64Array, first = 0): void {
  const { n, re, im } = f;
  const { lStart, lIdx } = complexRows(f);
  for (let i = first + 1; i < n; i++) {
    let sr = xr[i], si = xi[i];
    for (let t = lStart[i]; t < lStart[i + 1]; t++) {
      const j = lIdx[t];
      if (j < first) continue;
      const lr = re[i * n + j], li = im[i * n + j];
      sr -= lr * xr[j] - li * xi[j];
      si -= lr * xi[j] + li * xr[j];
    }
    xr[i] = sr; xi[i] = si;
  }
}

/** In place x ← U⁻¹x for rows n−1 down to `last` (rows above `last` are left as they are). */
export function backwardComplex(f: ComplexLU, xr: Float64Array, xi: Float64Array, last = 0): void {
  const { n, re, im } = f;
  const { uStart, uIdx } = complexRows(f);
  for (let i = n - 1; i >= last; i--) {
    let sr = xr[i], si = xi[i];
    for (let t = uStart[i]; t < uStart[i + 1]; t++) {
      const j = uIdx[t];
      const ur = re[i * n + j], ui = im[i * n + j];
      sr -= ur * xr[j] - ui * xi[j];
      si -= ur * xi[j] + ui * xr[j];
    }
    const ar = re[i * n + i], ai = im[i * n + i], d = ar * ar + ai * ai;
    xr[i] = (sr * ar + si * ai) / d;
    xi[i] = (si * ar - sr * ai) / d;
  }
}

/** Solve (LU)·x = b for a complex right-hand side; returns [xr, xi]. */
export function solveComplex(f: ComplexLU, br: Float64Array, bi: Float64Array): [Float64Array, Float64Array] {
  const { n, perm } = f;
  const xr = new Float64Array(n);
  const xi = new Float64Array(n);
  for (let i = 0; i < n; i++) { xr[i] = br[perm[i]]; xi[i] = bi[perm[i]]; }
  forwardComplex(f, xr, xi);
  backwardComplex(f, xr, xi);
  return [xr, xi];
}

/** Diagonal entries (A⁻¹)_kk of the factored A for k in `which` (a count c means 0..c−1): for
 *  each k one solve with e_k that starts the forward pass at e_k's permuted row and stops the
 *  backward pass at row k (only x_k is kept). Returns [re, im] in the order of `which`. */
export function complexInverseDiagonal(f: ComplexLU, which: number | Int32Array): [Float64Array, Float64Array] {
  const { n, perm } = f;
  const ks = typeof which === 'number' ? Int32Array.from({ length: which }, (_, k) => k) : which;
  const at = new Int32Array(n);
  for (let i = 0; i < n; i++) at[perm[i]] = i;
  const xr = new Float64Array(n), xi = new Float64Array(n);
  const dr = new Float64Array(ks.length), di = new Float64Array(ks.length);
  for (let t = 0; t < ks.length; t++) {
    const k = ks[t];
    xr.fill(0); xi.fill(0);
    xr[at[k]] = 1;
    forwardComplex(f, xr, xi, at[k]);
    backwardComplex(f, xr, xi, k);
    dr[t] = xr[k]; di[t] = xi[k];
  }
  return [dr, di];
}

/** Solve (LU)ᴴ·x = b (conjugate transpose), for left vectors; returns [xr, xi]. */
export function solveComplexAdjoint(f: ComplexLU, br: Float64Array, bi: Float64Array): [Float64Array, Float64Array] {
  const { n, re, im, perm } = f;
  const { lStart, lIdx, uStart, uIdx } = complexRows(f);
  const zr = Float64Array.from(br);
  const zi = Float64Array.from(bi);
  // Uᴴz = b forward, then Lᴴw = z backward (unit diagonal), column-oriented: row j of U (L) holds
  // the conjugates of column j of Uᴴ (Lᴴ).
  for (let j = 0; j < n; j++) {
    const dr = re[j * n + j], di = -im[j * n + j], d = dr * dr + di * di;
    const sr = zr[j], si = zi[j];
    const vr = (sr * dr + si * di) / d, vi = (si * dr - sr * di) / d;
    zr[j] = vr; zi[j] = vi;
    if (vr === 0 && vi === 0) continue;
    for (let t = uStart[j]; t < uStart[j + 1]; t++) {
      const i = uIdx[t];
      const ur = re[j * n + i], ui = -im[j * n + i];
      zr[i] -= ur * vr - ui * vi;
      zi[i] -= ur * vi + ui * vr;
    }
  }
  for (let j = n - 1; j >= 0; j--) {
    const vr = zr[j], vi = zi[j];
    if (vr === 0 && vi === 0) continue;
    for (let t = lStart[j]; t < lStart[j + 1]; t++) {
      const i = lIdx[t];
      const lr = re[j * n + i], li = -im[j * n + i];
      zr[i] -= lr * vr - li * vi;
      zi[i] -= lr * vi + li * vr;
    }
  }
  const xr = new Float64Array(n);
  const xi = new Float64Array(n);
  for (let i = 0; i < n; i++) { xr[perm[i]] = zr[i]; xi[perm[i]] = zi[i]; }
  return [xr, xi];
}
