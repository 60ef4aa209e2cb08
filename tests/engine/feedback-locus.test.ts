import { describe, it, expect } from 'vitest';
import { rootLocus } from '../../src/engine/feedback/locus';
import { build, R, Cap, Gm, Vsrc } from './feedback-fixtures';

// Two transconductance stages closed in unity feedback: T(s) = k·T0/((1 + s/p1)(1 + s/p2)).
function twoPole(T0: number, p1: number, p2: number) {
  const Ra = 10e3, Rb = 10e3, g = Math.sqrt(T0) / 10e3;
  return build([
    Vsrc('V1', 'in', '0'),
    Gm('G1', '0', 'a', 'in', 'b', g), R('Ra', 'a', '0', Ra), Cap('Ca', 'a', '0', 1 / (p1 * Ra)),
    Gm('G2', '0', 'b', 'a', '0', g), R('Rb', 'b', '0', Rb), Cap('Cb', 'b', '0', 1 / (p2 * Rb)),
  ], { input: 'V1', output: { kind: 'voltage', node: 'b' } });
}

describe('root locus', () => {
  it('two-pole loop: poles meet on the real axis and split at the closed-form gain (common practice)', () => {
    const T0 = 4, p1 = 1e6, p2 = 1e8;
    const loc = rootLocus(twoPole(T0, p1, p2), 'G1.gm', { kMax: 10 });
    expect(loc.status).toBe('ok');
    // s² + (p1 + p2)s + p1p2(1 + kT0) = 0 has a double root when (p1 + p2)² = 4p1p2(1 + kT0)
    const kStar = ((p1 + p2) ** 2 / (4 * p1 * p2) - 1) / T0;
    expect(loc.splits.length).toBe(1);
    expect(loc.splits[0].k / kStar).toBeCloseTo(1, 4);
    expect(loc.splits[0].pole.re / (-(p1 + p2) / 2)).toBeCloseTo(1, 3);
    // at k = 0 the poles are the open-loop ones; at k = 1 as drawn; beyond the split real part −(p1+p2)/2
    const i1 = loc.k.indexOf(1);
    expect(i1).toBeGreaterThan(0);
    const at = (i: number) => loc.branches.map((b) => ({ re: b.re[i]!, im: b.im[i]! }));
    const start = at(0).map((p) => -p.re).sort((a, b) => a - b);
    expect(start[0] / p1).toBeCloseTo(1, 8);
    expect(start[1] / p2).toBeCloseTo(1, 8);
    const end = at(loc.k.length - 1);
    expect(loc.k[loc.k.length - 1]).toBe(10);
    for (const p of end) expect(p.re / (-(p1 + p2) / 2)).toBeCloseTo(1, 6);
    // product of the roots is p1p2(1 + kT0) at the end
    expect(Math.hypot(end[0].re, end[0].im) ** 2 / (p1 * p2 * (1 + 10 * T0))).toBeCloseTo(1, 6);
    expect(loc.rhpAtK).toBeNull();
  });

  it('branches do not jump: each step moves every pole only a little', () => {
    const loc = rootLocus(twoPole(4, 1e6, 1e8), 'G1.gm');
    for (const b of loc.branches) {
      for (let i = 1; i < loc.k.length; i++) {
        const a = Math.hypot(b.re[i - 1]!, b.im[i - 1]!), c = Math.hypot(b.re[i]!, b.im[i]!);
        expect(Math.abs(Math.log(c / a))).toBeLessThan(0.2);
        // conjugate partners keep their sign of imaginary part once split
        if (b.im[i - 1]! !== 0 && b.im[i]! !== 0) expect(Math.sign(b.im[i - 1]!)).toBe(Math.sign(b.im[i]!));
      }
    }
  });

  it('three equal poles: the RHP crossing is at k·T0 = 8 (Routh–Hurwitz, common practice)', () => {
    const T0 = 1, p = 1e7, Rv = 1e4, g = 1 / Rv;
    const sys = build([
      Vsrc('V1', 'in', '0'),
      Gm('G1', '0', 'a', 'in', 'c', g), R('Ra', 'a', '0', Rv), Cap('Ca', 'a', '0', 1 / (p * Rv)),
      Gm('G2', '0', 'b', 'a', '0', g), R('Rb', 'b', '0', Rv), Cap('Cb', 'b', '0', 1 / (p * Rv)),
      Gm('G3', '0', 'c', 'b', '0', g), R('Rc', 'c', '0', Rv), Cap('Cc', 'c', '0', 1 / (p * Rv)),
    ], { input: 'V1' });
    const loc = rootLocus(sys, 'G1.gm', { kMax: 12 });
    expect(loc.rhpAtK! * T0).toBeCloseTo(8, 4);
    // the crossing pole sits on the jω axis at ω = √3·p
    expect(Math.abs(loc.rhpPole!.im) / (Math.sqrt(3) * p)).toBeCloseTo(1, 3);
  });

  it('unknown key is named', () => {
    const loc = rootLocus(twoPole(4, 1e6, 1e8), 'Z1.gm');
    expect(loc.status).toBe('unknown-source');
    expect(loc.message).toMatch(/Z1\.gm/);
  });
});
