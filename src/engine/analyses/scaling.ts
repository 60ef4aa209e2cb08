// Row/column equilibration by powers of two (as in LAPACK dgeequ/zgeequ; exact, no rounding):
// MNA matrices mix 1 (source incidences), gains of 1e4 and conductances of 1e-9, so a pivot test
// relative to the largest entry would call legitimate small pivots "singular". After scaling every
// row and column has its largest entry in [1, 2), and a relative pivot tolerance means something.
// A·x = b  ⇔  (R·A·S)·y = R·b,  x = S·y.

import { luComplex, luReal, solveComplex, solveReal, type ComplexLU, type RealLU } from '../linalg/lu';

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
  return { lu: luReal(As, n, relTol, true), s, n };
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

export interface ScaledComplexLU { lu: ComplexLU; s: Scales; n: number }

/** Complex LU of (Ar + i·Ai) after equilibration; `singular` when a scaled pivot vanished.
 *  `inPlace` scales and factors the caller's arrays instead of copies. */
export function scaledLuComplex(Ar: Float64Array, Ai: Float64Array, n: number, relTol = 1e-14, inPlace = false): ScaledComplexLU & { singular: boolean } {
  const s = equilibrateBy((k) => Math.sqrt(Ar[k] * Ar[k] + Ai[k] * Ai[k]), n);
  const Sr = inPlace ? Ar : new Float64Array(n * n);
  const Si = inPlace ? Ai : new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    const ri = s.r[i];
    for (let j = 0; j < n; j++) {
      const f = ri * s.c[j];
      Sr[i * n + j] = Ar[i * n + j] * f;
      Si[i * n + j] = Ai[i * n + j] * f;
    }
  }
  const lu = luComplex(Sr, Si, n, relTol, true);
  return { lu, s, n, singular: lu.singularAt >= 0 };
}

/** Solve A·x = b with the scaled factor (b real or complex). */
export function solveScaledComplex(f: ScaledComplexLU, br: Float64Array, bi?: Float64Array): [Float64Array, Float64Array] {
  const { n, s } = f;
  const rr = new Float64Array(n);
  const ri = new Float64Array(n);
  for (let i = 0; i < n; i++) { rr[i] = s.r[i] * br[i]; ri[i] = bi ? s.r[i] * bi[i] : 0; }
  const [yr, yi] = solveComplex(f.lu, rr, ri);
  for (let i = 0; i < n; i++) { yr[i] *= s.c[i]; yi[i] *= s.c[i]; }
  return [yr, yi];
}

/** Scaled complex LU of the pencil G + s·C at one complex frequency s. */
export function factorPencilAt(G: Float64Array, C: Float64Array, n: number, s: { re: number; im: number }): ReturnType<typeof scaledLuComplex> {
  const Ar = new Float64Array(n * n);
  const Ai = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) { Ar[i] = G[i] + s.re * C[i]; Ai[i] = s.im * C[i]; }
  return scaledLuComplex(Ar, Ai, n, 1e-14, true);
}
