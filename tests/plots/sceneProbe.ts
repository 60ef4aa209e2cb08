// Test helpers: read a scene back through its drawn tick labels, so checks compare pixels with
// what a reader of the plot would read off its axes (not with the model's own scale objects).
import type { Scene, SceneItem } from '../../src/plots/model/scene';

export type Item<K extends SceneItem['kind']> = Extract<SceneItem, { kind: K }>;

export const byRole = <K extends SceneItem['kind']>(s: Scene, kind: K, role: string): Item<K>[] =>
  s.items.filter((i) => i.kind === kind && i.role === role) as Item<K>[];

export const num = (label: string) => Number(label.replace('\u2212', '-'));

/** Tick labels of one panel (by clip id), as [value, pixel] pairs. */
export function ticks(s: Scene, axis: 'x' | 'y', panel: string): { text: string; px: number }[] {
  const c = s.clips.find((k) => k.id === panel)!;
  return byRole(s, 'text', `tick-${axis}`)
    .filter((t) => (axis === 'x' ? t.x >= c.x - 1 && t.x <= c.x + c.w + 1 && t.y >= c.y + c.h - 1 && t.y <= c.y + c.h + 8 : t.y >= c.y - 1 && t.y <= c.y + c.h + 1))
    .map((t) => ({ text: t.text, px: axis === 'x' ? t.x : t.y }));
}

/** Pixel of a value on a linear axis, interpolated between the two outermost numeric tick labels. */
export function linearPx(s: Scene, axis: 'x' | 'y', panel: string, v: number): number {
  const tk = ticks(s, axis, panel).map((t) => ({ v: num(t.text), px: t.px })).filter((t) => Number.isFinite(t.v));
  const a = tk[0], b = tk[tk.length - 1];
  return a.px + ((v - a.v) * (b.px - a.px)) / (b.v - a.v);
}

/** Pixel of a labelled tick (e.g. "1 kHz"). */
export function tickPx(s: Scene, axis: 'x' | 'y', panel: string, text: string): number {
  const t = ticks(s, axis, panel).find((k) => k.text === text);
  if (!t) throw new Error(`no ${axis} tick "${text}" in panel ${panel}: ${ticks(s, axis, panel).map((k) => k.text).join(', ')}`);
  return t.px;
}

/** x where a polyline (runs) first crosses the horizontal line at pixel y, linearly interpolated. */
export function crossingX(runs: number[][], y: number): number | null {
  for (const r of runs) {
    for (let i = 0; i + 3 < r.length; i += 2) {
      const y0 = r[i + 1], y1 = r[i + 3];
      if ((y0 - y) * (y1 - y) <= 0 && y0 !== y1) return r[i] + ((y - y0) * (r[i + 2] - r[i])) / (y1 - y0);
    }
  }
  return null;
}

/** y of a polyline at pixel x (linear interpolation). */
export function yAtX(runs: number[][], x: number): number | null {
  for (const r of runs) {
    for (let i = 0; i + 3 < r.length; i += 2) {
      if (r[i] <= x && x <= r[i + 2]) return r[i + 1] + ((x - r[i]) * (r[i + 3] - r[i + 1])) / (r[i + 2] - r[i] || 1);
    }
  }
  return null;
}

export function logGrid(f0: number, f1: number, perDecade: number): number[] {
  const n = Math.round(Math.log10(f1 / f0) * perDecade);
  return Array.from({ length: n + 1 }, (_, i) => f0 * 10 ** (i / perDecade));
}
