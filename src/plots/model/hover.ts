// Hover read-out: cursor → nearest sample of a track, and the scene items that show it (dots on the
// curves and a read-out box). Marker tracks ('xy') are tried first so a pole or a margin mark wins
// over the curve under it.
import type { HoverPoint, Scene, SceneItem } from './scene';
import { nearestIndex, FONT_SIZE } from './frame';
import { PALETTE } from './palette';

export interface HoverHit {
  track: string;
  index: number;
  point: HoverPoint;
}

const inside = (r: { x: number; y: number; w: number; h: number }, x: number, y: number) =>
  x >= r.x && x <= r.x + r.w && y >= r.y && y <= r.y + r.h;

export function hoverAt(scene: Scene, x: number, y: number): HoverHit | null {
  const order = [...scene.hover.filter((t) => t.mode === 'xy'), ...scene.hover.filter((t) => t.mode === 'x')];
  for (const t of order) {
    if (!inside(t.area, x, y) || t.points.length === 0) continue;
    if (t.mode === 'x') {
      const i = nearestIndex(t.points.map((p) => p.x), x);
      return { track: t.id, index: i, point: t.points[i] };
    }
    let best = -1, bestD = (t.radius ?? 10) ** 2;
    t.points.forEach((p, i) => {
      const d = (p.x - x) ** 2 + (p.y - y) ** 2;
      if (d <= bestD) { bestD = d; best = i; }
    });
    if (best >= 0) return { track: t.id, index: best, point: t.points[best] };
  }
  return null;
}

const LINE_H = FONT_SIZE + 4;

/** Dots and a read-out box for a hit, placed inside the scene next to the cursor. */
export function readoutItems(scene: Scene, hit: HoverHit): SceneItem[] {
  const p = hit.point;
  const out: SceneItem[] = [];
  for (const [dx, dy] of p.dots) out.push({ kind: 'marker', role: 'hover-dot', shape: 'dot', x: dx, y: dy, size: 8, style: { fill: PALETTE.ink, stroke: PALETTE.background, width: 1 } });
  if (p.dots.length) {
    const ys = p.dots.map((d) => d[1]);
    out.push({ kind: 'line', role: 'hover-guide', x1: p.x, y1: Math.min(...ys), x2: p.x, y2: Math.max(...ys), style: { stroke: PALETTE.inkSoft, width: 1, dash: '2 2' } });
  }
  const wBox = Math.max(...p.lines.map((l) => l.length)) * FONT_SIZE * 0.58 + 12;
  const hBox = p.lines.length * LINE_H + 8;
  let bx = p.x + 12, by = (p.dots[0]?.[1] ?? p.y) + 10;
  if (bx + wBox > scene.width - 2) bx = p.x - 12 - wBox;
  if (by + hBox > scene.height - 2) by = scene.height - 2 - hBox;
  bx = Math.max(2, bx); by = Math.max(2, by);
  out.push({ kind: 'rect', role: 'readout-box', x: bx, y: by, w: wBox, h: hBox, style: { fill: PALETTE.readoutFill, stroke: PALETTE.inkSoft, width: 1, opacity: 0.95 } });
  p.lines.forEach((text, i) => {
    out.push({ kind: 'text', role: 'readout', x: bx + 6, y: by + 4 + i * LINE_H, text, anchor: 'start', baseline: 'hanging', size: FONT_SIZE, fill: PALETTE.ink });
  });
  return out;
}
