// Cheap right/left eigenvectors of the pencil (G, C) for many poles, from one shifted Hessenberg
// reduction (see hessenberg.ts): with F = G + σC, M = F⁻¹C = Q·H·Qᵀ,
//   (G + λC)·x = 0   ⇔  H·z = μ·z,  x = Q·z,           μ = −1/(λ − σ)
//   yᴴ(G + λC) = 0   ⇔  Hᴴ·w = μ̄·w, y = F⁻ᵀ·Q·w.
// Each pole then costs O(n²): inverse iteration (Wilkinson 1965) on the Hessenberg H − μI.
// Callers must check `residual` (on the original pencil) and `errorEstimate`, and fall back to a
// full solve when either is poor (e.g. fast poles of a stiff circuit, where μ crowds the
// eigenvalue 0 of M: the residual stays small but small entries lose accuracy).

import { solveRealTransposed, type RealLU } from '../linalg/lu';
import { eigenvectorPair } from '../linalg/eigvec';
import { mulComplex, sparseRows, type SparseRows } from '../linalg/sparse';
import { shiftedReduction, type ShiftedReduction } from './hessenberg';

export interface ModalVectors {
  rightRe: Float64Array;
  rightIm: Float64Array;
  leftRe: Float64Array;
  leftIm: Float64Array;
  /** max of the right and left relative residuals on G + λC (Frobenius norms). */
  residual: number;
  /** ulp·‖H‖/|μ|: expected relative error of the vectors' small entries, since μ sits that close
   *  to the eigenvalue 0 of M that the infinite and very fast poles crowd (Wilkinson 1965). */
  errorEstimate: number;
}

/** Inverse-iteration steps (Wilkinson 1965): with the shift at the eigenvalue one step nearly
 *  converges from a generic start; the second brings the residual to roundoff level. */
const INVERSE_STEPS = 2;

interface HessFactor { n: number; ur: Float64Array; ui: Float64Array; fr: Float64Array; fi: Float64Array; swap: Uint8Array }

/** LU with adjacent-row pivoting of H − μI (upper Hessenberg); tiny pivots are nudged to tol. */
function factorShifted(H: Float64Array, n: number, mr: number, mi: number, tol: number, work?: { ur: Float64Array; ui: Float64Array }): HessFactor {
  const ur = work?.ur ?? new Float64Array(n * n), ui = work?.ui ?? new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    // Only the band j ≥ i − 1 is read later; clear the one entry below it a reused buffer may hold.
    if (i >= 2) { ur[i * n + i - 2] = 0; ui[i * n + i - 2] = 0; }
    for (let j = Math.max(0, i - 1); j < n; j++) { ur[i * n + j] = H[i * n + j]; ui[i * n + j] = 0; }
    ur[i * n + i] -= mr;
    ui[i * n + i] -= mi;
  }
  const fr = new Float64Array(n), fi = new Float64Array(n), swap = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    if (k + 1 < n && Math.hypot(ur[(k + 1) * n + k], ui[(k + 1) * n + k]) > Math.hypot(ur[k * n + k], ui[k * n + k])) {
      swap[k] = 1;
      for (let j = k; j < n; j++) {
        let t = ur[k * n + j]; ur[k * n + j] = ur[(k + 1) * n + j]; ur[(k + 1) * n + j] = t;
        t = ui[k * n + j]; ui[k * n + j] = ui[(k + 1) * n + j]; ui[(k + 1) * n + j] = t;
      }
    }
    if (Math.hypot(ur[k * n + k], ui[k * n + k]) < tol) { ur[k * n + k] = tol; ui[k * n + k] = 0; }
    if (k + 1 >= n) continue;
    const pr = ur[k * n + k], pi = ui[k * n + k], d = pr * pr + pi * pi;
    const lr = ur[(k + 1) * n + k], li = ui[(k + 1) * n + k];
    const gr = (lr * pr + li * pi) / d, gi = (li * pr - lr * pi) / d;
    fr[k] = gr; fi[k] = gi;
    ur[(k + 1) * n + k] = 0; ui[(k + 1) * n + k] = 0;
    for (let j = k + 1; j < n; j++) {
      const ar = ur[k * n + j], ai = ui[k * n + j];
      ur[(k + 1) * n + j] -= gr * ar - gi * ai;
      ui[(k + 1) * n + j] -= gr * ai + gi * ar;
    }
  }
  return { n, ur, ui, fr, fi, swap };
}

