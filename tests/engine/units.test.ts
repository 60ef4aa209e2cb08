import { describe, it, expect } from 'vitest';
import { formatSi, parseGain, parseSi } from '../../src/engine/units';

function val(text: string | number, unit?: string): number {
  const r = parseSi(text, unit);
  if (!r.ok) throw new Error(`expected ${String(text)} to parse: ${r.reason}`);
  return r.value;
}
function reason(text: string | number, unit?: string): string {
  const r = parseSi(text, unit);
  if (r.ok) throw new Error(`expected ${String(text)} to be rejected, got ${r.value}`);
  return r.reason;
}

describe('parseSi', () => {
  it('reads every SI prefix with its factor (SI brochure, 9th edition, Table 7)', () => {
    const table: [string, number][] = [
      ['q', 1e-30], ['r', 1e-27], ['y', 1e-24], ['z', 1e-21], ['a', 1e-18], ['f', 1e-15], ['p', 1e-12],
      ['n', 1e-9], ['µ', 1e-6], ['m', 1e-3], ['k', 1e3], ['M', 1e6], ['G', 1e9], ['T', 1e12],
      ['P', 1e15], ['E', 1e18], ['Z', 1e21], ['Y', 1e24], ['R', 1e27], ['Q', 1e30],
    ];
    for (const [p, f] of table) expect(val(`2${p}`) / f).toBeCloseTo(2, 12);
  });

  it('is case-sensitive: M is mega, m is milli; P is peta, p is pico (SI brochure)', () => {
    expect(val('10M')).toBe(10e6);
    expect(val('3m')).toBeCloseTo(3e-3, 15);
    expect(val('1P')).toBe(1e15);
    expect(val('1p')).toBe(1e-12);
  });

  it('reads the usual component spellings (common practice)', () => {
    expect(val('4.7k')).toBeCloseTo(4700, 9);
    expect(val('2p')).toBeCloseTo(2e-12, 24);
    expect(val('1.5µ')).toBeCloseTo(1.5e-6, 18);
    expect(val('1.5μ')).toBeCloseTo(1.5e-6, 18); // Greek mu U+03BC
    expect(val('1.5u')).toBeCloseTo(1.5e-6, 18);
    expect(val('1e-12')).toBe(1e-12);
    expect(val('2.2e3k')).toBeCloseTo(2.2e6, 6);
    expect(val('-5m')).toBeCloseTo(-5e-3, 15);
    expect(val('.5')).toBe(0.5);
    expect(val(' 47 ')).toBe(47);
    expect(val(33)).toBe(33);
  });

  it('accepts a unit symbol after the prefix (SI brochure unit symbols)', () => {
    expect(val('4.7kΩ', 'Ω')).toBeCloseTo(4700, 9);
    expect(val('4.7k\u2126', 'Ω')).toBeCloseTo(4700, 9); // OHM SIGN
    expect(val('10 kohm', 'Ω')).toBeCloseTo(1e4, 9);
    expect(val('2pF', 'F')).toBeCloseTo(2e-12, 24);
    expect(val('1mA/V', 'S')).toBeCloseTo(1e-3, 15);
    expect(val('10 mV', 'V')).toBeCloseTo(0.01, 15);
    expect(val('1 H', 'H')).toBe(1);
    expect(val('5mS', 'S')).toBeCloseTo(5e-3, 15);
    expect(val('3 A', 'A')).toBe(3); // capital A is ampere, not atto
    expect(val('3 a')).toBeCloseTo(3e-18, 30); // small a is atto
    expect(val('100MHz', 'Hz')).toBe(1e8);
    expect(val('2ns', 's')).toBeCloseTo(2e-9, 21);
    expect(val('1Ω', 'Ω')).toBe(1);
  });

  it('takes m as metre only after a prefix and only where a length is expected; lone m is milli', () => {
    expect(val('180nm', 'm')).toBeCloseTo(180e-9, 20);
    expect(val('2um', 'm')).toBeCloseTo(2e-6, 18);
    expect(val('3m', 'm')).toBeCloseTo(3e-3, 15);
    expect(parseSi('180nm', 'F').ok).toBe(false);
    expect(parseSi('180nm').ok).toBe(false);
  });

  it('rejects a unit other than the expected one, naming both', () => {
    expect(reason('2pF', 'Ω')).toMatch(/F.*Ω/);
  });

  it('rejects junk, empty text, overflow and NaN', () => {
    expect(reason('4.7x')).toBe('"4.7x" is not a number with an SI prefix');
    expect(reason('')).toMatch(/empty/);
    expect(reason('   ')).toMatch(/empty/);
    expect(reason('1e400')).toMatch(/too large/);
    expect(reason('1e300Q')).toMatch(/too large/);
    expect(reason(NaN)).toMatch(/not a finite/);
    expect(reason(Infinity)).toMatch(/not a finite/);
    expect(reason('NaN')).toMatch(/not a number/);
    expect(reason('k')).toMatch(/not a number/);
    expect(reason('1kk')).toMatch(/not a number/);
    expect(reason('10Meg')).toMatch(/not a number/); // not an SI prefix
    expect(reason('1d')).toMatch(/not a number/);
  });
});

describe('parseGain', () => {
  it('reads ratios and voltage decibels: 20·log10(1000) = 60 dB (definition of the decibel)', () => {
    const g = parseGain('60dB');
    expect(g.ok && g.value).toBeCloseTo(1000, 9);
    const h = parseGain('-6 dB');
    expect(h.ok && h.value).toBeCloseTo(Math.pow(10, -6 / 20), 12);
    const k = parseGain('10k');
    expect(k.ok && k.value).toBe(1e4);
    expect(parseGain('dB').ok).toBe(false);
    expect(parseGain('x dB').ok).toBe(false);
  });
});

describe('formatSi', () => {
  it('shows three significant digits with a prefix (common practice)', () => {
    expect(formatSi(1500, 'Ω')).toBe('1.50 kΩ');
    expect(formatSi(2.2e-12, 'F')).toBe('2.20 pF');
    expect(formatSi(0, 'V')).toBe('0 V');
    expect(formatSi(-4.7e3, 'Ω')).toBe('-4.70 kΩ');
    expect(formatSi(1e6, 'Hz')).toBe('1.00 MHz');
    expect(formatSi(150e-6, 'A')).toBe('150 µA');
    expect(formatSi(12.5, 'V')).toBe('12.5 V');
    expect(formatSi(999.96, 'Ω')).toBe('1.00 kΩ'); // rounding carries into the next prefix
    expect(formatSi(1234, 'Ω', 2)).toBe('1.2 kΩ');
    expect(formatSi(1.5e3)).toBe('1.50 k');
    expect(formatSi(42)).toBe('42.0');
    expect(formatSi(NaN, 'V')).toBe('NaN');
  });

  it('round-trips through parseSi', () => {
    for (const v of [1.5e3, 2.2e-12, -3.3e-6, 4.7e9, 0.1]) {
      const r = parseSi(formatSi(v, 'Ω', 6), 'Ω');
      expect(r.ok && r.value).toBeCloseTo(v, 12 - Math.floor(Math.log10(Math.abs(v))));
    }
  });
});
