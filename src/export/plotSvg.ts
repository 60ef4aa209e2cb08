// Plots as standalone SVG 1.1 (DOM-free): Bode magnitude and phase of a sweep, and the pole-zero
// map (poles ×, zeros ○, the usual s-plane convention). Log frequency axis with decade ticks.
import type { Pole, Sweep, Zero } from '../engine/index';
import { formatSi, SMALL_SIGNAL_CAUTION } from '../engine/index';
import { INK, INK_SOFT } from '../canvas/theme';
import { el, esc, num, svgDocument, text } from './svgWriter';
import { SVG_FONT } from './schematicSvg';

export const PLOT_COLOR = '#1f5f9e';
export const PHASE_COLOR = '#b0651a';
const W = 480, H = 200, L = 56, R = 16, T = 24, B = 34;

function path(xs: number[], ys: (number | null)[]): string {
  let d = '', pen = false;
  xs.forEach((x, i) => {
    const y = ys[i];
    if (y === null || !Number.isFinite(y)) { pen = false; return; }
    d += `${pen ? 'L' : 'M'}${num(x)} ${num(y)} `;
    pen = true;
  });
  return d.trim();
}

function niceStep(span: number, target = 5): number {
  const raw = span / target;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const m = raw / p;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * p;
}

function panel(id: string, y0: number, hz: number[], values: (number | null)[], unit: string, color: string, title: string): string {
  const f0 = Math.log10(hz[0]), f1 = Math.log10(hz[hz.length - 1]);
  const vals = values.filter((v): v is number => v !== null && Number.isFinite(v));
  let lo = vals.length ? Math.min(...vals) : -1, hi = vals.length ? Math.max(...vals) : 1;
  if (hi - lo < 1e-9) { lo -= 1; hi += 1; }
  const step = niceStep(hi - lo);
  lo = Math.floor(lo / step) * step; hi = Math.ceil(hi / step) * step;
  const px = (f: number) => L + ((Math.log10(f) - f0) / (f1 - f0 || 1)) * (W - L - R);
  const py = (v: number) => y0 + T + (1 - (v - lo) / (hi - lo)) * (H - T - B);
  const grid: string[] = [];
  for (let d = Math.ceil(f0); d <= Math.floor(f1); d++) {
    const x = px(Math.pow(10, d));
    grid.push(el('line', { x1: x, y1: y0 + T, x2: x, y2: y0 + H - B, stroke: '#d5dadd', 'stroke-width': 0.6 }));
    grid.push(text(x, y0 + H - B + 12, formatSi(Math.pow(10, d), 'Hz', 1), { 'font-size': 8, 'text-anchor': 'middle', fill: INK }));
  }
  for (let v = lo; v <= hi + step / 2; v += step) {
    const y = py(v);
    grid.push(el('line', { x1: L, y1: y, x2: W - R, y2: y, stroke: '#d5dadd', 'stroke-width': 0.6 }));
    grid.push(text(L - 4, y, `${num(v)}`, { 'font-size': 8, 'text-anchor': 'end', dy: '0.35em', fill: INK }));
  }
  return el('g', { id }, [
    text(L, y0 + 14, `${title} (${unit})`, { 'font-size': 9, 'font-weight': 'bold', fill: INK }),
    ...grid,
    el('rect', { x: L, y: y0 + T, width: W - L - R, height: H - T - B, fill: 'none', stroke: INK_SOFT, 'stroke-width': 0.8 }),
    el('path', { class: 'trace', d: path(hz.map(px), values.map((v) => (v === null ? null : py(v)))), fill: 'none', stroke: color, 'stroke-width': 1.6 }),
  ]);
}

/** Bode plot (magnitude in dB above, phase in degrees below) of a transfer sweep. */
export function bodeSvg(sweep: Sweep, title = 'Transfer'): string {
  const ok = sweep.hz.length >= 2 && sweep.hz[0] > 0;
  const body = ok
    ? [panel('magnitude', 0, sweep.hz, sweep.magDb, 'dB', PLOT_COLOR, `${title}: magnitude`), panel('phase', H, sweep.hz, sweep.phaseDeg, '°', PHASE_COLOR, `${title}: phase`)]
    : [text(L, 40, 'no sweep to plot', { 'font-size': 10, fill: INK })];
  const caption = text(L, 2 * H + 10, SMALL_SIGNAL_CAUTION, { 'font-size': 7, fill: INK_SOFT });
  return svgDocument({ x: 0, y: 0, width: W, height: 2 * H + 20 }, `${title} — Bode plot`, 'Frequency response; linear small-signal estimate.',
    [el('rect', { x: 0, y: 0, width: W, height: 2 * H + 20, fill: '#ffffff' }), el('g', { 'font-family': SVG_FONT }, [...body, caption])]);
}

/** Pole-zero map in the s-plane (axes in rad/s, symmetric around the real axis). */
export function poleZeroSvg(poles: Pole[], zeros: Zero[], title = 'Poles and zeros'): string {
  const size = 320, m = 40;
  const pts = [...poles, ...zeros];
  const span = Math.max(1, ...pts.map((p) => Math.max(Math.abs(p.re), Math.abs(p.im)))) * 1.15;
  const px = (re: number) => m + ((re + span) / (2 * span)) * (size - 2 * m);
  const py = (im: number) => m + ((span - im) / (2 * span)) * (size - 2 * m);
  const marks: string[] = [];
  for (const p of poles) {
    const x = px(p.re), y = py(p.im), r = 4;
    marks.push(el('path', { class: 'pole', d: `M${num(x - r)} ${num(y - r)}L${num(x + r)} ${num(y + r)}M${num(x - r)} ${num(y + r)}L${num(x + r)} ${num(y - r)}`, stroke: p.rhp ? '#b3261e' : PLOT_COLOR, 'stroke-width': 1.6, fill: 'none' }, el('title', {}, esc(`pole ${formatSi(p.hz, 'Hz')}`))));
  }
  for (const z of zeros) {
    marks.push(el('circle', { class: 'zero', cx: px(z.re), cy: py(z.im), r: 4, fill: 'none', stroke: z.rhp ? '#b3261e' : PHASE_COLOR, 'stroke-width': 1.4 }, el('title', {}, esc(`zero ${formatSi(z.hz, 'Hz')}`))));
  }
  const body = [
    el('rect', { x: 0, y: 0, width: size, height: size + 20, fill: '#ffffff' }),
    el('g', { 'font-family': SVG_FONT }, [
      text(m, 18, title, { 'font-size': 10, 'font-weight': 'bold', fill: INK }),
      el('line', { x1: m, y1: py(0), x2: size - m, y2: py(0), stroke: INK_SOFT, 'stroke-width': 0.8 }),
      el('line', { x1: px(0), y1: m, x2: px(0), y2: size - m, stroke: INK_SOFT, 'stroke-width': 0.8 }),
      text(size - m, py(0) + 12, 'σ (rad/s)', { 'font-size': 8, 'text-anchor': 'end', fill: INK }),
      text(px(0) + 4, m + 8, 'jω', { 'font-size': 8, fill: INK }),
      text(m, size - m + 14, `axes ±${formatSi(span, 'rad/s')}`, { 'font-size': 8, fill: INK }),
      ...marks,
      text(m, size + 8, SMALL_SIGNAL_CAUTION, { 'font-size': 6, fill: INK_SOFT }),
    ]),
  ];
  return svgDocument({ x: 0, y: 0, width: size, height: size + 20 }, title, 'Pole-zero map; linear small-signal estimate.', body);
}
