// Shared plot furniture: panels (a rectangle with an x and a y scale), grid lines, tick labels, axis
// titles, curves split at missing samples, and notes.
import type { Rect, Scene, SceneItem } from './scene';
import { SMALL_SIGNAL_NOTE } from './scene';
import { type Scale, type Tick } from './scales';
import { LINES, PALETTE } from './palette';

export interface Panel extends Rect {
  id: string;
  xs: Scale;
  ys: Scale;
}

export const FONT_SIZE = 11;

export function newScene(width: number, height: number, title: string, what: string): Scene {
  return {
    width, height, title, description: `${what}. ${SMALL_SIGNAL_NOTE}`, background: PALETTE.background,
    clips: [], items: [], hover: [], notes: [],
  };
}

export function addPanel(scene: Scene, panel: Panel): void {
  scene.clips.push({ id: panel.id, x: panel.x, y: panel.y, w: panel.w, h: panel.h });
}

export interface AxesOptions {
  xTitle?: string;
  yTitle?: string;
  /** Draw x tick labels (false for the upper panel of a stacked pair). */
  xLabels?: boolean;
}

/** Estimated width of a text line (px): 0.6 em per character, a common estimate for sans-serif
 *  digits and prefixes (no font metrics in a DOM-free model). */
export function textWidth(text: string, size: number): number {
  return text.length * size * 0.6;
}

/** How many x tick labels like `sample` fit side by side in `width` px with a gap of one em. */
export function xLabelBudget(width: number, sample = '100 kHz'): number {
  return Math.max(2, Math.floor(width / (textWidth(sample, FONT_SIZE) + FONT_SIZE)));
}

/** Frame, grid and labels of one panel. x labels whose estimated boxes would touch the previous
 *  kept label are left out (the tick and grid line stay). */
export function axesItems(p: Panel, xTicks: Tick[], yTicks: Tick[], opts: AxesOptions = {}): SceneItem[] {
  const out: SceneItem[] = [];
  const inX = (v: number) => { const x = p.xs.map(v); return x >= p.x - 0.5 && x <= p.x + p.w + 0.5; };
  const inY = (v: number) => { const y = p.ys.map(v); return y >= p.y - 0.5 && y <= p.y + p.h + 0.5; };
  let lastRight = -Infinity;
  for (const t of xTicks) {
    if (!inX(t.value)) continue;
    const x = p.xs.map(t.value);
    out.push({ kind: 'line', role: t.major ? 'grid-major' : 'grid-minor', x1: x, y1: p.y, x2: x, y2: p.y + p.h, style: t.major ? LINES.gridMajor : LINES.gridMinor });
    if (t.label !== null && opts.xLabels !== false) {
      const anchor = x > p.x + p.w - 20 ? 'end' : 'middle'; // the last label stays inside the figure
      const tw = textWidth(t.label, FONT_SIZE);
      const l = anchor === 'end' ? x - tw : x - tw / 2;
      if (l < lastRight + FONT_SIZE / 2) continue;
      lastRight = l + tw;
      out.push({ kind: 'text', role: 'tick-x', x, y: p.y + p.h + 4, text: t.label, anchor, baseline: 'hanging', size: FONT_SIZE, fill: PALETTE.ink });
    }
  }
  for (const t of yTicks) {
    if (!inY(t.value)) continue;
    const y = p.ys.map(t.value);
    out.push({ kind: 'line', role: t.major ? 'grid-major' : 'grid-minor', x1: p.x, y1: y, x2: p.x + p.w, y2: y, style: t.major ? LINES.gridMajor : LINES.gridMinor });
    if (t.label !== null) {
      out.push({ kind: 'text', role: 'tick-y', x: p.x - 5, y, text: t.label, anchor: 'end', baseline: 'middle', size: FONT_SIZE, fill: PALETTE.ink });
    }
  }
  out.push({ kind: 'rect', role: 'frame', x: p.x, y: p.y, w: p.w, h: p.h, style: { stroke: PALETTE.ink, width: 1, fill: 'none' } });
  if (opts.xTitle && opts.xLabels !== false) {
    out.push({ kind: 'text', role: 'axis-title', x: p.x + p.w / 2, y: p.y + p.h + 20, text: opts.xTitle, anchor: 'middle', baseline: 'hanging', size: FONT_SIZE, fill: PALETTE.inkSoft });
  }
  if (opts.yTitle) {
    out.push({ kind: 'text', role: 'axis-title', x: p.x - 46, y: p.y + p.h / 2, text: opts.yTitle, anchor: 'middle', baseline: 'middle', size: FONT_SIZE, fill: PALETTE.inkSoft, rotate: -90 });
  }
  return out;
}

