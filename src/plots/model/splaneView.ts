// The two s-plane views. Linear: equal scales on σ/2π and ω/2π (angles, hence Q, read true).
// Signed log (log-polar): a root s = |s|·e^{jθ} is drawn at angle θ and radius log10(|s|/r0), so
// poles spread over many decades stay apart while the half-plane (and each constant-Q ray) stays
// where it is. Everything below r0 collapses onto the centre disc. Units: Hz (s/2π).
import type { Rect, SceneItem } from './scene';
import { formatSi, linearTicks, logTicks, MINUS } from './scales';
import { FONT_SIZE } from './frame';
import { LINES, PALETTE } from './palette';

export type SplaneViewKind = 'linear' | 'signed-log';

export interface SplaneView {
  kind: SplaneViewKind;
  /** Root (rad/s) → pixel. */
  map(re: number, im: number): [number, number];
  /** Grid, axes and labels. */
  furniture: SceneItem[];
  /** One-line description of the mapping. */
  caption: string;
}

const TWO_PI = 2 * Math.PI;
/** Constant-Q rays drawn in both views: angle from the negative real axis is acos(1/(2Q)). */
export const Q_RAYS = [Math.SQRT1_2, 2];

/** Linear view with equal x/y scales fitted to the points (Hz). */
export function linearView(area: Rect, pts: [number, number][]): SplaneView {
  let xLo = 0, xHi = 0, yLo = 0, yHi = 0;
  for (const [re, im] of pts) {
    xLo = Math.min(xLo, re / TWO_PI); xHi = Math.max(xHi, re / TWO_PI);
    yLo = Math.min(yLo, im / TWO_PI); yHi = Math.max(yHi, im / TWO_PI);
  }
  const big = Math.max(xHi - xLo, yHi - yLo) || 1;
  if (xHi - xLo < big * 0.1) { xLo -= big * 0.05; xHi += big * 0.05; }
  if (yHi - yLo < big * 0.1) { yLo -= big * 0.05; yHi += big * 0.05; }
  const upp = Math.max((xHi - xLo) / area.w, (yHi - yLo) / area.h) * 1.12; // Hz per pixel
  const cx = (xLo + xHi) / 2, cy = (yLo + yHi) / 2;
  const px = (v: number) => area.x + area.w / 2 + (v - cx) / upp;
  const py = (v: number) => area.y + area.h / 2 - (v - cy) / upp;
  const vx0 = cx - (area.w / 2) * upp, vx1 = cx + (area.w / 2) * upp;
  const vy0 = cy - (area.h / 2) * upp, vy1 = cy + (area.h / 2) * upp;
  const fmt = (v: number) => formatSi(v, 'Hz', { trim: true, digits: 4 });
  const items: SceneItem[] = [];
  for (const t of linearTicks(vx0, vx1, 5, fmt)) {
    const x = px(t.value);
    items.push({ kind: 'line', role: 'grid-major', clip: 'plane', x1: x, y1: area.y, x2: x, y2: area.y + area.h, style: LINES.gridMajor });
    items.push({ kind: 'text', role: 'tick-x', x, y: area.y + area.h + 4, text: t.label ?? '', anchor: 'middle', baseline: 'hanging', size: FONT_SIZE - 1, fill: PALETTE.ink });
  }
  for (const t of linearTicks(vy0, vy1, 6, fmt)) {
    const y = py(t.value);
    items.push({ kind: 'line', role: 'grid-major', clip: 'plane', x1: area.x, y1: y, x2: area.x + area.w, y2: y, style: LINES.gridMajor });
    items.push({ kind: 'text', role: 'tick-y', x: area.x - 5, y, text: t.label ?? '', anchor: 'end', baseline: 'middle', size: FONT_SIZE - 1, fill: PALETTE.ink });
  }
  const ox = px(0), oy = py(0);
  items.push({ kind: 'line', role: 'axis-real', clip: 'plane', x1: area.x, y1: oy, x2: area.x + area.w, y2: oy, style: LINES.axis });
  items.push({ kind: 'line', role: 'axis-imag', clip: 'plane', x1: ox, y1: area.y, x2: ox, y2: area.y + area.h, style: LINES.axis });
  items.push(...qRays(ox, oy, Math.hypot(area.w, area.h), Math.min(area.w, area.h) * 0.4));
  return {
    kind: 'linear', furniture: items, caption: 'Linear view: σ/2π across, ω/2π up, equal scales.',
    map: (re, im) => [px(re / TWO_PI), py(im / TWO_PI)],
  };
}

