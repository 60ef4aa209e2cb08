// SI values: parsing of "4.7k", "2pF", "1mA/V" and display as "1.50 kΩ".
// Prefix symbols and factors as in the SI brochure (BIPM, 9th edition, Table 7), case-sensitive:
// M = mega, m = milli, P = peta, p = pico. Deci, centi, deca and hecto are deliberately not accepted
// (never used for component values, and "d"/"da"/"h" would clash with unit letters). "u" is taken
// as an ASCII stand-in for micro (common practice); both U+00B5 and U+03BC are micro signs.

export type SiResult = { ok: true; value: number } | { ok: false; reason: string };

const PREFIXES: Record<string, number> = {
  q: 1e-30, r: 1e-27, y: 1e-24, z: 1e-21, a: 1e-18, f: 1e-15, p: 1e-12, n: 1e-9,
  µ: 1e-6, μ: 1e-6, u: 1e-6, m: 1e-3,
  k: 1e3, M: 1e6, G: 1e9, T: 1e12, P: 1e15, E: 1e18, Z: 1e21, Y: 1e24, R: 1e27, Q: 1e30,
};

/** Display prefixes from 1e-30 to 1e30 in steps of 10³ (index 10 = no prefix). */
const DISPLAY_PREFIXES = ['q', 'r', 'y', 'z', 'a', 'f', 'p', 'n', 'µ', 'm', '', 'k', 'M', 'G', 'T', 'P', 'E', 'Z', 'Y', 'R', 'Q'];

/** Canonical unit → spellings accepted after the prefix. */
const UNIT_SPELLINGS: Record<string, string[]> = {
  'Ω': ['Ω', '\u2126', 'ohm', 'ohms', 'Ohm'],
  F: ['F'],
  H: ['H'],
  S: ['S', 'A/V'],
  A: ['A'],
  V: ['V'],
  Hz: ['Hz'],
  s: ['s'],
  m: ['m'],
  'V/V': ['V/V'],
  '1/V': ['1/V', '/V', 'V⁻¹', 'S/A'],
  'm/V': ['m/V'],
  'F/m': ['F/m'],
  'F/m²': ['F/m²', 'F/m^2', 'F/m2'],
  'A/V²': ['A/V²', 'A/V^2', 'A/V2'],
};

const NUMBER = /^([+\-−]?(?:\d+\.?\d*|\.\d+)(?:[eE][+\-]?\d+)?)\s*(.*)$/;

/** Which canonical unit a spelling means, or undefined. Bare "m" (metre) is recognised only when
 *  metres are the expected unit, and then only after a prefix ("180nm"): a lone "3m" is milli. */
function unitOf(spelling: string, expected: string | undefined): string | undefined {
  for (const [canon, list] of Object.entries(UNIT_SPELLINGS)) {
    if (!list.includes(spelling)) continue;
    if (canon === 'm' && expected !== 'm') return undefined;
    return canon;
  }
  return undefined;
}

/** Parse an SI value. `unit` is the expected canonical unit ('Ω', 'F', 'S', 'm', ...); when given,
 *  a unit written in the text must be that one. Plain numbers are taken as already in SI units. */
export function parseSi(text: string | number, unit?: string): SiResult {
  if (typeof text === 'number') {
    if (!Number.isFinite(text)) return { ok: false, reason: `${String(text)} is not a finite number` };
    return { ok: true, value: text };
  }
  if (typeof text !== 'string') return { ok: false, reason: 'is not a number or a text' };
  const t = text.trim();
  if (t === '') return { ok: false, reason: 'is empty' };
  const m = NUMBER.exec(t);
  if (!m && /^[+\-−]?(?:inf|infinity|∞)\s*\S*$/i.test(t)) {
    // An ideal (infinite) value has no finite small-signal equations.
    return { ok: false, reason: `"${text}": an infinite value cannot be analysed; give a large finite value instead (e.g. 1G)` };
  }
  if (!m) return { ok: false, reason: `"${text}" is not a number with an SI prefix` };
  const mantissa = Number(m[1].replace('−', '-'));
  const rest = m[2];
  let factor = 1;
  let written: string | undefined;
  if (rest !== '') {
    // A prefix first (so "3m" is milli), then the rest as a unit; else the whole rest as a unit.
    const head = rest[0];
    const tail = rest.slice(1);
    if (head in PREFIXES && (tail === '' || unitOf(tail, unit) !== undefined)) {
      factor = PREFIXES[head];
      written = tail === '' ? undefined : unitOf(tail, unit);
    } else if (unitOf(rest, unit) !== undefined) {
      written = unitOf(rest, unit);
    } else {
      return { ok: false, reason: `"${text}" is not a number with an SI prefix` };
    }
  }
  if (written !== undefined && unit !== undefined && written !== unit) {
    const want = unit === '' ? 'a plain number' : unit;
    return { ok: false, reason: `"${text}" is in ${written}, but ${want} is expected here` };
  }
  const value = mantissa * factor;
  if (!Number.isFinite(value)) return { ok: false, reason: `"${text}" is too large to represent` };
  return { ok: true, value };
}

/** A gain written as a ratio ("1000", "10k") or in decibels of voltage ("60dB" → 10^(60/20)). */
export function parseGain(text: string | number): SiResult {
  if (typeof text === 'string') {
    const m = /^(.*?)\s*dB$/.exec(text.trim());
    if (m) {
      const db = m[1].trim() === '' ? NaN : Number(m[1].replace('−', '-'));
      if (!Number.isFinite(db)) return { ok: false, reason: `"${text}" is not a number of decibels` };
      const value = Math.pow(10, db / 20);
      if (!Number.isFinite(value)) return { ok: false, reason: `"${text}" is too large to represent` };
      return { ok: true, value };
    }
  }
  return parseSi(text, 'V/V');
}

/** Format for display with `digits` significant digits and an SI prefix: 1500 → "1.50 kΩ". */
export function formatSi(value: number, unit = '', digits = 3): string {
  const sep = unit === '' ? '' : ' ';
  if (Number.isNaN(value)) return 'NaN';
  if (!Number.isFinite(value)) return `${value < 0 ? '-' : ''}∞${sep}${unit}`;
  if (value === 0) return `0${sep}${unit}`;
  const sign = value < 0 ? '-' : '';
  const abs = Math.abs(value);
  let group = Math.floor(Math.log10(abs) / 3);
  let mant = abs / Math.pow(10, 3 * group);
  let text = mant.toPrecision(digits);
  if (Number(text) >= 1000) {
    // Rounding carried into the next group (999.7 → "1.00 k").
    group += 1;
    mant = abs / Math.pow(10, 3 * group);
    text = mant.toPrecision(digits);
  }
  if (text.includes('e')) text = String(Number(text)); // fewer digits than the integer part
  const idx = group + 10;
  if (idx < 0 || idx >= DISPLAY_PREFIXES.length) return `${sign}${abs.toExponential(digits - 1)}${sep}${unit}`;
  const prefix = DISPLAY_PREFIXES[idx];
  return `${sign}${text} ${prefix}${unit}`.trimEnd();
}
