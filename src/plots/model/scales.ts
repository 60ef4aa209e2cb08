// Scales (data → pixel) and tick generation: nice linear ticks on a 1-2-5 sequence, log ticks with
// decade majors and 2..9 minors, and SI-prefixed engineering labels (prefixes per the SI brochure,
// 9th edition 2019, with the 2022 additions ronna/quetta/ronto/quecto). DOM-free.

export interface Scale {
  kind: 'linear' | 'log';
  /** Domain ends (data units) and range ends (pixels). */
  d0: number;
  d1: number;
  r0: number;
  r1: number;
  map(v: number): number;
  invert(px: number): number;
}

export function linearScale(d0: number, d1: number, r0: number, r1: number): Scale {
  const span = d1 - d0 || 1;
  const k = (r1 - r0) / span;
  return { kind: 'linear', d0, d1, r0, r1, map: (v) => r0 + (v - d0) * k, invert: (px) => d0 + (px - r0) / k };
}

/** Log scale; the domain must be positive (callers check; a bad domain falls back to 1..10). */
export function logScale(d0: number, d1: number, r0: number, r1: number): Scale {
  const ok = d0 > 0 && d1 > 0 && Number.isFinite(d0) && Number.isFinite(d1);
  const l0 = Math.log10(ok ? d0 : 1), l1 = Math.log10(ok ? d1 : 10);
  const k = (r1 - r0) / (l1 - l0 || 1);
  return {
    kind: 'log', d0: ok ? d0 : 1, d1: ok ? d1 : 10, r0, r1,
    map: (v) => r0 + (Math.log10(v) - l0) * k,
    invert: (px) => 10 ** (l0 + (px - r0) / k),
  };
}

/** SI prefixes from 10⁻³⁰ to 10³⁰ in steps of 10³ (SI brochure, 9th ed., Table 7, and 2022 CGPM). */
export const SI_PREFIXES: readonly { exponent: number; symbol: string; name: string }[] = [
  { exponent: -30, symbol: 'q', name: 'quecto' },
  { exponent: -27, symbol: 'r', name: 'ronto' },
  { exponent: -24, symbol: 'y', name: 'yocto' },
  { exponent: -21, symbol: 'z', name: 'zepto' },
  { exponent: -18, symbol: 'a', name: 'atto' },
  { exponent: -15, symbol: 'f', name: 'femto' },
  { exponent: -12, symbol: 'p', name: 'pico' },
  { exponent: -9, symbol: 'n', name: 'nano' },
  { exponent: -6, symbol: 'µ', name: 'micro' },
  { exponent: -3, symbol: 'm', name: 'milli' },
  { exponent: 0, symbol: '', name: '' },
  { exponent: 3, symbol: 'k', name: 'kilo' },
  { exponent: 6, symbol: 'M', name: 'mega' },
  { exponent: 9, symbol: 'G', name: 'giga' },
  { exponent: 12, symbol: 'T', name: 'tera' },
  { exponent: 15, symbol: 'P', name: 'peta' },
  { exponent: 18, symbol: 'E', name: 'exa' },
  { exponent: 21, symbol: 'Z', name: 'zetta' },
  { exponent: 24, symbol: 'Y', name: 'yotta' },
  { exponent: 27, symbol: 'R', name: 'ronna' },
  { exponent: 30, symbol: 'Q', name: 'quetta' },
];

/** Typographic minus (U+2212) for labels. */
export const MINUS = '\u2212';

export interface SiFormat {
  /** Significant digits (default 3). */
  digits?: number;
  /** Drop trailing zeros ("1 kHz" rather than "1.00 kHz"); default false. */
  trim?: boolean;
}

/** "1.59 kHz", "−2.2 µs", "0 Ω"; values beyond the prefix table fall back to e-notation. */
export function formatSi(value: number, unit = '', opts: SiFormat = {}): string {
  const digits = opts.digits ?? 3;
  if (!Number.isFinite(value)) return Number.isNaN(value) ? '—' : `${value < 0 ? MINUS : ''}∞ ${unit}`.trimEnd();
  if (value === 0) return `0 ${unit}`.trimEnd();
  const sign = value < 0 ? MINUS : '';
  const a = Math.abs(value);
  let e3 = Math.floor(Math.log10(a) / 3) * 3;
  let m = Number((a / 10 ** e3).toPrecision(digits));
  if (m >= 1000) { e3 += 3; m = Number((a / 10 ** e3).toPrecision(digits)); }
  if (m < 1 && e3 > -30) { e3 -= 3; m = Number((a / 10 ** e3).toPrecision(digits)); }
  const p = SI_PREFIXES.find((x) => x.exponent === e3);
  if (!p) return `${sign}${a.toExponential(digits - 1)} ${unit}`.trimEnd();
  const text = opts.trim ? String(m) : m.toPrecision(digits);
  return `${sign}${text} ${p.symbol}${unit}`.trimEnd();
}

