// Small complex helpers on {re, im} pairs (engine-internal).
import type { Cx } from '../types';

export const cx = (re: number, im = 0): Cx => ({ re, im });
export const cadd = (a: Cx, b: Cx): Cx => ({ re: a.re + b.re, im: a.im + b.im });
export const csub = (a: Cx, b: Cx): Cx => ({ re: a.re - b.re, im: a.im - b.im });
export const cmul = (a: Cx, b: Cx): Cx => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
export const cabs = (a: Cx): number => Math.hypot(a.re, a.im);
export const carg = (a: Cx): number => Math.atan2(a.im, a.re);
/** a / b; null when b is zero. */
export function cdiv(a: Cx, b: Cx): Cx | null {
  const d = b.re * b.re + b.im * b.im;
  if (d === 0 || !Number.isFinite(d)) return null;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}
