// Small dense complex matrices (a few rows: the sources of one or two parts), row-major re/im.
// Determinant and inverse by Gaussian elimination with partial pivoting (Golub & Van Loan, 3.4).
import { hypot2 } from './cx';
export interface CMat { rows: number; cols: number; re: Float64Array; im: Float64Array }

export function cmatZeros(rows: number, cols: number): CMat {
  return { rows, cols, re: new Float64Array(rows * cols), im: new Float64Array(rows * cols) };
}

export function cmatIdentity(n: number): CMat {
  const m = cmatZeros(n, n);
  for (let i = 0; i < n; i++) m.re[i * n + i] = 1;
  return m;
}

export function cmatMul(a: CMat, b: CMat): CMat {
  const out = cmatZeros(a.rows, b.cols);
  for (let i = 0; i < a.rows; i++) {
    for (let k = 0; k < a.cols; k++) {
      const ar = a.re[i * a.cols + k], ai = a.im[i * a.cols + k];
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < b.cols; j++) {
        const br = b.re[k * b.cols + j], bi = b.im[k * b.cols + j];
        out.re[i * b.cols + j] += ar * br - ai * bi;
        out.im[i * b.cols + j] += ar * bi + ai * br;
      }
    }
  }
  return out;
}

/** I − a (square). */
export function cmatIdentityMinus(a: CMat): CMat {
  const out = { rows: a.rows, cols: a.cols, re: a.re.map((v) => -v), im: a.im.map((v) => -v) };
  for (let i = 0; i < a.rows; i++) out.re[i * a.cols + i] += 1;
  return out;
}

/** Determinant and (when asked and non-singular) inverse of a square matrix. */
export function cmatDetInv(a: CMat, wantInverse: boolean): { det: { re: number; im: number }; inv: CMat | null } {
  const n = a.rows;
  const re = Float64Array.from(a.re), im = Float64Array.from(a.im);
  const inv = wantInverse ? cmatIdentity(n) : null;
  let dr = 1, di = 0;
  for (let k = 0; k < n; k++) {
    let p = k, best = hypot2(re[k * n + k], im[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = hypot2(re[i * n + k], im[i * n + k]);
      if (v > best) { best = v; p = i; }
    }
    if (best === 0) return { det: { re: 0, im: 0 }, inv: null };
    if (p !== k) {
      swapRows(re, im, n, k, p);
      if (inv) swapRows(inv.re, inv.im, n, k, p);
      dr = -dr; di = -di;
    }
    const pr = re[k * n + k], pi = im[k * n + k];
    const ndr = dr * pr - di * pi;
    di = dr * pi + di * pr;
    dr = ndr;
    const q = pr * pr + pi * pi;
    for (let i = 0; i < n; i++) {
      if (i === k) continue;
      const xr = re[i * n + k], xi = im[i * n + k];
      if (xr === 0 && xi === 0) continue;
      // f = x / pivot
      const fr = (xr * pr + xi * pi) / q, fi = (xi * pr - xr * pi) / q;
      for (let j = 0; j < n; j++) {
        const kr = re[k * n + j], ki = im[k * n + j];
        re[i * n + j] -= fr * kr - fi * ki;
        im[i * n + j] -= fr * ki + fi * kr;
        if (inv) {
          const vr = inv.re[k * n + j], vi = inv.im[k * n + j];
          inv.re[i * n + j] -= fr * vr - fi * vi;
          inv.im[i * n + j] -= fr * vi + fi * vr;
        }
      }
    }
  }
  if (inv) {
    for (let i = 0; i < n; i++) {
      const pr = re[i * n + i], pi = im[i * n + i];
      const q = pr * pr + pi * pi;
      for (let j = 0; j < n; j++) {
        const vr = inv.re[i * n + j], vi = inv.im[i * n + j];
        inv.re[i * n + j] = (vr * pr + vi * pi) / q;
        inv.im[i * n + j] = (vi * pr - vr * pi) / q;
      }
    }
  }
  return { det: { re: dr, im: di }, inv };
}

function swapRows(re: Float64Array, im: Float64Array, n: number, a: number, b: number): void {
  for (let j = 0; j < n; j++) {
    let t = re[a * n + j]; re[a * n + j] = re[b * n + j]; re[b * n + j] = t;
    t = im[a * n + j]; im[a * n + j] = im[b * n + j]; im[b * n + j] = t;
  }
}