export interface Tick {
  value: number;
  major: boolean;
  /** Label text; null for an unlabelled (minor) tick. */
  label: string | null;
}

/** Step on the 1-2-5 sequence (×10ᵏ) giving at most `maxTicks` intervals over `span`. */
export function niceStep(span: number, maxTicks = 6, mantissas: readonly number[] = [1, 2, 5]): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / Math.max(1, maxTicks);
  const e = Math.floor(Math.log10(raw));
  for (let k = e - 1; k <= e + 1; k++) {
    for (const m of mantissas) {
      const step = m * 10 ** k;
      if (step >= raw * (1 - 1e-9)) return step;
    }
  }
  return 10 ** (e + 1);
}

const clean = (v: number) => Number(v.toPrecision(12));

/** Ticks at whole multiples of a nice step inside [lo, hi]. `steps` overrides the step choice
 *  (e.g. multiples of 15/45/90 degrees for phase); `format` gives the label text. */
export function linearTicks(lo: number, hi: number, maxTicks = 6, format: (v: number) => string = plainLabel,
  steps?: readonly number[]): Tick[] {
  if (!(hi > lo)) return [{ value: lo, major: true, label: format(lo) }];
  const span = hi - lo;
  const step = steps ? steps.find((s) => span / s <= maxTicks) ?? niceStep(span, maxTicks) : niceStep(span, maxTicks);
  const out: Tick[] = [];
  for (let i = Math.ceil(lo / step - 1e-9); i * step <= hi + step * 1e-9; i++) {
    const v = clean(i * step);
    out.push({ value: v === 0 ? 0 : v, major: true, label: format(v === 0 ? 0 : v) });
  }
  return out;
}

/** Plain number label with a typographic minus and no float noise (0.30000000000000004 → "0.3"). */
export function plainLabel(v: number): string {
  const s = String(clean(v));
  return s.startsWith('-') ? MINUS + s.slice(1) : s;
}

/** Whole decades enclosing [lo, hi] (lo, hi > 0). */
export function decadeDomain(lo: number, hi: number): [number, number] {
  const a = Math.floor(Math.log10(lo) + 1e-9), b = Math.ceil(Math.log10(hi) - 1e-9);
  return [10 ** a, 10 ** Math.max(b, a + 1)];
}

/** Log-axis ticks: majors at decades (labelled every decade, or every 3rd, 6th ... on engineering steps, so at most `maxLabels`
 *  carry text), minors at 2..9 × 10ᵏ while the axis spans at most `minorDecades` decades. On an
 *  axis narrower than about two decades, 2 and 5 are labelled too (1-2-5). */
export function logTicks(lo: number, hi: number, unit = '', maxLabels = 8, minorDecades = 12): Tick[] {
  if (!(lo > 0) || !(hi > lo)) return [];
  const e0 = Math.floor(Math.log10(lo) + 1e-9), e1 = Math.ceil(Math.log10(hi) - 1e-9);
  const decades = e1 - e0;
  const every = [1, 3, 6, 9, 12].find((s) => Math.ceil((decades + 1) / s) <= maxLabels) ?? Math.ceil(decades / maxLabels);
  const inside = (v: number) => v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9);
  const narrow = Math.log10(hi / lo) < 2;
  const out: Tick[] = [];
  for (let e = e0; e <= e1; e++) {
    const dec = clean(10 ** e);
    if (inside(dec)) {
      const labelled = e % every === 0;
      out.push({ value: dec, major: true, label: labelled ? formatSi(dec, unit, { trim: true }) : null });
    }
    if (decades > minorDecades) continue;
    for (let m = 2; m <= 9; m++) {
      const v = clean(m * 10 ** e);
      if (!inside(v)) continue;
      const labelled = narrow && (m === 2 || m === 5);
      out.push({ value: v, major: false, label: labelled ? formatSi(v, unit, { trim: true }) : null });
    }
  }
  return out.sort((a, b) => a.value - b.value);
}

/** Unitless number with `digits` significant digits: "0.6321", "−12.5", "1.20e-7" outside 1e-3..1e5. */
export function formatPlain(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return Number.isNaN(v) ? '—' : v < 0 ? `${MINUS}∞` : '∞';
  const a = Math.abs(v);
  const s = a === 0 || (a >= 1e-3 && a < 1e5) ? String(Number(v.toPrecision(digits))) : v.toExponential(digits - 1);
  return s.startsWith('-') ? MINUS + s.slice(1) : s;
}
