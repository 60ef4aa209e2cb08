import { describe, it, expect } from 'vitest';
import { stepModel } from '../../src/plots/model/stepModel';
import { impedanceModel } from '../../src/plots/model/impedanceModel';
import { hoverAt } from '../../src/plots/model/hover';
import type { Scene } from '../../src/plots/model/scene';
import { byRole, crossingX, logGrid, tickPx, ticks, yAtX } from './sceneProbe';

const PREFIX: Record<string, number> = { p: 1e-12, n: 1e-9, 'µ': 1e-6, m: 1e-3, '': 1, k: 1e3, M: 1e6 };
/** "−2.5 µs" → −2.5e-6 */
function parseLabel(text: string): number {
  const m = /^(\u2212?[\d.]+) ([pnµmkM]?)\S+$/.exec(text)!;
  return Number(m[1].replace('\u2212', '-')) * PREFIX[m[2]];
}
/** Linear-axis pixel of v from the outermost labelled x ticks of a panel. */
function timePx(s: Scene, panel: string, v: number): number {
  const tk = ticks(s, 'x', panel).map((t) => ({ v: parseLabel(t.text), px: t.px }));
  const a = tk[0], b = tk[tk.length - 1];
  return a.px + ((v - a.v) * (b.px - a.px)) / (b.v - a.v);
}

describe('step model', () => {
  it('first-order step: 1 % and 0.1 % settling at τ·ln 100 and τ·ln 1000, where the drawn error crosses the bands (textbook)', () => {
    const tau = 1e-6;
    const t = Array.from({ length: 2001 }, (_, i) => (i * 10e-6) / 2000);
    const y = t.map((v) => 1 - Math.exp(-v / tau));
    const settling = [1e-2, 1e-3].map((tolerance) => ({ tolerance, seconds: tau * Math.log(1 / tolerance) }));
    const s = stepModel({ t, y, finalValue: 1, settling, overshoot: 0 });
    const lines = byRole(s, 'line', 'settling');
    expect(lines).toHaveLength(2);
    const tol = byRole(s, 'line', 'tolerance');
    const err = byRole(s, 'path', 'curve-error')[0];
    settling.forEach((st, i) => {
      expect(Math.abs(lines[i].x1 - timePx(s, 'err', st.seconds))).toBeLessThan(0.01);
      expect(Math.abs(crossingX(err.runs, tol[i].y1)! - lines[i].x1)).toBeLessThan(0.5);
    });
    expect(byRole(s, 'text', 'settling-label').map((l) => l.text)).toEqual(['1 %: 4.61 µs', '0.1 %: 6.91 µs']);
    const hit = hoverAt(s, timePx(s, 'err', 1e-6), s.clips[0].y + 5)!;
    expect(hit.point.lines).toEqual(['t = 1.00 µs', 'y = 0.6321', 'error = 36.8 %']);
  });

  it('doublet: the slow tail (τ2 = 100·τ1, 10 % weight) keeps the error above 1 % for decades; log time shows the shelf (common practice)', () => {
    const t1 = 1e-6, t2 = 100e-6;
    const t = logGrid(1e-8, 1e-3, 100);
    const y = t.map((v) => 1 - 0.9 * Math.exp(-v / t1) - 0.1 * Math.exp(-v / t2));
    // the fast term is negligible at these times: settle when 0.1·e^(−t/τ2) = ε
    const settling = [1e-2, 1e-3].map((tolerance) => ({ tolerance, seconds: t2 * Math.log(0.1 / tolerance) }));
    const s = stepModel({ t, y, finalValue: 1, settling }, { timeAxis: 'log' });
    expect(ticks(s, 'x', 'err').map((k) => k.text)).toContain('10 µs');
    const err = byRole(s, 'path', 'curve-error')[0];
    const one = byRole(s, 'line', 'tolerance')[0].y1;
    for (const label of ['10 µs', '100 µs']) expect(yAtX(err.runs, tickPx(s, 'x', 'err', label))!).toBeLessThan(one); // above the 1 % line
    const lines = byRole(s, 'line', 'settling');
    const pxPerDecade = tickPx(s, 'x', 'err', '100 µs') - tickPx(s, 'x', 'err', '10 µs');
    expect(lines[0].x1 - tickPx(s, 'x', 'err', '100 µs')).toBeCloseTo(Math.log10(settling[0].seconds / 100e-6) * pxPerDecade, 6);
  });

  it('no final value or no data gives a note', () => {
    const s = stepModel({ t: [0, 1e-6, 2e-6], y: [0, 1, 2], finalValue: null, settling: [{ tolerance: 0.01, seconds: null }] });
    expect(s.notes.join(' ')).toMatch(/No final value/);
    expect(byRole(s, 'path', 'curve-step')).toHaveLength(1);
    const e = stepModel({ status: 'no-input', message: 'no input chosen', t: [], y: [], finalValue: null, settling: [] });
    expect(e.notes).toEqual(['no input chosen']);
  });
});

describe('impedance model', () => {
  // Parallel RC: |Z| = R / √(1 + (ωRC)²), corner 1/(2πRC) (textbook)
  const R = 10e3, fc = 10e3, C = 1 / (2 * Math.PI * R * fc);
  const hz = logGrid(10, 1e7, 40);
  const ohms = hz.map((f) => R / Math.hypot(1, 2 * Math.PI * f * R * C));
  const s = impedanceModel({ node: 'out', hz, ohms });

  it('log-log: flat at R, R/√2 at the corner tick "10 kHz", −1 decade per decade above (textbook parallel RC)', () => {
    const curve = byRole(s, 'path', 'curve-z')[0];
    const y10k = tickPx(s, 'y', 'z', '10 kΩ'), y1k = tickPx(s, 'y', 'z', '1 kΩ');
    const ppdY = y1k - y10k;
    expect(Math.abs(yAtX(curve.runs, tickPx(s, 'x', 'z', '10 Hz'))! - y10k)).toBeLessThan(0.01);
    const xc = crossingX(curve.runs, y10k + 0.5 * Math.log10(2) * ppdY)!;
    expect(Math.abs(xc - tickPx(s, 'x', 'z', '10 kHz'))).toBeLessThan(0.5);
    const x1M = tickPx(s, 'x', 'z', '1 MHz'), x10M = tickPx(s, 'x', 'z', '10 MHz');
    const dy = yAtX(curve.runs, x10M)! - yAtX(curve.runs, x1M)!;
    expect(dy / ppdY).toBeCloseTo(1, 3);
    expect(ticks(s, 'y', 'z').map((k) => k.text)).toEqual(expect.arrayContaining(['1 Ω', '10 Ω', '100 Ω', '1 kΩ', '10 kΩ']));
  });

  it('hover reads |Z| in ohms with an SI prefix', () => {
    const hit = hoverAt(s, tickPx(s, 'x', 'z', '10 kHz'), s.clips[0].y + 10)!;
    expect(hit.point.lines).toEqual(['f = 10.0 kHz', '|Z| = 7.07 kΩ']);
  });

  it('an open node (no finite |Z|) gives a note naming the node', () => {
    const e = impedanceModel({ node: 'bias', hz: [1, 10], ohms: [null, null] });
    expect(e.notes[0]).toMatch(/node bias/);
  });
});
