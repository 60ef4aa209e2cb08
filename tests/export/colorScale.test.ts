import { describe, expect, it } from 'vitest';
import { DEFAULT_SCALE, impedanceColor, legendStops, luminance, NO_VALUE_COLOR, paletteAt, scaleFor, scalePosition } from '../../src/export/colorScale';

const hexRgb = (c: string) => [1, 3, 5].map((i) => parseInt(c.slice(i, i + 2), 16) / 255);
const toLin = (c: number) => (c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4));

// Deuteranopia simulation, severity 1 (Machado, Oliveira & Fernandes 2009, matrix from memory),
// applied in linear RGB; returns the simulated relative luminance (WCAG 2.x weights).
function deuteranLuminance(c: string): number {
  const [r, g, b] = hexRgb(c).map(toLin);
  const M = [[0.367322, 0.860646, -0.227968], [0.280085, 0.672501, 0.047413], [-0.01182, 0.04294, 0.968881]];
  const s = M.map((row) => Math.min(1, Math.max(0, row[0] * r + row[1] * g + row[2] * b)));
  return 0.2126 * s[0] + 0.7152 * s[1] + 0.0722 * s[2];
}

describe('impedance colour scale', () => {
  it('is monotone in luminance along |Z| (common practice: a sequential scale must read in order without hue)', () => {
    let prev = -1;
    for (let k = 0; k <= 40; k++) {
      const L = luminance(paletteAt(k / 40));
      expect(L).toBeGreaterThan(prev);
      prev = L;
    }
  });

  it('stays monotone for a deuteranope (Machado et al. 2009 simulation, from memory)', () => {
    let prev = -1;
    for (let k = 0; k <= 20; k++) {
      const L = deuteranLuminance(paletteAt(k / 20));
      expect(L).toBeGreaterThan(prev);
      prev = L;
    }
    // WCAG 2.x contrast ratio between the ends, as seen by a deuteranope: clearly apart.
    const lo = deuteranLuminance(paletteAt(0)), hi = deuteranLuminance(paletteAt(1));
    expect((hi + 0.05) / (lo + 0.05)).toBeGreaterThan(3);
  });

  it('maps log |Z| linearly and clamps outside the range', () => {
    const s = { minOhms: 100, maxOhms: 1e6 };
    expect(scalePosition(100, s)).toBeCloseTo(0, 12);
    expect(scalePosition(1e4, s)).toBeCloseTo(0.5, 12); // log10: 2 → 4 → 6
    expect(scalePosition(1e6, s)).toBeCloseTo(1, 12);
    expect(scalePosition(1, s)).toBe(0);
    expect(scalePosition(1e12, s)).toBe(1);
    expect(impedanceColor(1e12, s)).toBe(paletteAt(1));
    expect(impedanceColor(1e-3, s)).toBe(paletteAt(0));
    expect(impedanceColor(null, s)).toBe(NO_VALUE_COLOR);
    expect(impedanceColor(Number.NaN, s)).toBe(NO_VALUE_COLOR);
    expect(paletteAt(0)).not.toBe(paletteAt(1));
    expect(paletteAt(0)).toMatch(/^#[0-9a-f]{6}$/);
  });

  it('widens a scale to whole decades', () => {
    expect(scaleFor([350, 2.2e5])).toEqual({ minOhms: 100, maxOhms: 1e6 });
    expect(scaleFor([1000])).toEqual({ minOhms: 100, maxOhms: 1e4 });
    expect(scaleFor([null, undefined])).toEqual(DEFAULT_SCALE);
  });

  it('labels legend ticks per decade with SI prefixes (IEC 60027 / SI brochure prefixes)', () => {
    const stops = legendStops({ minOhms: 10, maxOhms: 1e6 });
    expect(stops.map((s) => s.label)).toEqual(['10 Ω', '100 Ω', '1 kΩ', '10 kΩ', '100 kΩ', '1 MΩ']);
    expect(stops[0].t).toBeCloseTo(0, 12);
    expect(stops[stops.length - 1].t).toBeCloseTo(1, 12);
    expect(stops[2].color).toBe(impedanceColor(1000, { minOhms: 10, maxOhms: 1e6 }));
    const many = legendStops({ minOhms: 1e-3, maxOhms: 1e12 }, 6);
    expect(many.length).toBeLessThanOrEqual(6);
    expect(many[0].label).toBe('1 mΩ');
  });
});
