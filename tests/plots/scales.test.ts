import { describe, it, expect } from 'vitest';
import { SI_PREFIXES, formatSi, niceStep, linearTicks, logTicks, logScale, linearScale, decadeDomain } from '../../src/plots/model/scales';

describe('SI prefixes', () => {
  it('names and symbols per the SI brochure (9th ed. Table 7, 2022 CGPM additions)', () => {
    // SI brochure, 9th edition (2019), Table 7, plus ronna/quetta/ronto/quecto (27th CGPM, 2022)
    const expected: Record<number, [string, string]> = {
      [-30]: ['q', 'quecto'], [-27]: ['r', 'ronto'], [-24]: ['y', 'yocto'], [-21]: ['z', 'zepto'], [-18]: ['a', 'atto'],
      [-15]: ['f', 'femto'], [-12]: ['p', 'pico'], [-9]: ['n', 'nano'], [-6]: ['µ', 'micro'], [-3]: ['m', 'milli'],
      3: ['k', 'kilo'], 6: ['M', 'mega'], 9: ['G', 'giga'], 12: ['T', 'tera'], 15: ['P', 'peta'], 18: ['E', 'exa'],
      21: ['Z', 'zetta'], 24: ['Y', 'yotta'], 27: ['R', 'ronna'], 30: ['Q', 'quetta'],
    };
    for (const p of SI_PREFIXES) {
      if (p.exponent === 0) continue;
      expect([p.symbol, p.name]).toEqual(expected[p.exponent]);
    }
    expect(SI_PREFIXES.filter((p) => p.exponent !== 0)).toHaveLength(20);
  });

  it('formats with engineering exponents (multiples of 3) and the unit symbol after a space (SI brochure 5.4.3)', () => {
    expect(formatSi(1000, 'Hz')).toBe('1.00 kHz');
    expect(formatSi(1000, 'Hz', { trim: true })).toBe('1 kHz');
    expect(formatSi(1.59155e3, 'Hz')).toBe('1.59 kHz');
    expect(formatSi(999.96, 'Hz')).toBe('1.00 kHz'); // rounds up into the next prefix
    expect(formatSi(2.2e-6, 's')).toBe('2.20 µs');
    expect(formatSi(-4700, 'Ω')).toBe('\u22124.70 kΩ');
    expect(formatSi(0, 'Hz')).toBe('0 Hz');
    expect(formatSi(1e9, 'Hz', { trim: true })).toBe('1 GHz');
    expect(formatSi(1e27, 'W', { trim: true })).toBe('1 RW');
    expect(formatSi(1e-30, 'g', { trim: true })).toBe('1 qg');
    expect(formatSi(5e33, 'Hz')).toMatch(/e\+33 Hz$/); // beyond the table: e-notation
  });
});

describe('linear ticks', () => {
  it('steps follow the 1-2-5 sequence and are the smallest such step within the tick budget (common practice)', () => {
    for (const span of [0.37, 1, 3.3, 7, 12, 99, 450, 1e-9 * 6.1, 2.5e6]) {
      for (const max of [4, 5, 6, 8, 10]) {
        const step = niceStep(span, max);
        const mant = step / 10 ** Math.floor(Math.log10(step) + 1e-9);
        expect([1, 2, 5].some((m) => Math.abs(mant - m) < 1e-9)).toBe(true);
        expect(span / step).toBeLessThanOrEqual(max * (1 + 1e-9));
        const smaller = [1, 2, 5].map((m) => m * 10 ** Math.floor(Math.log10(step) - 1)).concat([0.5 * step, 0.4 * step])
          .filter((s) => s < step * (1 - 1e-9) && [1, 2, 5].some((m) => Math.abs(s / 10 ** Math.floor(Math.log10(s) + 1e-9) - m) < 1e-9));
        for (const s of smaller) expect(span / s).toBeGreaterThan(max);
      }
    }
  });

  it('ticks are whole multiples of the step inside the range, without float noise', () => {
    const t = linearTicks(0, 1, 10);
    expect(t.map((k) => k.label)).toEqual(['0', '0.1', '0.2', '0.3', '0.4', '0.5', '0.6', '0.7', '0.8', '0.9', '1']);
    const n = linearTicks(-47, 13, 6);
    expect(n.map((k) => k.value)).toEqual([-40, -30, -20, -10, 0, 10]);
    expect(n[0].label).toBe('\u221240');
  });

  it('linear scale maps ends to ends and inverts', () => {
    const s = linearScale(-10, 30, 200, 0);
    expect(s.map(-10)).toBe(200);
    expect(s.map(30)).toBe(0);
    expect(s.invert(s.map(7.5))).toBeCloseTo(7.5, 12);
  });
});

describe('log ticks', () => {
  it('majors at each decade with SI labels, minors at 2..9 (common practice for log axes)', () => {
    const t = logTicks(1, 1e9, 'Hz', 12);
    const majors = t.filter((k) => k.major);
    expect(majors.map((k) => k.value)).toEqual([1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9]);
    expect(majors.map((k) => k.label)).toEqual(['1 Hz', '10 Hz', '100 Hz', '1 kHz', '10 kHz', '100 kHz', '1 MHz', '10 MHz', '100 MHz', '1 GHz']);
    const minors = t.filter((k) => !k.major);
    expect(minors).toHaveLength(9 * 8);
    expect(minors.slice(0, 8).map((k) => k.value)).toEqual([2, 3, 4, 5, 6, 7, 8, 9]);
    expect(minors.every((k) => k.label === null)).toBe(true);
  });

  it('a wide axis labels every third decade (engineering steps: 1 mHz, 1 Hz, 1 kHz ...)', () => {
    const t = logTicks(1e-3, 1e15, 'Hz', 8);
    const labels = t.filter((k) => k.label !== null).map((k) => k.label);
    expect(labels).toEqual(['1 mHz', '1 Hz', '1 kHz', '1 MHz', '1 GHz', '1 THz', '1 PHz']);
    expect(t.filter((k) => k.major)).toHaveLength(19);
    expect(t.some((k) => !k.major)).toBe(false); // no minors over 18 decades
  });

  it('a narrow axis also labels 2 and 5 (1-2-5)', () => {
    const labels = logTicks(100, 1000, 'Hz').filter((k) => k.label).map((k) => k.label);
    expect(labels).toEqual(['100 Hz', '200 Hz', '500 Hz', '1 kHz']);
  });

  it('equal pixel spacing per decade, and m·10ᵏ at log10(m) of a decade', () => {
    const s = logScale(1, 1e6, 0, 600);
    for (let e = 0; e < 6; e++) expect(s.map(10 ** (e + 1)) - s.map(10 ** e)).toBeCloseTo(100, 9);
    expect(s.map(2) - s.map(1)).toBeCloseTo(100 * Math.log10(2), 9);
    expect(s.invert(s.map(3.3e4))).toBeCloseTo(3.3e4, 6);
    expect(decadeDomain(3.2, 870)).toEqual([1, 1000]);
  });
});
