// Row/column equilibration by powers of two (as in LAPACK dgeequ/zgeequ; exact, no rounding):
// MNA matrices mix 1 (source incidences), gains of 1e4 and conductances of 1e-9, so a pivot test
// relative to the largest entry would call legitimate small pivots "singular". After scaling every
// row and column has its largest entry in [1, 2), and a relative pivot tolerance means something.
// A·x = b  ⇔  (R·A·S)·y = R·b,  x = S·y.

import { CIRCUIT_PIVOT_THRESHOLD, complexInverseDiagonal, luComplex, luRealCircuit, pairedOrder, solveComplex, solveReal, type ComplexLU, type RealLU } from '../linalg/lu';

export interface Scales {
  r: Float64Array;
  c: Float64Array;
}

const pow2 = (v: number) => (v > 0 && Number.isFinite(v) ? Math.pow(2, -Math.floor(Math.log2(v))) : 1);

/** Scales from entry magnitudes |a_ij| (row-major, length n·n). */
export function equilibrate(mag: Float64Array, n: number): Scales {
  return equilibrateBy((k) => mag[k], n);
}

function equilibrateBy(mag: (k: number) => number, n: number): Scales {
  const r = new Float64Array(n);
  const c = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let m = 0;
    for (let j = 0; j < n; j++) { const v = mag(i * n + j); if (v > m) m = v; }
    r[i] = pow2(m);
  }
  for (let j = 0; j < n; j++) {
    let m = 0;
    for (let i = 0; i < n; i++) { const v = r[i] * mag(i * n + j); if (v > m) m = v; }
    c[j] = pow2(m);
  }
  return { r, c };
}

export interface ScaledRealLU { lu: RealLU; s: Scales; n: number }

export function scaledLuReal(A: Float64Array, n: number, relTol = 1e-14): ScaledRealLU {
  const s = equilibrateBy((k) => Math.abs(A[k]), n);
  const As = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) As[i * n + j] = s.r[i] * A[i * n + j] * s.c[j];
  return { lu: luRealCircuit(As, n, relTol), s, n };
}

/** Solve A·x = b with the scaled real factor. */
export function solveScaledReal(f: ScaledRealLU, b: Float64Array): Float64Array {
  const { n, s } = f;
  const r = new Float64Array(n);
  for (let i = 0; i < n; i++) r[i] = s.r[i] * b[i];
  const y = solveReal(f.lu, r);
  for (let i = 0; i < n; i++) y[i] *= s.c[i];
  return y;
}

/** Factor of R·A(order, order)·S: rows and columns equilibrated, unknowns in pairedOrder
 *  (lu.ts), threshold pivoting. `order[k]` is the original unknown at position k. */
export interface ScaledComplexLU { lu: ComplexLU; s: Scales; n: number; order: Int32Array }


/** Complex LU of (Ar + i·Ai) after equilibration; `singular` when a scaled pivot vanished. */
export function scaledLuComplex(Ar: Float64Array, Ai: Float64Array, n: number, relTol = 1e-14): ScaledComplexLU & { singular: boolean } {
  return scaledFactor(Ar, Ai, 0, 1, n, relTol);
}

/** Scaled, reordered factor of (P + sr·Q) + i·(si·Q), written straight from P and Q (no
 *  intermediate matrix of G + sC). */
function scaledFactor(P: Float64Array, Q: Float64Array, sr: number, si: number, n: number, relTol: number): ScaledComplexLU & { singular: boolean } {
  const mag = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) { const r = P[k] + sr * Q[k], i = si * Q[k]; mag[k] = Math.sqrt(r * r + i * i); }
  const s = equilibrate(mag, n);
  const order = pairedOrder(n, (i, j) => P[i * n + j] !== 0 || Q[i * n + j] !== 0);
  const Sr = mag; // reused: the magnitudes are not needed past the scales
  const Si = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    const oi = order[i], ri = s.r[oi];
    for (let j = 0; j < n; j++) {
      const oj = order[j], k = oi * n + oj, f = ri * s.c[oj];
      Sr[i * n + j] = (P[k] + sr * Q[k]) * f;
      Si[i * n + j] = si * Q[k] * f;
    }
  }
  const lu = luComplex(Sr, Si, n, relTol, true, CIRCUIT_PIVOT_THRESHOLD);
  return { lu, s, n, order, singular: lu.singularAt >= 0 };
}

/** Solve A·x = b with the scaled factor (b real or complex). */
export function solveScaledComplex(f: ScaledComplexLU, br: Float64Array, bi?: Float64Array): [Float64Array, Float64Array] {
  const { n, s, order } = f;
  const rr = new Float64Array(n);
  const ri = new Float64Array(n);
  for (let i = 0; i < n; i++) { const o = order[i]; rr[i] = s.r[o] * br[o]; ri[i] = bi ? s.r[o] * bi[o] : 0; }
  const [yr, yi] = solveComplex(f.lu, rr, ri);
  const xr = new Float64Array(n), xi = new Float64Array(n);
  for (let i = 0; i < n; i++) { const o = order[i]; xr[o] = yr[i] * s.c[o]; xi[o] = yi[i] * s.c[o]; }
  return [xr, xi];
}

/** (A⁻¹)_kk for k < count from the scaled factor: A⁻¹ = P·S·(R·PᵀAP·S)⁻¹·R·Pᵀ. */
export function scaledInverseDiagonal(f: ScaledComplexLU, count: number): [Float64Array, Float64Array] {
  const { n, s, order } = f;
  const pos = new Int32Array(n);
  for (let i = 0; i < n; i++) pos[order[i]] = i;
  const want = Int32Array.from({ length: count }, (_, k) => pos[k]);
  const [dr, di] = complexInverseDiagonal(f.lu, want);
  for (let k = 0; k < count; k++) { const w = s.r[k] * s.c[k]; dr[k] *= w; di[k] *= w; }
  return [dr, di];
}

/** Scaled complex LU of the pencil G + s·C at one complex frequency s. */
export function factorPencilAt(G: Float64Array, C: Float64Array, n: number, s: { re: number; im: number }): ReturnType<typeof scaledLuComplex> {
  return scaledFactor(G, C, s.re, s.im, n, 1e-14);
}