/** x ← (H − μI)⁻¹x in place. */
function solveShifted(f: HessFactor, xr: Float64Array, xi: Float64Array): void {
  const { n, ur, ui, fr, fi, swap } = f;
  for (let k = 0; k + 1 < n; k++) {
    if (swap[k]) { let t = xr[k]; xr[k] = xr[k + 1]; xr[k + 1] = t; t = xi[k]; xi[k] = xi[k + 1]; xi[k + 1] = t; }
    xr[k + 1] -= fr[k] * xr[k] - fi[k] * xi[k];
    xi[k + 1] -= fr[k] * xi[k] + fi[k] * xr[k];
  }
  for (let i = n - 1; i >= 0; i--) {
    let sr = xr[i], si = xi[i];
    for (let j = i + 1; j < n; j++) {
      const a = ur[i * n + j], b = ui[i * n + j];
      sr -= a * xr[j] - b * xi[j];
      si -= a * xi[j] + b * xr[j];
    }
    const a = ur[i * n + i], b = ui[i * n + i], d = a * a + b * b;
    xr[i] = (sr * a + si * b) / d;
    xi[i] = (si * a - sr * b) / d;
  }
}

/** x ← (H − μI)⁻ᴴx in place: Uᴴ forward, then the eliminations' adjoints in reverse order. */
function solveShiftedAdjoint(f: HessFactor, xr: Float64Array, xi: Float64Array): void {
  const { n, ur, ui, fr, fi, swap } = f;
  for (let i = 0; i < n; i++) {
    let sr = xr[i], si = xi[i];
    for (let j = 0; j < i; j++) {
      const a = ur[j * n + i], b = -ui[j * n + i];
      sr -= a * xr[j] - b * xi[j];
      si -= a * xi[j] + b * xr[j];
    }
    const a = ur[i * n + i], b = -ui[i * n + i], d = a * a + b * b;
    xr[i] = (sr * a + si * b) / d;
    xi[i] = (si * a - sr * b) / d;
  }
  for (let k = n - 2; k >= 0; k--) {
    // (I − f·e_{k+1}e_kᵀ)ᴴ = I − f̄·e_k·e_{k+1}ᵀ
    xr[k] -= fr[k] * xr[k + 1] + fi[k] * xi[k + 1];
    xi[k] -= fr[k] * xi[k + 1] - fi[k] * xr[k + 1];
    if (swap[k]) { let t = xr[k]; xr[k] = xr[k + 1]; xr[k + 1] = t; t = xi[k]; xi[k] = xi[k + 1]; xi[k + 1] = t; }
  }
}

function normalize(re: Float64Array, im: Float64Array): boolean {
  let s = 0;
  for (let i = 0; i < re.length; i++) s += re[i] * re[i] + im[i] * im[i];
  if (!(s > 0) || !Number.isFinite(s)) return false;
  const k = 1 / Math.sqrt(s);
  for (let i = 0; i < re.length; i++) { re[i] *= k; im[i] *= k; }
  return true;
}

/** out = Q·v (Q real n×n). */
function applyQ(Q: Float64Array, n: number, vr: Float64Array, vi: Float64Array): [Float64Array, Float64Array] {
  const or = new Float64Array(n), oi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let sr = 0, si = 0;
    for (let j = 0; j < n; j++) { const q = Q[i * n + j]; sr += q * vr[j]; si += q * vi[j]; }
    or[i] = sr; oi[i] = si;
  }
  return [or, oi];
}

/** Relative residuals of x ((G + λC)x) and y ((G + λC)ᴴy): ‖·‖ / ((‖G‖ + |λ|‖C‖)·‖v‖),
 *  Frobenius norms, from the nonzeros of G and C. */
function residuals(G: SparseRows, C: SparseRows, n: number, lr: number, li: number,
  xr: Float64Array, xi: Float64Array, yr: Float64Array, yi: Float64Array, scale: number): number {
  const gr = new Float64Array(n), gi = new Float64Array(n), cr = new Float64Array(n), ci = new Float64Array(n);
  const norm = (ar: Float64Array, ai: Float64Array, br: Float64Array, bi: Float64Array, vr: Float64Array, vi: Float64Array, conj: number) => {
    // ‖a + λ̃·b‖ / ‖v‖ with λ̃ = λ (conj = 1) or λ̄ (conj = −1)
    let s = 0, v = 0;
    for (let i = 0; i < n; i++) {
      const rr = ar[i] + lr * br[i] - conj * li * bi[i];
      const ri = ai[i] + lr * bi[i] + conj * li * br[i];
      s += rr * rr + ri * ri;
      v += vr[i] * vr[i] + vi[i] * vi[i];
    }
    return Math.sqrt(s / v);
  };
  mulComplex(G, xr, xi, gr, gi); mulComplex(C, xr, xi, cr, ci);
  const rx = norm(gr, gi, cr, ci, xr, xi, 1);
  mulComplex(G, yr, yi, gr, gi, true); mulComplex(C, yr, yi, cr, ci, true);
  const ry = norm(gr, gi, cr, ci, yr, yi, -1);
  return Math.max(rx, ry) / scale;
}