/** Signed-log (log-polar) view: rings at decades of |s|/2π. */
export function signedLogView(area: Rect, pts: [number, number][]): SplaneView {
  const mags = pts.map(([re, im]) => Math.hypot(re, im) / TWO_PI).filter((m) => m > 0 && Number.isFinite(m));
  const lo = mags.length ? Math.min(...mags) : 1, hi = mags.length ? Math.max(...mags) : 1e3;
  const e0 = Math.floor(Math.log10(lo) + 1e-9) - 1, e1 = Math.max(Math.ceil(Math.log10(hi) - 1e-9), e0 + 2);
  const r0 = 10 ** e0, decades = e1 - e0;
  const rhp = pts.some(([re]) => re > 0);
  // only the left half-plane in use: put the centre right of middle and give the LHP the room
  const cx = area.x + (rhp ? area.w / 2 : area.w * 0.82);
  const cy = area.y + area.h / 2;
  const room = Math.min(Math.max(cx - area.x, area.x + area.w - cx) - 6, area.h / 2 - 6);
  const ppd = room / decades; // pixels per decade
  const radius = (mHz: number) => (mHz <= r0 ? 0 : Math.log10(mHz / r0) * ppd);
  const items: SceneItem[] = [];
  items.push({ kind: 'circle', role: 'centre-disc', clip: 'plane', cx, cy, r: 3, style: { fill: PALETTE.gridMajor } });
  for (const t of logTicks(r0, 10 ** e1, 'Hz', 6, 4)) {
    const r = radius(t.value);
    if (r <= 0) continue;
    items.push({ kind: 'circle', role: t.major ? 'ring-major' : 'ring-minor', clip: 'plane', cx, cy, r, style: { ...(t.major ? LINES.gridMajor : LINES.gridMinor), fill: 'none' } });
    if (t.label) items.push({ kind: 'text', role: 'ring-label', clip: 'plane', x: cx - r, y: cy + 3, text: t.label, anchor: 'middle', baseline: 'hanging', size: FONT_SIZE - 2, fill: PALETTE.inkSoft });
  }
  items.push({ kind: 'line', role: 'axis-real', clip: 'plane', x1: area.x, y1: cy, x2: area.x + area.w, y2: cy, style: LINES.axis });
  items.push({ kind: 'line', role: 'axis-imag', clip: 'plane', x1: cx, y1: area.y, x2: cx, y2: area.y + area.h, style: LINES.axis });
  items.push(...qRays(cx, cy, room + ppd, room * 0.92));
  return {
    kind: 'signed-log', furniture: items,
    caption: `Signed-log view: radius log |s|/2π (rings per decade, centre < ${formatSi(r0, 'Hz', { trim: true })}), angle as in the s-plane.`,
    map: (re, im) => {
      const r = radius(Math.hypot(re, im) / TWO_PI);
      const th = Math.atan2(im, re);
      return [cx + r * Math.cos(th), cy - r * Math.sin(th)];
    },
  };
}

function qRays(ox: number, oy: number, len: number, labelAt: number): SceneItem[] {
  const out: SceneItem[] = [];
  for (const q of Q_RAYS) {
    const a = Math.acos(1 / (2 * q)); // from the negative real axis
    for (const sgn of [1, -1]) {
      const x = ox - len * Math.cos(a), y = oy - sgn * len * Math.sin(a);
      out.push({ kind: 'line', role: 'q-ray', clip: 'plane', x1: ox, y1: oy, x2: x, y2: y, style: LINES.reference });
    }
    const lx = ox - labelAt * Math.cos(a), ly = oy - labelAt * Math.sin(a);
    out.push({ kind: 'text', role: 'q-label', clip: 'plane', x: lx, y: ly - 4, text: `Q ${Number(q.toPrecision(2))}`, anchor: 'end', baseline: 'auto', size: FONT_SIZE - 2, fill: PALETTE.inkSoft });
  }
  return out;
}

/** "−1.00 kHz + j2.00 kHz" for a root in rad/s, shown as s/2π. */
export function formatRoot(re: number, im: number): string {
  const r = formatSi(re / TWO_PI, 'Hz');
  if (im === 0) return r;
  return `${r} ${im < 0 ? MINUS : '+'} j${formatSi(Math.abs(im) / TWO_PI, 'Hz')}`;
}
