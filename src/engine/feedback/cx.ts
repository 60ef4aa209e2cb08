// Small complex helpers on {re, im} pairs (engine-internal).
import type { Cx } from '../types';

export const cx = (re: number, im = 0): Cx => ({ re, im });
export const cadd = (a: Cx, b: Cx): Cx => ({ re: a.re + b.re, im: a.im + b.im });
export const csub = (a: Cx, b: Cx): Cx => ({ re: a.re - b.re, im: a.im - b.im });
export const cmul = (a: Cx, b: Cx): Cx => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
export const cabs = (a: Cx): number => hypot2(a.re, a.im);
export const carg = (a: Cx): number => Math.atan2(a.im, a.re);
/** a / b; null when b is zero. */
export function cdiv(a: Cx, b: Cx): Cx | null {
  const d = b.re * b.re + b.im * b.im;
  if (d === 0 || !Number.isFinite(d)) return null;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}

/** Math.hypot(a, b) to the bit, without the builtin's per-call array: the same steps (largest
 *  magnitude first, then the Kahan-compensated sum of squares of the scaled values, as the
 *  ECMAScript engine's own routine does), for the hot loops that call it hundreds of thousands
 *  of times per analysis. */
export function hypot2(a: number, b: number): number {
  const x = Math.abs(a), y = Math.abs(b);
  if (x === Infinity || y === Infinity) return Infinity;
  if (x !== x || y !== y) return NaN;
  const max = x > y ? x : y;
  if (max === 0) return 0;
  let sum = 0, comp = 0;
  const n1 = x / max;
  let summand = n1 * n1 - comp;
  let pre = sum + summand;
  comp = (pre - sum) - summand;
  sum = pre;
  const n2 = y / max;
  summand = n2 * n2 - comp;
  pre = sum + summand;
  sum = pre;
  return Math.sqrt(sum) * max;
}
