// Hessenberg–triangular reduction of a pencil (Moler & Stewart 1973; LAPACK dgeqrf + dgghrd):
// orthogonal Q, Z with QᵀAZ upper Hessenberg and QᵀBZ upper triangular. Only the reduced pair is
// kept (eigenvalues only), so Q and Z are not accumulated. Row-major m×m, in place.
// Rotations whose target entry is already zero are skipped, which pays off on the sparse
// matrices of circuit networks.

/** Plane rotation (c, s) with [c s; −s c]·[f; g] = [r; 0]; writes c, s, r into out[0..2]. */
export function givens(f: number, g: number, out: Float64Array): void {
  if (g === 0) { out[0] = 1; out[1] = 0; out[2] = f; return; }
  if (f === 0) { out[0] = 0; out[1] = 1; out[2] = g; return; }
  const af = Math.abs(f), ag = Math.abs(g);
  let r: number;
  if (af > 1e-150 && af < 1e150 && ag > 1e-150 && ag < 1e150) r = Math.sqrt(f * f + g * g);
  else r = Math.hypot(f, g);
  out[0] = f / r; out[1] = g / r; out[2] = r;
}

/** Rows p, q ← [c s; −s c]·rows p, q over columns [c0, c1). */
export function rotateRows(M: Float64Array, m: number, p: number, q: number, c: number, s: number, c0: number, c1: number): void {
  const a = p * m, b = q * m;
  for (let k = c0; k < c1; k++) {
    const x = M[a + k], y = M[b + k];
    M[a + k] = c * x + s * y;
    M[b + k] = c * y - s * x;
  }
}

/** Columns p, q ← (c·col p − s·col q, s·col p + c·col q) over rows [r0, r1). */
export function rotateCols(M: Float64Array, m: number, p: number, q: number, c: number, s: number, r0: number, r1: number): void {
  for (let r = r0 * m, end = r1 * m; r < end; r += m) {
    const x = M[r + p], y = M[r + q];
    M[r + p] = c * x - s * y;
    M[r + q] = s * x + c * y;
  }
}

/** B ← QᵀB upper triangular by Householder reflections (Golub & Van Loan §5.2), A ← QᵀA. */
export function triangularizeB(A: Float64Array, B: Float64Array, m: number): void {
  const v = new Float64Array(m);
  const w = new Float64Array(m);
  for (let k = 0; k < m - 1; k++) {
    let tail = 0;
    for (let i = k + 1; i < m; i++) { const x = B[i * m + k]; tail += x * x; }
    if (tail === 0) continue;
    const x0 = B[k * m + k];
    const norm = Math.sqrt(x0 * x0 + tail);
    const alpha = x0 > 0 ? -norm : norm;
    // v = x − alpha·e1, H = I − 2vvᵀ/(vᵀv)
    v[k] = x0 - alpha;
    for (let i = k + 1; i < m; i++) v[i] = B[i * m + k];
    const tau = 2 / (v[k] * v[k] + tail);
    applyReflectorLeft(B, m, v, w, tau, k, k);
    for (let i = k + 1; i < m; i++) B[i * m + k] = 0;
    B[k * m + k] = alpha;
    applyReflectorLeft(A, m, v, w, tau, k, 0);
  }
}

/** M[k.., c0..] ← (I − τ v vᵀ)·M[k.., c0..], v supported on rows k..m−1. */
function applyReflectorLeft(M: Float64Array, m: number, v: Float64Array, w: Float64Array, tau: number, k: number, c0: number): void {
  for (let j = c0; j < m; j++) w[j] = 0;
  for (let i = k; i < m; i++) {
    const vi = v[i];
    if (vi === 0) continue;
    const row = i * m;
    for (let j = c0; j < m; j++) w[j] += vi * M[row + j];
  }
  for (let i = k; i < m; i++) {
    const f = tau * v[i];
    if (f === 0) continue;
    const row = i * m;
    for (let j = c0; j < m; j++) M[row + j] -= f * w[j];
  }
}

/** Reduce (A, B), B already upper triangular, to (Hessenberg, triangular) by Givens rotations
 *  (Moler & Stewart 1973, as in dgghrd). */
export function hessenbergTriangular(A: Float64Array, B: Float64Array, m: number): void {
  const g = new Float64Array(3);
  for (let j = 0; j < m - 2; j++) {
    for (let i = m - 1; i >= j + 2; i--) {
      const target = A[i * m + j];
      if (target === 0) continue;
      // Rows i−1, i: zero A(i, j); this fills B(i, i−1).
      givens(A[(i - 1) * m + j], target, g);
      let c = g[0], s = g[1];
      A[(i - 1) * m + j] = g[2];
      A[i * m + j] = 0;
      rotateRows(A, m, i - 1, i, c, s, j + 1, m);
      rotateRows(B, m, i - 1, i, c, s, i - 1, m);
      const fill = B[i * m + i - 1];
      if (fill === 0) continue;
      // Columns i−1, i: zero B(i, i−1).
      givens(B[i * m + i], fill, g);
      c = g[0]; s = g[1];
      B[i * m + i] = g[2];
      B[i * m + i - 1] = 0;
      rotateCols(B, m, i - 1, i, c, s, 0, i);
      rotateCols(A, m, i - 1, i, c, s, 0, m);
    }
  }
}
