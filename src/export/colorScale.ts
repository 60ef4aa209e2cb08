// Impedance colour scale: log10 |Z| → colour on our own sequential palette. The palette runs in
// OKLab (Ottosson 2020) from a deep blue (low |Z|, a stiff node) through teal to amber (high |Z|,
// a soft node). Lightness rises strictly along the scale, so the order stays readable without hue
// (colour-blind safe: it never relies on telling red from green); the end hues are blue and amber,
// which all common colour-vision deficiencies keep apart. Pure TS, no DOM.

import { formatSi } from '../engine/units';

/** Palette stops in OKLCH: lightness 0..1, chroma, hue in degrees. Lightness strictly rising. */
export const IMPEDANCE_STOPS: readonly { l: number; c: number; h: number }[] = [
  { l: 0.40, c: 0.15, h: 268 },
  { l: 0.52, c: 0.12, h: 232 },
  { l: 0.62, c: 0.10, h: 190 },
  { l: 0.70, c: 0.12, h: 120 },
  { l: 0.77, c: 0.15, h: 72 },
];

/** Colour of a node whose |Z| is not defined (open at DC or not computed). */
export const NO_VALUE_COLOR = '#8a8f94';

export interface ImpedanceScale {
  /** Ohms at the low and high end of the scale (|Z| outside is clamped). */
  minOhms: number;
  maxOhms: number;
}

export const DEFAULT_SCALE: ImpedanceScale = { minOhms: 10, maxOhms: 1e8 };

interface Lab { L: number; a: number; b: number }

function lchToLab(s: { l: number; c: number; h: number }): Lab {
  const h = (s.h * Math.PI) / 180;
  return { L: s.l, a: s.c * Math.cos(h), b: s.c * Math.sin(h) };
}

// OKLab → linear sRGB (Ottosson 2020 matrices), then the sRGB transfer curve (IEC 61966-2-1).
function labToRgb({ L, a, b }: Lab): [number, number, number] {
  const l_ = L + 0.3963377774 * a + 0.2158037573 * b;
  const m_ = L - 0.1055613458 * a - 0.0638541728 * b;
  const s_ = L - 0.0894841775 * a - 1.2914855480 * b;
  const l = l_ ** 3, m = m_ ** 3, s = s_ ** 3;
  const lin = [
    4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
    -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
    -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s,
  ];
  return lin.map((v) => {
    const c = Math.min(1, Math.max(0, v));
    return c <= 0.0031308 ? 12.92 * c : 1.055 * Math.pow(c, 1 / 2.4) - 0.055;
  }) as [number, number, number];
}

function hex(rgb: [number, number, number]): string {
  return '#' + rgb.map((v) => Math.round(v * 255).toString(16).padStart(2, '0')).join('');
}

/** Palette colour at t ∈ [0, 1] (clamped), interpolated in OKLab between stops. */
export function paletteAt(t: number): string {
  const u = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0;
  const n = IMPEDANCE_STOPS.length - 1;
  const i = Math.min(n - 1, Math.floor(u * n));
  const f = u * n - i;
  const a = lchToLab(IMPEDANCE_STOPS[i]);
  const b = lchToLab(IMPEDANCE_STOPS[i + 1]);
  return hex(labToRgb({ L: a.L + (b.L - a.L) * f, a: a.a + (b.a - a.a) * f, b: a.b + (b.b - a.b) * f }));
}

/** Position on the scale of an impedance (log mapping, clamped to [0, 1]); null when undefined. */
export function scalePosition(ohms: number | null | undefined, scale: ImpedanceScale = DEFAULT_SCALE): number | null {
  if (ohms === null || ohms === undefined || !Number.isFinite(ohms) || ohms <= 0) return null;
  const lo = Math.log10(scale.minOhms);
  const hi = Math.log10(scale.maxOhms);
  if (!(hi > lo)) return 0.5;
  return Math.min(1, Math.max(0, (Math.log10(ohms) - lo) / (hi - lo)));
}

/** Colour of a node impedance; NO_VALUE_COLOR when the impedance is undefined. */
export function impedanceColor(ohms: number | null | undefined, scale: ImpedanceScale = DEFAULT_SCALE): string {
  const t = scalePosition(ohms, scale);
  return t === null ? NO_VALUE_COLOR : paletteAt(t);
}

/** A scale spanning the given impedances, widened to whole decades (at least one decade). */
export function scaleFor(ohms: (number | null | undefined)[]): ImpedanceScale {
  const v = ohms.filter((x): x is number => typeof x === 'number' && Number.isFinite(x) && x > 0);
  if (v.length === 0) return { ...DEFAULT_SCALE };
  let lo = Math.floor(Math.log10(Math.min(...v)));
  let hi = Math.ceil(Math.log10(Math.max(...v)));
  if (hi <= lo) { lo -= 1; hi += 1; }
  return { minOhms: Math.pow(10, lo), maxOhms: Math.pow(10, hi) };
}

export interface LegendStop {
  /** Position along the legend, 0..1. */
  t: number;
  ohms: number;
  color: string;
  /** SI text, e.g. "10 kΩ". */
  label: string;
}

/** Legend ticks: every decade of the scale (every second or third when there are many). */
export function legendStops(scale: ImpedanceScale = DEFAULT_SCALE, maxTicks = 8): LegendStop[] {
  const lo = Math.ceil(Math.log10(scale.minOhms) - 1e-9);
  const hi = Math.floor(Math.log10(scale.maxOhms) + 1e-9);
  const decades = hi - lo;
  const step = Math.max(1, Math.ceil((decades + 1) / Math.max(2, maxTicks)));
  const out: LegendStop[] = [];
  for (let d = lo; d <= hi; d += step) {
    const ohms = Math.pow(10, d);
    const t = scalePosition(ohms, scale) ?? 0;
    out.push({ t, ohms, color: paletteAt(t), label: formatSi(ohms, 'Ω', 1) });
  }
  return out;
}

/** Relative luminance (WCAG 2.x) of a #rrggbb colour, for tests and text contrast. */
export function luminance(color: string): number {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(color);
  if (!m) return 0;
  const lin = [m[1], m[2], m[3]].map((h) => {
    const c = parseInt(h, 16) / 255;
    return c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4);
  });
  return 0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2];
}
