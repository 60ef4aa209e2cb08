// Step response: y(t) above, and below the settling error |y − y∞|/|y∞| on a log axis so that a slow
// doublet tail shows as a long shelf; each settling time (last exit from the ±ε band) is marked
// across both panels.
import type { PlotSize, StepInput } from '../types';
import type { Scene } from './scene';
import { formatPlain, formatSi, linearScale, logScale, linearTicks, logTicks, niceStep, plainLabel } from './scales';
import { addNote, addPanel, axesItems, curveRuns, extent, newScene, titleItem, FONT_SIZE, type Panel } from './frame';
import { niceDomain } from './freqPanels';
import { LINES, PALETTE } from './palette';

export interface StepOptions extends PlotSize {
  timeAxis?: 'linear' | 'log';
}

export const percent = (eps: number) => `${plainLabel(Number((eps * 100).toPrecision(3)))} %`;

export function stepModel(input: StepInput, opts: StepOptions = {}): Scene {
  const width = opts.width ?? 640, height = opts.height ?? 440;
  const title = input.label ? `Step response: ${input.label}` : 'Step response';
  const scene = newScene(width, height, title, 'Response to a unit step at the input, with the settling error on a log scale');
  titleItem(scene, 66);
  const left = 66, right = 18, top = 30, gap = 12, bottom = 42;
  const logT = opts.timeAxis === 'log';
  const idx: number[] = [];
  for (let i = 0; i < input.t.length; i++) if (Number.isFinite(input.t[i]) && Number.isFinite(input.y[i]) && (!logT || input.t[i] > 0)) idx.push(i);
  if (idx.length < 2) {
    addNote(scene, input.message ?? 'No step response to draw.', left, top);
    return scene;
  }
  const t = idx.map((i) => input.t[i]), y = idx.map((i) => input.y[i]);
  const tLo = t[0], tHi = t[t.length - 1];
  const w = width - left - right, h = height - top - bottom - gap;
  const hY = Math.round(h * 0.55), hE = h - hY;
  const xs = logT ? logScale(tLo, tHi, left, left + w) : linearScale(tLo, tHi, left, left + w);
  const yInf = input.finalValue;
  const ye = extent([...y, yInf, 0]) as [number, number];
  // SI-prefixed tick labels (3 G, not 3000000000) keep the y axis narrow enough for the side panel.
  const siLabel = (v: number) => formatSi(v, '', { trim: true, digits: 3 });
  const dy = niceDomain(ye[0], ye[1], 8, [niceStep(ye[1] - ye[0] || 1, 6)], siLabel);
  const top1: Panel = { id: 'y', x: left, y: top, w, h: hY, xs, ys: linearScale(dy.lo, dy.hi, top + hY, top) };
  const eY = top + hY + gap;
  const tTicks = logT ? logTicks(tLo, tHi, 's') : linearTicks(tLo, tHi, 6, (v) => formatSi(v, 's', { trim: true, digits: 4 }));
  addPanel(scene, top1);
  scene.items.push(...axesItems(top1, tTicks, dy.ticks, { xLabels: false, yTitle: 'y(t)' }));
  scene.items.push({ kind: 'path', role: 'curve-step', clip: 'y', runs: curveRuns(top1, t, y), style: LINES.primary });
  const notes: string[] = [];
  if (input.message) notes.push(input.message);
  let err: (number | null)[] = [];
  let bottomPanel: Panel | null = null;
  if (yInf !== null && yInf !== 0) {
    const yline = top1.ys.map(yInf);
    scene.items.push({ kind: 'line', role: 'final-value', clip: 'y', x1: left, y1: yline, x2: left + w, y2: yline, style: LINES.reference });
    const below = yline - top < 14; // keep the label inside the panel
    scene.items.push({ kind: 'text', role: 'final-value-label', x: left + w - 4, y: below ? yline + 3 : yline - 3, text: `y∞ = ${siLabel(yInf)}`, anchor: 'end', baseline: below ? 'hanging' : 'auto', size: FONT_SIZE - 1, fill: PALETTE.inkSoft });
    err = y.map((v) => { const e = Math.abs(v - yInf) / Math.abs(yInf); return e > 0 ? e : null; });
    const tols = input.settling.map((s) => s.tolerance).filter((e) => e > 0);
    const eMax = Math.max(1, ...err.filter((e): e is number => e !== null));
    const eMin = Math.min(1e-4, ...tols.map((e) => e / 10));
    const eLo = 10 ** Math.floor(Math.log10(eMin) + 1e-9), eHi = 10 ** Math.min(1, Math.ceil(Math.log10(eMax) - 0.05));
    const ep: Panel = { id: 'err', x: left, y: eY, w, h: hE, xs, ys: logScale(eLo, eHi, eY + hE, eY) };
    bottomPanel = ep;
    addPanel(scene, ep);
    const eTicks = logTicks(eLo, eHi, '', 8, 0).map((tk) => ({ ...tk, label: tk.label === null ? null : percent(tk.value) }));
    scene.items.push(...axesItems(ep, tTicks, eTicks, { xTitle: logT ? 'time (log)' : 'time', yTitle: '|y − y∞| / |y∞|' }));
    scene.items.push({ kind: 'path', role: 'curve-error', clip: 'err', runs: curveRuns(ep, t, err), style: LINES.secondary });
    input.settling.forEach((s, n) => {
      if (!(s.tolerance > 0)) return;
      const yl = ep.ys.map(s.tolerance);
      scene.items.push({ kind: 'line', role: 'tolerance', clip: 'err', x1: left, y1: yl, x2: left + w, y2: yl, style: LINES.reference });
      scene.items.push({ kind: 'text', role: 'tolerance-label', x: left + 4, y: yl - 2, text: percent(s.tolerance), anchor: 'start', baseline: 'auto', size: FONT_SIZE - 2, fill: PALETTE.inkSoft });
      if (s.seconds === null) { notes.push(`Does not settle to ${percent(s.tolerance)} within the simulated time.`); return; }
      if (!(s.seconds >= tLo && s.seconds <= tHi)) return;
      const x = xs.map(s.seconds);
      scene.items.push({ kind: 'line', role: 'settling', x1: x, y1: top, x2: x, y2: eY + hE, style: { ...LINES.tertiary, width: 1.5 } });
      scene.items.push({ kind: 'marker', role: 'settling-mark', clip: 'err', shape: 'diamond', x, y: yl, size: 4, style: { stroke: PALETTE.violet, width: 1.5, fill: PALETTE.violet } });
      const text = `${percent(s.tolerance)}: ${formatSi(s.seconds, 's')}`;
      const flip = x + 8 + text.length * FONT_SIZE * 0.6 > left + w; // near the right edge: label to the left
      scene.items.push({ kind: 'text', role: 'settling-label', x: flip ? x - 4 : x + 4, y: top + 12 + 13 * n, text, anchor: flip ? 'end' : 'start', baseline: 'middle', size: FONT_SIZE - 1, fill: PALETTE.violet, weight: 'bold' });
    });
  } else {
    notes.push(yInf === 0 ? 'The final value is 0: settling is not defined relative to it.' : 'No final value: the response does not settle (or has an integrator).');
    scene.items.push(...axesItems({ ...top1, h: 0, y: eY }, tTicks, [], { xTitle: 'time' }).filter((i) => i.kind === 'text'));
  }
  const ep = bottomPanel;
  scene.hover.push({
    id: 'curve', mode: 'x', area: { x: left, y: top, w, h: ep ? eY + hE - top : hY },
    points: t.map((tv, i) => {
      const x = xs.map(tv);
      const dots: [number, number][] = [[x, top1.ys.map(y[i])]];
      const lines = [`t = ${formatSi(tv, 's')}`, `y = ${formatPlain(y[i])}`];
      const e = err[i];
      if (ep && e !== null && e !== undefined) { dots.push([x, Math.max(ep.y, Math.min(ep.y + ep.h, ep.ys.map(e)))]); lines.push(`error = ${percent(e)}`); }
      return { x, y: top, dots, lines };
    }),
  });
  if (input.overshoot !== null && input.overshoot !== undefined && input.overshoot >= 1e-4) notes.push(`Overshoot ${percent(input.overshoot)}.`);
  if (notes.length) addNote(scene, notes.join(' '), 8, height - 12);
  return scene;
}