export interface ModalSolver {
  vectors(lambda: { re: number; im: number }): ModalVectors | null;
}

export function modalSolver(G: Float64Array, C: Float64Array, n: number, reduction?: ShiftedReduction | null): ModalSolver | null {
  const red = reduction === undefined ? shiftedReduction(G, C, n) : reduction;
  if (!red) return null;
  const { H, Q, f, sigma } = red;
  let nH = 0, nG = 0, nC = 0;
  for (let i = 0; i < n * n; i++) { nH += H[i] * H[i]; nG += G[i] * G[i]; nC += C[i] * C[i]; }
  nH = Math.sqrt(nH); nG = Math.sqrt(nG); nC = Math.sqrt(nC);
  const tol = 1e-15 * Math.max(nH, 1e-300);
  const lu: RealLU = f;
  const work = { ur: new Float64Array(n * n), ui: new Float64Array(n * n) };
  const Gs = sparseRows(G, n), Cs = sparseRows(C, n);
  return {
    vectors(lambda) {
      const dr = lambda.re - sigma, di = lambda.im, d2 = dr * dr + di * di;
      if (!(d2 > 0)) return null;
      const mr = -dr / d2, mi = di / d2; // μ = −1/(λ − σ)
      const fac = factorShifted(H, n, mr, mi, tol, work);
      const zr = new Float64Array(n).fill(1), zi = new Float64Array(n);
      const wr = new Float64Array(n).fill(1), wi = new Float64Array(n);
      for (let i = 0; i < n; i++) { zr[i] += 0.37 * ((i * 7919) % 61) / 61; wr[i] += 0.29 * ((i * 104729) % 59) / 59; }
      for (let step = 0; step < INVERSE_STEPS; step++) {
        solveShifted(fac, zr, zi);
        solveShiftedAdjoint(fac, wr, wi);
        if (!normalize(zr, zi) || !normalize(wr, wi)) return null;
      }
      const [xr, xi] = applyQ(Q, n, zr, zi);
      const [ur, ui] = applyQ(Q, n, wr, wi);
      const yr = solveRealTransposed(lu, ur), yi = solveRealTransposed(lu, ui);
      if (!normalize(xr, xi) || !normalize(yr, yi)) return null;
      const scale = nG + Math.hypot(lambda.re, lambda.im) * nC;
      const residual = residuals(Gs, Cs, n, lambda.re, lambda.im, xr, xi, yr, yi, scale);
      const errorEstimate = (2.2e-16 * nH) / Math.hypot(mr, mi);
      return { rightRe: xr, rightIm: xi, leftRe: yr, leftIm: yi, residual: Number.isFinite(residual) ? residual : Infinity, errorEstimate };
    },
  };
}

/** The shared-reduction vectors are used only when they are this good; otherwise the full solve. */
const FAST_RESIDUAL_OK = 1e-12;
const FAST_ERROR_OK = 1e-9;

/** Right/left vectors of every pole (one entry per pole, conjugate pairs as exact conjugates):
 *  from the shared reduction when reliable, else by full inverse iteration (linalg/eigvec). */
export function poleVectors(
  sys: { n: number; G: Float64Array; C: Float64Array },
  poles: { re: number; im: number }[],
  reduction?: ShiftedReduction | null,
): ModalVectors[] {
  const { n, G, C } = sys;
  const ms = poles.length > 0 ? modalSolver(G, C, n, reduction) : null;
  let A: Float64Array | null = null;
  let pattern: { A: SparseRows; B: SparseRows } | undefined;
  const out: ModalVectors[] = [];
  const byPair = new Map<string, number>();
  poles.forEach((p, i) => {
    const twin = p.im < 0 ? byPair.get(`${p.re}:${-p.im}`) : undefined;
    if (twin !== undefined) {
      const t = out[twin];
      out.push({ ...t, rightIm: t.rightIm.map((v) => -v), leftIm: t.leftIm.map((v) => -v) });
      return;
    }
    byPair.set(`${p.re}:${p.im}`, i);
    const lambda = { re: p.re, im: p.im };
    const q = ms?.vectors(lambda) ?? null;
    if (q && q.residual <= FAST_RESIDUAL_OK && q.errorEstimate <= FAST_ERROR_OK) { out.push(q); return; }
    if (!A) { A = new Float64Array(n * n); for (let k = 0; k < n * n; k++) A[k] = -G[k]; }
    pattern ??= { A: sparseRows(A, n), B: sparseRows(C, n) };
    const e = eigenvectorPair(A, C, n, lambda, pattern);
    out.push({ ...e, errorEstimate: 0 });
  });
  return out;
}