/** Pixel runs of a sampled curve; a run breaks at a missing or unplottable sample. */
export function curveRuns(p: Panel, xs: ArrayLike<number>, ys: ArrayLike<number | null>): number[][] {
  const runs: number[][] = [];
  let run: number[] = [];
  const ok = (v: number | null, s: Scale): v is number => v !== null && Number.isFinite(v) && (s.kind === 'linear' || v > 0);
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i], y = ys[i];
    if (!ok(x, p.xs) || !ok(y, p.ys)) {
      if (run.length >= 4) runs.push(run);
      run = [];
      continue;
    }
    run.push(p.xs.map(x), clampPx(p.ys.map(y), p.y, p.h));
  }
  if (run.length >= 4) runs.push(run);
  return runs;
}

/** Keep far-off samples near the panel so the clip does the cutting and numbers stay small. */
function clampPx(v: number, lo: number, span: number): number {
  return Math.min(Math.max(v, lo - 4 * span), lo + 5 * span);
}

/** Min and max of the finite values, or null when there are none. */
export function extent(values: Iterable<number | null>): [number, number] | null {
  let lo = Infinity, hi = -Infinity;
  for (const v of values) {
    if (v === null || !Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : null;
}

/** Words of `text` in lines no wider than `maxWidth` px (estimated by textWidth). */
export function wrapText(text: string, maxWidth: number, size: number): string[] {
  const lines: string[] = [];
  let cur = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    const next = cur ? `${cur} ${word}` : word;
    if (cur && textWidth(next, size) > maxWidth) { lines.push(cur); cur = word; } else cur = next;
  }
  if (cur) lines.push(cur);
  return lines;
}

/** A note wrapped to `maxWidth` px: kept once in scene.notes, drawn line by line from (x, y)
 *  downwards. Returns the number of lines. */
export function addWrappedNote(scene: Scene, text: string, x: number, y: number, maxWidth: number): number {
  const size = FONT_SIZE - 1;
  const lines = wrapText(text, maxWidth, size);
  scene.notes.push(text);
  lines.forEach((l, i) => scene.items.push({ kind: 'text', role: 'note', x, y: y + i * (size + 2), text: l, anchor: 'start', baseline: 'hanging', size, fill: PALETTE.inkSoft }));
  return lines.length;
}

/** A note: kept in scene.notes and drawn as a line of text at (x, y). */
export function addNote(scene: Scene, text: string, x: number, y: number): void {
  scene.notes.push(text);
  scene.items.push({ kind: 'text', role: 'note', x, y, text, anchor: 'start', baseline: 'hanging', size: FONT_SIZE - 1, fill: PALETTE.inkSoft });
}

/** Title at the top left; the small-signal caution at the top right when it fits beside it
 *  (widths estimated from the character count), else just under the title line at the right. */
export function titleItem(scene: Scene, x: number): void {
  scene.items.push({ kind: 'text', role: 'title', x, y: 6, text: scene.title, anchor: 'start', baseline: 'hanging', size: FONT_SIZE + 2, fill: PALETTE.ink, weight: 'bold' });
  const titleEnd = x + scene.title.length * (FONT_SIZE + 2) * 0.6;
  const cautionW = SMALL_SIGNAL_NOTE.length * (FONT_SIZE - 2) * 0.55;
  const fits = titleEnd + 12 + cautionW < scene.width - 18;
  scene.items.push({ kind: 'text', role: 'caution', x: scene.width - 18, y: fits ? 10 : 19, text: SMALL_SIGNAL_NOTE, anchor: 'end', baseline: 'hanging', size: FONT_SIZE - 2, fill: PALETTE.inkSoft });
}

/** Index of the sorted `xs` entry nearest to x (binary search). */
export function nearestIndex(xs: ArrayLike<number>, x: number): number {
  let lo = 0, hi = xs.length - 1;
  if (hi < 0) return -1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid; else hi = mid;
  }
  return Math.abs(xs[hi] - x) < Math.abs(xs[lo] - x) ? hi : lo;
}
