// s-plane map: poles (×) and zeros (○), the selected loop's root locus (k from 0 through the drawn
// value to kMax, with marks at k = 0, k = drawn and k = kMax), and in compare mode an arrow from each
// pole of state A to its matched pole of state B. Linear or signed-log view (splaneView.ts).
import type { PlotRoot, PlotSize, SplaneInput } from '../types';
import type { HoverPoint, MarkerShape, Scene, Style } from './scene';
import { arrowRuns } from './scene';
import { addNote, newScene, titleItem, wrapText, FONT_SIZE } from './frame';
import { linearView, signedLogView, formatRoot, type SplaneView, type SplaneViewKind } from './splaneView';
import { describeRoot } from './bodeModel';
import { LINES, MARKS, PALETTE } from './palette';

export interface SplaneOptions extends PlotSize {
  view?: SplaneViewKind;
}

const ok = (r: PlotRoot | null | undefined): r is PlotRoot => !!r && Number.isFinite(r.re) && Number.isFinite(r.im);

export function splaneModel(input: SplaneInput, opts: SplaneOptions = {}): Scene {
  const width = opts.width ?? 560, height = opts.height ?? 480;
  const kind = opts.view ?? 'signed-log';
  const scene = newScene(width, height, 's-plane: poles × and zeros ○', 'Poles and zeros in the complex frequency plane');
  titleItem(scene, 66);
  const area = { x: 66, y: 30, w: width - 66 - 18, h: height - 30 - 58 };
  scene.clips.push({ id: 'plane', ...area });
  const migrations = (input.migrations ?? []).filter((m) => ok(m.before) || ok(m.after));
  const locus = input.locus && input.locus.k.length ? input.locus : null;
  const pts: [number, number][] = [];
  const poles = input.poles.filter(ok), zeros = input.zeros.filter(ok);
  for (const r of [...poles, ...zeros]) pts.push([r.re, r.im]);
  for (const m of migrations) for (const r of [m.before, m.after]) if (ok(r)) pts.push([r.re, r.im]);
  if (locus) for (const b of locus.branches) b.re.forEach((re, i) => { const im = b.im[i]; if (re !== null && im !== null && Number.isFinite(re) && Number.isFinite(im)) pts.push([re, im]); });
  const view = kind === 'linear' ? linearView(area, pts) : signedLogView(area, pts);
  scene.items.push(...view.furniture);
  scene.items.push({ kind: 'rect', role: 'frame', x: area.x, y: area.y, w: area.w, h: area.h, style: { stroke: PALETTE.ink, width: 1, fill: 'none' } });
  if (kind === 'linear') {
    scene.items.push({ kind: 'text', role: 'axis-title', x: area.x + area.w / 2, y: area.y + area.h + 20, text: 'σ/2π', anchor: 'middle', baseline: 'hanging', size: FONT_SIZE, fill: PALETTE.inkSoft });
    scene.items.push({ kind: 'text', role: 'axis-title', x: area.x - 50, y: area.y + area.h / 2, text: 'ω/2π', anchor: 'middle', baseline: 'middle', size: FONT_SIZE, fill: PALETTE.inkSoft, rotate: -90 });
  }
  const marks: HoverPoint[] = [];
  const legend: string[] = [];
  if (locus) legend.push(drawLocus(scene, view, locus, marks));
  if (migrations.length) legend.push(drawMigrations(scene, view, migrations, input.compareLabels ?? ['A', 'B'], marks));
  else for (const p of poles) marks.push(drawRoot(scene, view, p, 'pole'));
  for (const z of zeros) marks.push(drawRoot(scene, view, z, 'zero'));
  if (!pts.length) addNote(scene, 'No finite poles or zeros to draw.', area.x + 6, area.y + 6);
  scene.hover.push({ id: 'roots', mode: 'xy', area, radius: 10, points: marks });
  // Caption and legend wrapped to the width, stacked up from the foot (13 px a line).
  const size = FONT_SIZE - 1;
  const notes = [view.caption, ...(legend.length ? [legend.join(' ')] : [])];
  const lines = notes.flatMap((n) => wrapText(n, width - 16, size));
  scene.notes.push(...notes);
  lines.forEach((l, i) => scene.items.push({ kind: 'text', role: 'note', x: 8, y: height - 12 - 13 * (lines.length - 1 - i), text: l, anchor: 'start', baseline: 'hanging', size, fill: PALETTE.inkSoft }));
  return scene;
}

function drawRoot(scene: Scene, view: SplaneView, r: PlotRoot, what: 'pole' | 'zero'): HoverPoint {
  const [x, y] = view.map(r.re, r.im);
  const m = what === 'pole' ? MARKS.pole : r.re > 0 ? MARKS.zeroRhp : MARKS.zero;
  const label = `${what} ${formatRoot(r.re, r.im)} (${describeRoot(r)})`;
  scene.items.push({ kind: 'marker', role: what, clip: 'plane', shape: m.shape, x, y, size: 5, style: { ...m.style, opacity: r.cancelsPole ? 0.45 : 1 }, title: label });
  return { x, y, dots: [], lines: [label] };
}

