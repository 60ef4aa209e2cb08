// Bode plot of the chosen transfer: |H| in dB and ∠H in degrees against log frequency, with the
// poles (×) and zeros (○) marked on the frequency axis at |s|/2π.
import type { BodeInput, PlotRoot, PlotSize } from '../types';
import type { HoverPoint, Scene } from './scene';
import { formatSi } from './scales';
import { addNote, newScene, titleItem, FONT_SIZE } from './frame';
import { frequencyPanels, type FreqPanels } from './freqPanels';
import { MARKS, PALETTE } from './palette';

export function bodeModel(input: BodeInput, size: PlotSize = {}): Scene {
  const width = size.width ?? 640, height = size.height ?? 440;
  const title = input.label ? `Bode plot: ${input.label}` : 'Bode plot';
  const scene = newScene(width, height, title, 'Magnitude and phase of the transfer against frequency');
  titleItem(scene, 66);
  const fp = frequencyPanels(scene, input, { width, height, symbol: 'H' });
  if (fp) markRoots(scene, fp, input.poles ?? [], input.zeros ?? []);
  return scene;
}

/** Roots with im ≥ 0 only (a conjugate pair is marked once, at ωn/2π). */
export function upperRoots(roots: PlotRoot[]): PlotRoot[] {
  return roots.filter((r) => r.im >= 0 || !roots.some((o) => o !== r && Math.abs(o.im + r.im) <= 1e-9 * Math.abs(r.im) && Math.abs(o.re - r.re) <= 1e-9 * Math.hypot(r.re, r.im)));
}

export function rootHz(r: PlotRoot): number {
  return Math.hypot(r.re, r.im) / (2 * Math.PI);
}

/** "real, LHP" / "complex, Q 2.10" / "RHP": words for a root. */
export function describeRoot(r: PlotRoot): string {
  const side = r.re > 0 ? 'RHP' : r.re === 0 && r.im !== 0 ? 'on the jω axis' : 'LHP';
  if (r.im === 0) return `real, ${side}`;
  const q = r.q ?? Math.hypot(r.re, r.im) / (2 * Math.abs(r.re));
  return Number.isFinite(q) ? `complex pair, Q ${q.toPrecision(3)}, ${side}` : `complex pair, ${side}`;
}

function markRoots(scene: Scene, fp: FreqPanels, poles: PlotRoot[], zeros: PlotRoot[]): void {
  const { mag, phase } = fp;
  const lo = mag.xs.d0, hi = mag.xs.d1;
  const points: HoverPoint[] = [];
  let origin = 0, outside = 0, broken = 0;
  const mark = (r: PlotRoot, isPole: boolean, row: number) => {
    const f = rootHz(r);
    if (!Number.isFinite(f)) { broken++; return; }
    if (f === 0) { origin++; return; }
    if (f < lo * (1 - 1e-9) || f > hi * (1 + 1e-9)) { outside++; return; }
    const x = mag.xs.map(f);
    const y = mag.y + mag.h - 9 - row * 14;
    const m = isPole ? MARKS.pole : r.re > 0 ? MARKS.zeroRhp : MARKS.zero;
    const what = isPole ? 'pole' : 'zero';
    scene.items.push({ kind: 'line', role: `${what}-guide`, x1: x, y1: mag.y, x2: x, y2: phase.y + phase.h, style: { stroke: m.style.stroke, width: 1, dash: '1 3', opacity: r.cancelsPole ? 0.4 : 0.8 } });
    const label = `${what} at ${formatSi(f, 'Hz')} (${describeRoot(r)}${r.cancelsPole ? ', cancels a pole' : ''})`;
    scene.items.push({ kind: 'marker', role: what, shape: m.shape, x, y, size: 5, style: { ...m.style, opacity: r.cancelsPole ? 0.45 : 1 }, title: label });
    if (r.re > 0) scene.items.push({ kind: 'text', role: `${what}-rhp`, x: x + 7, y, text: 'RHP', anchor: 'start', baseline: 'middle', size: FONT_SIZE - 2, fill: PALETTE.ink });
    if (r.im !== 0 && r.re <= 0) {
      const q = r.q ?? Math.hypot(r.re, r.im) / (2 * Math.abs(r.re));
      if (Number.isFinite(q)) scene.items.push({ kind: 'text', role: `${what}-q`, x: x + 7, y, text: `Q ${q.toPrecision(2)}`, anchor: 'start', baseline: 'middle', size: FONT_SIZE - 2, fill: PALETTE.ink });
    }
    points.push({ x, y, dots: [], lines: [label] });
  };
  for (const p of upperRoots(poles)) mark(p, true, 0);
  for (const z of upperRoots(zeros)) mark(z, false, 1);
  if (points.length) scene.hover.unshift({ id: 'roots', mode: 'xy', area: { x: mag.x, y: mag.y, w: mag.w, h: mag.h }, radius: 9, points });
  const notes: string[] = [];
  if (origin) notes.push(`${origin} root${origin > 1 ? 's' : ''} at s = 0 (not on a log axis)`);
  if (broken) notes.push(`${broken} root${broken > 1 ? 's' : ''} not finite (left out)`);
  if (outside) notes.push(`${outside} root${outside > 1 ? 's' : ''} outside the plotted band`);
  if (notes.length) addNote(scene, notes.join('; ') + '.', 8, scene.height - 12);
}
