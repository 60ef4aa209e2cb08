// A real n×n matrix by rows with its zeros left out (MNA matrices hold a few entries per row),
// and the products with complex vectors that the eigenvector and modal code needs.

export interface SparseRows { n: number; start: Int32Array; col: Int32Array; val: Float64Array }

export function sparseRows(M: Float64Array, n: number): SparseRows {
  const start = new Int32Array(n + 1);
  let m = 0;
  for (let k = 0; k < n * n; k++) if (M[k] !== 0) m++;
  const col = new Int32Array(m), val = new Float64Array(m);
  m = 0;
  for (let i = 0; i < n; i++) {
    start[i] = m;
    for (let j = 0; j < n; j++) { const v = M[i * n + j]; if (v !== 0) { col[m] = j; val[m] = v; m++; } }
  }
  start[n] = m;
  return { n, start, col, val };
}

/** out ← M·v (Mᵀ·v when `transposed`; M is real so Mᴴ = Mᵀ), v complex. */
export function mulComplex(M: SparseRows, vr: Float64Array, vi: Float64Array,
  outR: Float64Array, outI: Float64Array, transposed = false): void {
  const { n, start, col, val } = M;
  outR.fill(0); outI.fill(0);
  for (let i = 0; i < n; i++) {
    if (transposed) {
      const a = vr[i], b = vi[i];
      if (a === 0 && b === 0) continue;
      for (let t = start[i]; t < start[i + 1]; t++) { const j = col[t], m = val[t]; outR[j] += m * a; outI[j] += m * b; }
    } else {
      let sr = 0, si = 0;
      for (let t = start[i]; t < start[i + 1]; t++) { const j = col[t], m = val[t]; sr += m * vr[j]; si += m * vi[j]; }
      outR[i] = sr; outI[i] = si;
    }
  }
}

/** yᴴ·M·x for complex x, y: [re, im]. */
export function bilinear(M: SparseRows, yr: Float64Array, yi: Float64Array, xr: Float64Array, xi: Float64Array): [number, number] {
  const { n, start, col, val } = M;
  let dr = 0, di = 0;
  for (let r = 0; r < n; r++) {
    let cr = 0, ci = 0;
    for (let t = start[r]; t < start[r + 1]; t++) { const c = col[t], w = val[t]; cr += w * xr[c]; ci += w * xi[c]; }
    dr += yr[r] * cr + yi[r] * ci;
    di += yr[r] * ci - yi[r] * cr;
  }
  return [dr, di];
}
