// Two stacked panels over a shared log-frequency axis: magnitude (dB) above, phase (degrees) below.
// Used by the Bode plot of a transfer and by the loop-gain plot of a loop.
import type { FrequencyCurve } from '../types';
import type { HoverPoint, Scene } from './scene';
import { formatSi, linearTicks, logScale, linearScale, logTicks, niceStep, plainLabel, type Tick } from './scales';
import { addNote, addPanel, axesItems, xLabelBudget, curveRuns, extent, type Panel } from './frame';
import { LINES } from './palette';

export const DB_STEPS = [1, 2, 5, 10, 20, 40, 50, 100, 200] as const;
export const DEG_STEPS = [1, 2, 5, 10, 15, 30, 45, 90, 180, 360] as const;

export interface FreqPanels {
  mag: Panel;
  phase: Panel;
  /** Indices of the samples that are plotted (positive, finite frequency). */
  used: number[];
}

/** Domain widened to whole multiples of a step from `steps`, with its ticks. */
export function niceDomain(lo: number, hi: number, maxTicks: number, steps: readonly number[], format = plainLabel):
  { lo: number; hi: number; ticks: Tick[] } {
  if (!(hi > lo)) { lo -= steps[0] * 2; hi += steps[0] * 2; }
  const span = hi - lo;
  const step = steps.find((s) => span / s <= maxTicks) ?? niceStep(span, maxTicks);
  const a = Math.floor(lo / step + 1e-9) * step, b = Math.ceil(hi / step - 1e-9) * step;
  return { lo: a, hi: b, ticks: linearTicks(a, b, Math.round((b - a) / step) + 1, format, [step]) };
}

export interface FreqPanelOptions {
  width: number;
  height: number;
  /** Symbol in the read-out and titles, e.g. "H" or "T". */
  symbol: string;
  /** Values the magnitude / phase axes must include (0 dB, −180° for a loop). */
  includeDb?: number[];
  includeDeg?: number[];
}

export function frequencyPanels(scene: Scene, c: FrequencyCurve, o: FreqPanelOptions): FreqPanels | null {
  const used: number[] = [];
  for (let i = 0; i < c.hz.length; i++) if (c.hz[i] > 0 && Number.isFinite(c.hz[i])) used.push(i);
  const left = 66, right = 18, top = 30, gap = 12, bottom = 42;
  if (used.length < 2) {
    addNote(scene, 'No frequency sweep to draw (fewer than two samples with f > 0).', left, top);
    return null;
  }
  const fLo = c.hz[used[0]], fHi = c.hz[used[used.length - 1]];
  const h = o.height - top - bottom - gap;
  const hMag = Math.round(h * 0.55), hPh = h - hMag;
  const w = o.width - left - right;
  const xs = logScale(fLo, fHi, left, left + w);
  const m = extent([...used.map((i) => c.magDb[i]), ...(o.includeDb ?? [])]);
  const ph = extent([...used.map((i) => c.phaseDeg[i]), ...(o.includeDeg ?? [])]);
  const dm = niceDomain(m?.[0] ?? -20, m?.[1] ?? 20, 6, DB_STEPS);
  const dp = niceDomain(ph?.[0] ?? -90, ph?.[1] ?? 0, 5, DEG_STEPS);
  const mag: Panel = { id: 'mag', x: left, y: top, w, h: hMag, xs, ys: linearScale(dm.lo, dm.hi, top + hMag, top) };
  const phY = top + hMag + gap;
  const phase: Panel = { id: 'phase', x: left, y: phY, w, h: hPh, xs, ys: linearScale(dp.lo, dp.hi, phY + hPh, phY) };
  addPanel(scene, mag);
  addPanel(scene, phase);
  const fTicks = logTicks(fLo, fHi, 'Hz', xLabelBudget(w));
  scene.items.push(...axesItems(mag, fTicks, dm.ticks, { xLabels: false, yTitle: `|${o.symbol}| (dB)` }));
  scene.items.push(...axesItems(phase, fTicks, dp.ticks, { xTitle: 'frequency', yTitle: `∠${o.symbol} (°)` }));
  const hz = used.map((i) => c.hz[i]);
  scene.items.push({ kind: 'path', role: 'curve-mag', clip: 'mag', runs: curveRuns(mag, hz, used.map((i) => c.magDb[i])), style: LINES.primary });
  scene.items.push({ kind: 'path', role: 'curve-phase', clip: 'phase', runs: curveRuns(phase, hz, used.map((i) => c.phaseDeg[i])), style: LINES.secondary });
  if (!used.some((i) => c.magDb[i] !== null)) addNote(scene, 'The magnitude is undefined at every sample.', left + 6, top + 6);
  scene.hover.push({
    id: 'curve', mode: 'x', area: { x: left, y: top, w, h: hMag + gap + hPh },
    points: used.map((i) => hoverPoint(c, i, mag, phase, o.symbol)),
  });
  return { mag, phase, used };
}

function hoverPoint(c: FrequencyCurve, i: number, mag: Panel, phase: Panel, sym: string): HoverPoint {
  const x = mag.xs.map(c.hz[i]);
  const dots: [number, number][] = [];
  const lines = [`f = ${formatSi(c.hz[i], 'Hz')}`];
  const db = c.magDb[i], deg = c.phaseDeg[i];
  if (db !== null && Number.isFinite(db)) {
    lines.push(`|${sym}| = ${plainLabel(Number(db.toFixed(2)))} dB`);
    const y = mag.ys.map(db);
    if (y >= mag.y && y <= mag.y + mag.h) dots.push([x, y]);
  } else lines.push(`|${sym}| undefined`);
  if (deg !== null && Number.isFinite(deg)) {
    lines.push(`∠${sym} = ${plainLabel(Number(deg.toFixed(1)))}°`);
    const y = phase.ys.map(deg);
    if (y >= phase.y && y <= phase.y + phase.h) dots.push([x, y]);
  }
  return { x, y: mag.y, dots, lines };
}

/** Magnitude (dB) and phase (°) of complex samples, the phase unwrapped along the list. */
export function complexToCurve(hz: number[], values: ({ re: number; im: number } | null)[]): FrequencyCurve {
  const magDb: (number | null)[] = [], phaseDeg: (number | null)[] = [];
  let prev: number | null = null;
  for (const v of values) {
    const mag = v ? Math.hypot(v.re, v.im) : 0;
    if (!v || !(mag > 0) || !Number.isFinite(mag)) { magDb.push(null); phaseDeg.push(null); continue; }
    magDb.push(20 * Math.log10(mag));
    let p = (Math.atan2(v.im, v.re) * 180) / Math.PI;
    if (prev !== null) p += 360 * Math.round((prev - p) / 360);
    phaseDeg.push(p);
    prev = p;
  }
  return { hz, magDb, phaseDeg };
}
