// Fast repeated evaluation of cᵀ(G + sC)⁻¹b over many s (Laub 1981, "Efficient multivariable
// frequency response computations"): with a real shift σ where G + σC is regular,
//   G + sC = (G + σC)·(I + (s − σ)·M),  M = (G + σC)⁻¹·C,
// and M = Q·H·Qᵀ with H upper Hessenberg (Householder, Golub & Van Loan Alg. 7.4.2), so
//   H(s) = (Qᵀc)ᵀ·(I + (s − σ)·H)⁻¹·Qᵀ(G + σC)⁻¹b,
// one O(n²) Hessenberg solve per frequency after an O(n³) set-up.

import type { Cx } from '../types';
import { luRealCircuit, solveReal, type RealLU } from '../linalg/lu';

export interface HessenbergForm {
  n: number;
  sigma: number;
  H: Float64Array;
  /** Qᵀ(G + σC)⁻¹b and Qᵀc. */
  bt: Float64Array;
  ct: Float64Array;
}

/** Householder reduction of M (modified in place) to upper Hessenberg; accumulates Q (M = Q·H·Qᵀ)
 *  when given (Q must start as the identity). */
function reduceToHessenberg(M: Float64Array, n: number, Q?: Float64Array): void {
  const v = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    let alpha = 0;
    for (let i = k + 1; i < n; i++) alpha = Math.max(alpha, Math.abs(M[i * n + k]));
    if (alpha === 0) continue;
    let norm2 = 0;
    for (let i = k + 1; i < n; i++) { v[i] = M[i * n + k] / alpha; norm2 += v[i] * v[i]; }
    const norm = Math.sqrt(norm2);
    const s = v[k + 1] >= 0 ? norm : -norm;
    v[k + 1] += s;
    const vtv = norm2 + 2 * s * (v[k + 1] - s) + s * s; // ‖v‖² after the shift
    if (vtv === 0) continue;
    const beta = 2 / vtv;
    // M ← P·M (rows k+1..n−1), P = I − β·v·vᵀ
    for (let j = k; j < n; j++) {
      let d = 0;
      for (let i = k + 1; i < n; i++) d += v[i] * M[i * n + j];
      d *= beta;
      for (let i = k + 1; i < n; i++) M[i * n + j] -= d * v[i];
    }
    // M ← M·P (columns k+1..n−1), and Q ← Q·P
    for (const X of Q ? [M, Q] : [M]) {
      for (let i = 0; i < n; i++) {
        let d = 0;
        for (let j = k + 1; j < n; j++) d += X[i * n + j] * v[j];
        if (d === 0) continue;
        d *= beta;
        for (let j = k + 1; j < n; j++) X[i * n + j] -= d * v[j];
      }
    }
    for (let i = k + 2; i < n; i++) M[i * n + k] = 0;
  }
}

/** F = G + σC (its LU), and the Hessenberg form H = Qᵀ·F⁻¹C·Q. */
export interface ShiftedReduction {
  n: number;
  sigma: number;
  H: Float64Array;
  Q: Float64Array;
  f: RealLU;
}

/** Reduction for one shift σ; null when G + σC is (numerically) singular. */
export function reduceShifted(G: Float64Array, C: Float64Array, n: number, sigma: number): ShiftedReduction | null {
  const A = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) A[i] = G[i] + sigma * C[i];
  // Circuit elimination order (source branch beside its node, growth-bounded diagonal pivots):
  // a high-gain cascade keeps pivots of its conductances' size (lu.ts pairedOrder).
  const f = luRealCircuit(A, n);
  if (f.singularAt >= 0 || f.minPivotRatio < 1e-13) return null;
  const M = new Float64Array(n * n);
  const col = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) col[i] = C[i * n + j];
    const x = solveReal(f, col);
    for (let i = 0; i < n; i++) M[i * n + j] = x[i];
  }
  for (let i = 0; i < n * n; i++) if (!Number.isFinite(M[i])) return null;
  const Q = new Float64Array(n * n);
  for (let i = 0; i < n; i++) Q[i * n + i] = 1;
  reduceToHessenberg(M, n, Q);
  return { n, sigma, H: M, Q, f };
}

/** Tries σ = 0 (DC, best when G is regular), then shifts of the circuit's own rate ‖G‖/‖C‖. */
export function shiftedReduction(G: Float64Array, C: Float64Array, n: number): ShiftedReduction | null {
  let gn = 0, cn = 0;
  for (let i = 0; i < n * n; i++) { gn += G[i] * G[i]; cn += C[i] * C[i]; }
  if (n === 0 || !(gn > 0) || !(cn > 0)) return null;
  const w0 = Math.sqrt(gn / cn);
  for (const sigma of [0, w0, -0.7 * w0, 3.1 * w0]) {
    const r = reduceShifted(G, C, n, sigma);
    if (r) return r;
  }
  return null;
}

