// Step plot y axis in the 276-px side panel: large transimpedance values get SI-prefixed labels.
import { describe, expect, it } from 'vitest';
import { stepModel } from '../../src/plots/index';

describe('step plot y labels', () => {
  it('labels a 3 GΩ-scale response with SI prefixes, not raw digits', () => {
    // Invented single-pole response y(t) = Y∞(1 − e^(−t/τ)), Y∞ = 3·10⁹, τ = 1 µs (closed form).
    const t = Array.from({ length: 200 }, (_, i) => (i * 10e-6) / 199);
    const y = t.map((x) => 3e9 * (1 - Math.exp(-x / 1e-6)));
    const scene = stepModel({ t, y, finalValue: 3e9, settling: [{ tolerance: 0.01, seconds: 4.6e-6 }], label: 'invented' }, { width: 276, height: 240 });
    const texts = scene.items.filter((i) => i.kind === 'text').map((i) => (i as { text: string }).text);
    expect(texts.some((s) => /\d{7,}/.test(s))).toBe(false);
    // SI prefix G = 10⁹ (BIPM SI brochure, 9th ed., Table 7).
    expect(texts.some((s) => /^3 G$|y∞ = 3 G/.test(s))).toBe(true);
  });
});
