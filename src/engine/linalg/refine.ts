// Polishing of one finite eigenvalue λ of the pencil (A, B) on the ORIGINAL matrices: inverse
// iteration for the right and left vectors with one LU of A − σB (σ a hair off λ so the factor
// stays regular), then the two-sided Rayleigh quotient λ = yᴴAx / yᴴBx (Ostrowski 1958;
// Parlett 1974 for the two-sided form). The quotient's rounding error is governed by |A||x|, not
// by ‖A‖‖x‖, so tiny eigenvalues of stiff pencils get back their full relative accuracy.
import { luReal, solveReal, solveRealTransposed, luComplex, solveComplex, solveComplexAdjoint } from './lu';

/** Relative offset of the factorisation shift from λ. */
const SHIFT_OFFSET = 1e-9;
const STEPS = 4;
/** Factorisations at most: when the first shift was poor (QZ far off for a tiny λ), the
 *  quotient is refactored at, i.e. Rayleigh-quotient iteration, which converges fast. */
const ROUNDS = 3;
/** The last Rayleigh-quotient change must be below this (relative) for the value to count. */
const CONVERGED = 1e-10;

export interface RefineScale { normA: number; normB: number }

function startVector(n: number, salt: number): Float64Array {
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) v[i] = 1 + 0.37 * (((i + 1) * 7919 + salt * 104729) % 61) / 61;
  return v;
}

function shiftOffset(lre: number, lim: number, s: RefineScale): number {
  const mag = Math.hypot(lre, lim);
  return SHIFT_OFFSET * (mag > 0 ? mag : s.normA / Math.max(s.normB, 1e-300));
}

function matVec(M: Float64Array, n: number, x: Float64Array, out: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let s = 0;
    const r = i * n;
    for (let j = 0; j < n; j++) s += M[r + j] * x[j];
    out[i] = s;
  }
}

function matTVec(M: Float64Array, n: number, y: Float64Array, out: Float64Array): void {
  out.fill(0);
  for (let i = 0; i < n; i++) {
    const yi = y[i];
    if (yi === 0) continue;
    const r = i * n;
    for (let j = 0; j < n; j++) out[j] += M[r + j] * yi;
  }
}

function normalize(v: Float64Array, w?: Float64Array): boolean {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i] + (w ? w[i] * w[i] : 0);
  if (!(s > 0) || !Number.isFinite(s)) return false;
  const f = 1 / Math.sqrt(s);
  for (let i = 0; i < v.length; i++) { v[i] *= f; if (w) w[i] *= f; }
  return true;
}

/** Refined real eigenvalue, or null when the iteration fails or does not settle (caller keeps
 *  its value). */
export function refineRealEigenvalue(A: Float64Array, B: Float64Array, n: number, lambda: number, s: RefineScale): number | null {
  const M = new Float64Array(n * n);
  let x = startVector(n, 1);
  let y = startVector(n, 2);
  const bx = new Float64Array(n), by = new Float64Array(n), ax = new Float64Array(n);
  let value = lambda;
  let change = Infinity;
  for (let round = 0; round < ROUNDS && !(change <= CONVERGED * Math.abs(value)); round++) {
  const sigma = value + shiftOffset(value, 0, s);
  for (let k = 0; k < n * n; k++) M[k] = A[k] - sigma * B[k];
  const f = luReal(M, n, 0);
  for (let step = 0; step < STEPS; step++) {
    x = solveReal(f, step === 0 ? x : (matVec(B, n, x, bx), bx));
    y = solveRealTransposed(f, step === 0 ? y : (matTVec(B, n, y, by), by));
    if (!normalize(x) || !normalize(y)) return null;
    matVec(A, n, x, ax);
    matVec(B, n, x, bx);
    let num = 0, den = 0;
    for (let i = 0; i < n; i++) { num += y[i] * ax[i]; den += y[i] * bx[i]; }
    if (den === 0 || !Number.isFinite(num / den)) return null;
    const next = num / den;
    change = Math.abs(next - value);
    value = next;
    if (step > 0 && change <= 4e-16 * Math.abs(value)) break;
  }
  }
  return change <= CONVERGED * Math.abs(value) ? value : null;
}

/** Refined complex eigenvalue (im ≠ 0), or null when the iteration fails. */
export function refineComplexEigenvalue(A: Float64Array, B: Float64Array, n: number,
  lre: number, lim: number, s: RefineScale): { re: number; im: number } | null {
  const Mr = new Float64Array(n * n), Mi = new Float64Array(n * n);
  let xr = startVector(n, 1), xi = startVector(n, 3);
  let yr = startVector(n, 2), yi = startVector(n, 4);
  const t1 = new Float64Array(n), t2 = new Float64Array(n);
  const axr = new Float64Array(n), axi = new Float64Array(n), bxr = new Float64Array(n), bxi = new Float64Array(n);
  let vr = lre, vi = lim;
  let change = Infinity;
  for (let round = 0; round < ROUNDS && !(change <= CONVERGED * Math.hypot(vr, vi)); round++) {
  const off = shiftOffset(vr, vi, s);
  const sr = vr + off * 0.6, si = vi + off * 0.8;
  for (let k = 0; k < n * n; k++) { Mr[k] = A[k] - sr * B[k]; Mi[k] = -si * B[k]; }
  const f = luComplex(Mr, Mi, n, 0);
  for (let step = 0; step < STEPS; step++) {
    if (step === 0) {
      [xr, xi] = solveComplex(f, xr, xi);
      [yr, yi] = solveComplexAdjoint(f, yr, yi);
    } else {
      matVec(B, n, xr, t1); matVec(B, n, xi, t2);
      [xr, xi] = solveComplex(f, t1, t2);
      matTVec(B, n, yr, t1); matTVec(B, n, yi, t2);
      [yr, yi] = solveComplexAdjoint(f, t1, t2);
    }
    if (!normalize(xr, xi) || !normalize(yr, yi)) return null;
    matVec(A, n, xr, axr); matVec(A, n, xi, axi);
    matVec(B, n, xr, bxr); matVec(B, n, xi, bxi);
    // yᴴv = Σ conj(y_i)·v_i
    let nr = 0, ni = 0, dr = 0, di = 0;
    for (let i = 0; i < n; i++) {
      nr += yr[i] * axr[i] + yi[i] * axi[i]; ni += yr[i] * axi[i] - yi[i] * axr[i];
      dr += yr[i] * bxr[i] + yi[i] * bxi[i]; di += yr[i] * bxi[i] - yi[i] * bxr[i];
    }
    const d = dr * dr + di * di;
    if (d === 0) return null;
    const qr = (nr * dr + ni * di) / d, qi = (ni * dr - nr * di) / d;
    if (!Number.isFinite(qr) || !Number.isFinite(qi)) return null;
    change = Math.hypot(qr - vr, qi - vi);
    vr = qr; vi = qi;
    if (step > 0 && change <= 4e-16 * Math.hypot(vr, vi)) break;
  }
  }
  return change <= CONVERGED * Math.hypot(vr, vi) ? { re: vr, im: vi } : null;
}
