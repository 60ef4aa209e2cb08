// Number text for the results panels: SI prefixes (BIPM SI brochure), an em dash where a figure is
// undefined, and dB / degree figures with a fixed number of decimals.
import { formatSi } from '../../plots/index';

export const NONE = '—';

const ok = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

export const fmtHz = (v: number | null | undefined) => (ok(v) ? formatSi(v, 'Hz') : NONE);
export const fmtOhms = (v: number | null | undefined) => (ok(v) ? formatSi(v, 'Ω') : NONE);
export const fmtSeconds = (v: number | null | undefined) => (ok(v) ? formatSi(v, 's') : NONE);
export const fmtFarads = (v: number | null | undefined) => (ok(v) ? formatSi(v, 'F') : NONE);
export const fmtDeg = (v: number | null | undefined) => (ok(v) ? `${(Math.abs(v) < 0.05 ? 0 : v).toFixed(1)}°` : NONE);
export const fmtDb = (v: number | null | undefined) => (ok(v) ? `${(Math.abs(v) < 0.05 ? 0 : v).toFixed(1)} dB` : NONE);
export const fmtQ = (v: number | null | undefined) => (ok(v) ? v.toPrecision(3) : NONE);
/** A plain gain (V/V, A/A or Ω for a transimpedance): SI prefix, no unit. */
export const fmtGain = (v: number | null | undefined, unit = '') => (ok(v) ? formatSi(v, unit) : NONE);

/** A ratio after/before as "× 3.2" or "÷ 48" (always ≥ 1 after the sign). */
export function fmtRatio(r: number | null | undefined): string {
  if (!ok(r) || r <= 0) return NONE;
  if (Math.abs(Math.log10(r)) < 0.0043) return '× 1.00'; // within 1 %
  return r >= 1 ? `× ${r.toPrecision(3)}` : `÷ ${(1 / r).toPrecision(3)}`;
}

/** Magnitude of a complex pair (or a real number). */
export function magOf(z: { re: number; im: number } | number | null | undefined): number | null {
  if (z === null || z === undefined) return null;
  if (typeof z === 'number') return Number.isFinite(z) ? z : null;
  const m = Math.hypot(z.re, z.im);
  return Number.isFinite(m) ? m : null;
}

/** 20·log10|x|, or null. */
export function toDb(x: number | null | undefined): number | null {
  if (!ok(x) || x === 0) return null;
  return 20 * Math.log10(Math.abs(x));
}

/** A plain number to three significant digits (exponent form outside 0.01 … 10⁴). */
export function fmtNum(x: number | null | undefined): string {
  if (!ok(x)) return NONE;
  const a = Math.abs(x);
  if (a !== 0 && (a >= 1e4 || a < 1e-2)) return x.toExponential(2);
  return String(Number(x.toPrecision(3)));
}