/** Transfer-specific vectors: Qᵀ(G + σC)⁻¹b and Qᵀc. */
export function hessenbergForm(red: ShiftedReduction, b: Float64Array, c: Float64Array): HessenbergForm | null {
  const { n, Q } = red;
  const x = solveReal(red.f, b);
  const bt = new Float64Array(n);
  const ct = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let sb = 0, sc = 0;
    for (let i = 0; i < n; i++) { sb += Q[i * n + j] * x[i]; sc += Q[i * n + j] * c[i]; }
    bt[j] = sb; ct[j] = sc;
  }
  for (let i = 0; i < n; i++) if (!Number.isFinite(bt[i])) return null;
  return { n, sigma: red.sigma, H: red.H, bt, ct };
}

/** cᵀ(G + sC)⁻¹b from the Hessenberg form; null when I + (s − σ)H is singular (s is a pole).
 *  `spread` = Σ|c̃_i·y_i| / |H|: how much the final sum cancelled. The rounding error of this path
 *  is about ulp·spread relative, so a large spread (deep attenuation) calls for a direct solve. */
export function evalHessenberg(h: HessenbergForm, s: Cx, work?: { re: Float64Array; im: Float64Array }): (Cx & { spread: number }) | null {
  const { n, H, bt, ct } = h;
  const dr = s.re - h.sigma;
  const di = s.im;
  const ar = work?.re ?? new Float64Array(n * n);
  const ai = work?.im ?? new Float64Array(n * n);
  // A = I + (s − σ)·H, only the Hessenberg band is touched.
  for (let i = 0; i < n; i++) {
    for (let j = Math.max(0, i - 1); j < n; j++) {
      const hv = H[i * n + j];
      ar[i * n + j] = dr * hv + (i === j ? 1 : 0);
      ai[i * n + j] = di * hv;
    }
  }
  const yr = Float64Array.from(bt);
  const yi = new Float64Array(n);
  // Gaussian elimination with partial pivoting between rows k and k+1 (Hessenberg structure).
  for (let k = 0; k < n; k++) {
    if (k + 1 < n) {
      const pr = Math.hypot(ar[k * n + k], ai[k * n + k]);
      const qr = Math.hypot(ar[(k + 1) * n + k], ai[(k + 1) * n + k]);
      if (qr > pr) {
        for (let j = k; j < n; j++) {
          let t = ar[k * n + j]; ar[k * n + j] = ar[(k + 1) * n + j]; ar[(k + 1) * n + j] = t;
          t = ai[k * n + j]; ai[k * n + j] = ai[(k + 1) * n + j]; ai[(k + 1) * n + j] = t;
        }
        let t = yr[k]; yr[k] = yr[k + 1]; yr[k + 1] = t;
        t = yi[k]; yi[k] = yi[k + 1]; yi[k + 1] = t;
      }
    }
    const pr = ar[k * n + k];
    const pi = ai[k * n + k];
    const d = pr * pr + pi * pi;
    if (!(d > 1e-300)) return null;
    if (k + 1 < n) {
      const lr = ar[(k + 1) * n + k];
      const li = ai[(k + 1) * n + k];
      const fr = (lr * pr + li * pi) / d;
      const fi = (li * pr - lr * pi) / d;
      for (let j = k + 1; j < n; j++) {
        const ur = ar[k * n + j];
        const ui = ai[k * n + j];
        ar[(k + 1) * n + j] -= fr * ur - fi * ui;
        ai[(k + 1) * n + j] -= fr * ui + fi * ur;
      }
      yr[k + 1] -= fr * yr[k] - fi * yi[k];
      yi[k + 1] -= fr * yi[k] + fi * yr[k];
    }
  }
  let hr = 0;
  let hi = 0;
  let sum = 0;
  for (let i = n - 1; i >= 0; i--) {
    let sr = yr[i];
    let si = yi[i];
    for (let j = i + 1; j < n; j++) {
      const ur = ar[i * n + j];
      const ui = ai[i * n + j];
      sr -= ur * yr[j] - ui * yi[j];
      si -= ur * yi[j] + ui * yr[j];
    }
    const pr = ar[i * n + i];
    const pi = ai[i * n + i];
    const d = pr * pr + pi * pi;
    yr[i] = (sr * pr + si * pi) / d;
    yi[i] = (si * pr - sr * pi) / d;
    hr += ct[i] * yr[i];
    hi += ct[i] * yi[i];
    sum += Math.abs(ct[i]) * Math.hypot(yr[i], yi[i]);
  }
  if (!Number.isFinite(hr) || !Number.isFinite(hi)) return null;
  const mag = Math.hypot(hr, hi);
  return { re: hr, im: hi, spread: mag > 0 ? sum / mag : sum > 0 ? Infinity : 1 };
}
