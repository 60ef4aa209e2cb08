// Plots at the results panel's width (276 px): x tick labels must not overlap. Label boxes are
// estimated at 0.6 em per character (common practice for sans-serif text without font metrics),
// from each text item's anchor; the check is independent of how the model thins its labels.
import { describe, expect, it } from 'vitest';
import { impedanceModel } from '../../src/plots/model/impedanceModel';
import { bodeModel } from '../../src/plots/model/bodeModel';
import { loopGainModel } from '../../src/plots/model/loopGainModel';
import { splaneModel } from '../../src/plots/model/splaneModel';
import type { Scene } from '../../src/plots/model/scene';

const PANEL = 276;
const logSweep = (f0: number, f1: number, n: number) => Array.from({ length: n }, (_, i) => f0 * (f1 / f0) ** (i / (n - 1)));

function tickBoxes(scene: Scene, role: string) {
  return scene.items.flatMap((it) => {
    if (it.kind !== 'text' || it.role !== role) return [];
    const w = it.text.length * it.size * 0.6;
    const left = it.anchor === 'end' ? it.x - w : it.anchor === 'middle' ? it.x - w / 2 : it.x;
    return [{ text: it.text, left, right: left + w }];
  });
}

function overlaps(boxes: { text: string; left: number; right: number }[]): string[] {
  const s = [...boxes].sort((a, b) => a.left - b.left);
  return s.slice(1).filter((b, i) => b.left < s[i].right).map((b, i) => `${s[i].text} / ${b.text}`);
}

describe('x tick labels at 276 px', () => {
  // Ranges a designer sweeps: 1 Hz..10 GHz (10 decades), 10 Hz..1 GHz, and a narrow 1-2-5 axis.
  const ranges: [number, number][] = [[1, 1e10], [10, 1e9], [1e3, 1e6], [1e5, 5e6]];
  for (const [f0, f1] of ranges) {
    it(`|Z(f)| from ${f0} to ${f1} Hz: no two labels overlap, at least two shown`, () => {
      const hz = logSweep(f0, f1, 81);
      const scene = impedanceModel({ node: 'out', hz, ohms: hz.map((f) => 1e4 / Math.hypot(1, f / 1e6)) }, { width: PANEL, height: 200 });
      const boxes = tickBoxes(scene, 'tick-x');
      expect(boxes.length).toBeGreaterThanOrEqual(2);
      expect(overlaps(boxes)).toEqual([]);
      for (const b of boxes) { expect(b.left).toBeGreaterThanOrEqual(0); expect(b.right).toBeLessThanOrEqual(PANEL); }
    });
    it(`Bode from ${f0} to ${f1} Hz: no two labels overlap`, () => {
      const hz = logSweep(f0, f1, 81);
      // one-pole low-pass at 1 MHz (textbook: |H| = 1/√(1+(f/fp)²), ∠H = −atan(f/fp))
      const scene = bodeModel({ hz, magDb: hz.map((f) => -10 * Math.log10(1 + (f / 1e6) ** 2)), phaseDeg: hz.map((f) => (-Math.atan(f / 1e6) * 180) / Math.PI) }, { width: PANEL, height: 240 });
      const boxes = tickBoxes(scene, 'tick-x');
      expect(boxes.length).toBeGreaterThanOrEqual(2);
      expect(overlaps(boxes)).toEqual([]);
    });
  }
});

describe('loop-gain plot at 276 px', () => {
  const textBox = (it: Scene['items'][number]) => {
    if (it.kind !== 'text') throw new Error('not text');
    const w = it.text.length * it.size * 0.6;
    const left = it.anchor === 'end' ? it.x - w : it.anchor === 'middle' ? it.x - w / 2 : it.x;
    return { left, right: left + w };
  };
  // Two-pole loop T = T0/((1+s/p1)(1+s/p2)) with invented T0 = 1000, p1 = 1 kHz, p2 = 10 GHz:
  // crossover near T0·p1 = 1 MHz (textbook single-pole GBW), PM close to 90°, near the right edge.
  const hz = logSweep(1, 1e7, 71);
  const t = hz.map((f) => { const a = Math.hypot(1, f / 1e3), b = Math.hypot(1, f / 1e10); return { db: 20 * Math.log10(1000 / (a * b)), ph: -(Math.atan(f / 1e3) + Math.atan(f / 1e10)) * 180 / Math.PI }; });
  const input = {
    hz, magDb: t.map((x) => x.db), phaseDeg: t.map((x) => x.ph), label: 'A1.M2',
    margins: { status: 'ok', unityGainHz: 1e6, phaseMarginDeg: 90, phaseCrossHz: null, gainMarginDb: null },
  };

  it('keeps the PM label inside the plot', () => {
    const scene = loopGainModel(input as never, { width: PANEL, height: 240 });
    const pm = scene.items.find((it) => it.kind === 'text' && it.role === 'phase-margin-label')!;
    expect(pm).toBeDefined();
    const b = textBox(pm);
    expect(b.right).toBeLessThanOrEqual(PANEL - 18 + 0.5); // the panels' right edge
    expect(b.left).toBeGreaterThanOrEqual(66);
  });

  it('wraps the note ("no gain margin") inside the width', () => {
    const scene = loopGainModel(input as never, { width: PANEL, height: 240 });
    expect(scene.notes.join(' ')).toMatch(/no gain margin/);
    const lines = scene.items.filter((it) => it.kind === 'text' && it.role === 'note');
    expect(lines.length).toBeGreaterThan(1);
    for (const l of lines) { const b = textBox(l); expect(b.left).toBeGreaterThanOrEqual(0); expect(b.right).toBeLessThanOrEqual(PANEL); }
  });
});

describe('s-plane at 276 px', () => {
  it('wraps its caption and legend inside the width, below the plane', () => {
    // invented poles: a real pole at −1 MHz and a complex pair at 10 MHz with Q ≈ 0.7
    const w0 = 2 * Math.PI * 1e7, q = 0.7;
    const re = -w0 / (2 * q), im = w0 * Math.sqrt(1 - 1 / (4 * q * q));
    const scene = splaneModel({ poles: [{ re: -2 * Math.PI * 1e6, im: 0 }, { re, im }, { re, im: -im }], zeros: [{ re: 2 * Math.PI * 5e7, im: 0 }] } as never, { width: PANEL, height: 300 });
    const frame = scene.items.find((it) => it.kind === 'rect' && it.role === 'frame')!;
    const bottom = frame.kind === 'rect' ? frame.y + frame.h : 0;
    const notes = scene.items.filter((it) => it.kind === 'text' && it.role === 'note');
    expect(notes.length).toBeGreaterThan(0);
    for (const n of notes) {
      if (n.kind !== 'text') continue;
      expect(n.x + n.text.length * n.size * 0.6).toBeLessThanOrEqual(PANEL); // 0.6 em estimate, common practice
      expect(n.y).toBeGreaterThan(bottom);
      expect(n.y + n.size).toBeLessThanOrEqual(300);
    }
  });
});