function drawLocus(scene: Scene, view: SplaneView, locus: NonNullable<SplaneInput['locus']>, marks: HoverPoint[]): string {
  const k = locus.k, drawn = locus.drawnK ?? 1, kMax = k[k.length - 1];
  for (const b of locus.branches) {
    const runs: number[][] = [];
    let run: number[] = [];
    for (let i = 0; i < k.length; i++) {
      const re = b.re[i], im = b.im[i];
      if (re === null || im === null || !Number.isFinite(re) || !Number.isFinite(im)) { if (run.length >= 4) runs.push(run); run = []; continue; }
      const [x, y] = view.map(re, im);
      run.push(x, y);
    }
    if (run.length >= 4) runs.push(run);
    scene.items.push({ kind: 'path', role: 'locus', clip: 'plane', runs, style: { ...LINES.primary, width: 1.5 } });
    const at = (kv: number) => pointAtK(k, b, kv);
    const marksAt: [number, { shape: MarkerShape; style: Style }, string][] = [[0, MARKS.locusStart, 'locus-start'], [drawn, MARKS.locusAtOne, 'locus-drawn'], [kMax, MARKS.locusEnd, 'locus-end']];
    for (const [kv, m, role] of marksAt) {
      const p = at(kv);
      if (!p) continue;
      const [x, y] = view.map(p.re, p.im);
      const label = `k = ${Number(kv.toPrecision(3))}: ${formatRoot(p.re, p.im)}`;
      scene.items.push({ kind: 'marker', role, clip: 'plane', shape: m.shape, x, y, size: role === 'locus-drawn' ? 4.5 : 3.5, style: m.style, title: label });
      marks.push({ x, y, dots: [], lines: [label] });
    }
  }
  const msg = locus.message ? ` (${locus.message})` : '';
  return `Root locus: □ k = 0, ◆ k = ${Number(drawn.toPrecision(3))} (as drawn), △ k = ${Number(kMax.toPrecision(3))}${msg}.`;
}

const fin = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

/** Root on branch b at gain kv, linearly interpolated between the bracketing samples. */
export function pointAtK(k: number[], b: { re: (number | null)[]; im: (number | null)[] }, kv: number): PlotRoot | null {
  for (let i = 0; i < k.length; i++) {
    if (k[i] === kv) { const re = b.re[i], im = b.im[i]; return fin(re) && fin(im) ? { re, im } : null; }
    if (i + 1 < k.length && k[i] < kv && kv < k[i + 1]) {
      const a0 = b.re[i], a1 = b.re[i + 1], c0 = b.im[i], c1 = b.im[i + 1];
      if (!fin(a0) || !fin(a1) || !fin(c0) || !fin(c1)) return null;
      const t = (kv - k[i]) / (k[i + 1] - k[i]);
      return { re: a0 + (a1 - a0) * t, im: c0 + (c1 - c0) * t };
    }
  }
  return null;
}

function drawMigrations(scene: Scene, view: SplaneView, migrations: NonNullable<SplaneInput['migrations']>, names: [string, string], marks: HoverPoint[]): string {
  for (const m of migrations) {
    const a = ok(m.before) ? m.before : null, b = ok(m.after) ? m.after : null;
    const pa = a ? view.map(a.re, a.im) : null, pb = b ? view.map(b.re, b.im) : null;
    if (pa && pb) {
      const arrow = arrowRuns(pa[0], pa[1], pb[0], pb[1]);
      scene.items.push({ kind: 'path', role: 'migration', clip: 'plane', runs: arrow.shaft, style: { stroke: PALETTE.ink, width: 1.2 } });
      scene.items.push({ kind: 'path', role: 'migration-head', clip: 'plane', runs: arrow.head, closed: true, style: { stroke: PALETTE.ink, width: 1, fill: PALETTE.ink } });
    }
    if (a && pa) {
      const label = `${names[0]}: pole ${formatRoot(a.re, a.im)}${b ? '' : ` (no match in ${names[1]})`}`;
      scene.items.push({ kind: 'marker', role: 'pole-a', clip: 'plane', shape: MARKS.poleA.shape, x: pa[0], y: pa[1], size: 4.5, style: MARKS.poleA.style, title: label });
      marks.push({ x: pa[0], y: pa[1], dots: [], lines: [label] });
    }
    if (b && pb) {
      const label = `${names[1]}: pole ${formatRoot(b.re, b.im)}${a ? ` (from ${formatRoot(a.re, a.im)})` : ` (new in ${names[1]})`}`;
      scene.items.push({ kind: 'marker', role: 'pole-b', clip: 'plane', shape: MARKS.poleB.shape, x: pb[0], y: pb[1], size: 5.5, style: MARKS.poleB.style, title: label });
      marks.push({ x: pb[0], y: pb[1], dots: [], lines: [label] });
    }
  }
  return `Compare: thin grey × ${names[0]} → bold blue × ${names[1]}.`;
}
