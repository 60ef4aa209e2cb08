// The plain scene every plot model returns: pixel coordinates, styles and hover tracks. The SVG
// string serialiser and the React components both draw from this one description.

export interface Style {
  stroke?: string;
  fill?: string;
  width?: number;
  /** SVG dash array, e.g. "6 3". */
  dash?: string;
  opacity?: number;
}

export type MarkerShape = 'cross' | 'plus' | 'circle' | 'square' | 'triangle' | 'diamond' | 'dot';

interface Base {
  /** What the item shows (e.g. 'curve-mag', 'grid-major', 'pole'); used for CSS classes and tests. */
  role: string;
  /** Id of a clip rectangle of the scene. */
  clip?: string;
}

export type SceneItem =
  | (Base & { kind: 'path'; runs: number[][]; closed?: boolean; style: Style })
  | (Base & { kind: 'line'; x1: number; y1: number; x2: number; y2: number; style: Style })
  | (Base & { kind: 'rect'; x: number; y: number; w: number; h: number; style: Style })
  | (Base & { kind: 'circle'; cx: number; cy: number; r: number; style: Style })
  | (Base & { kind: 'marker'; shape: MarkerShape; x: number; y: number; size: number; style: Style; title?: string })
  | (Base & {
      kind: 'text'; x: number; y: number; text: string; anchor: 'start' | 'middle' | 'end';
      baseline?: 'auto' | 'middle' | 'hanging'; size: number; fill: string; weight?: 'normal' | 'bold'; rotate?: number;
    });

export interface Rect { x: number; y: number; w: number; h: number }

export interface HoverPoint {
  /** Pixel position that the cursor is matched against. */
  x: number;
  y: number;
  /** Dots to draw on the curves for this sample. */
  dots: [number, number][];
  /** Read-out lines, e.g. ["f = 1.00 kHz", "|H| = −3.01 dB"]. */
  lines: string[];
}

export interface HoverTrack {
  id: string;
  /** 'x': nearest sample in x (curves); 'xy': nearest point within `radius` (markers). */
  mode: 'x' | 'xy';
  area: Rect;
  radius?: number;
  /** For mode 'x', sorted by x. */
  points: HoverPoint[];
}

export interface Scene {
  width: number;
  height: number;
  title: string;
  /** Accessible description; says the figures are linear small-signal estimates. */
  description: string;
  background: string;
  clips: (Rect & { id: string })[];
  items: SceneItem[];
  hover: HoverTrack[];
  /** Plain-words notes (what could not be drawn, and why). Also drawn as text items. */
  notes: string[];
}

export const SMALL_SIGNAL_NOTE = 'Linear small-signal estimate.';

/** Flat [x0, y0, x1, y1, …] runs → SVG path data (2-decimal coordinates). */
export function pathData(runs: number[][], closed = false): string {
  const parts: string[] = [];
  for (const run of runs) {
    if (run.length < 2) continue;
    let d = `M${r2(run[0])} ${r2(run[1])}`;
    for (let i = 2; i + 1 < run.length; i += 2) d += `L${r2(run[i])} ${r2(run[i + 1])}`;
    parts.push(closed ? d + 'Z' : d);
  }
  return parts.join('');
}

export const r2 = (v: number) => Math.round(v * 100) / 100;

/** Outline of a marker centred at (x, y) with half-size s, as path data. */
export function markerPath(shape: MarkerShape, x: number, y: number, s: number): string {
  switch (shape) {
    case 'cross': return pathData([[x - s, y - s, x + s, y + s], [x - s, y + s, x + s, y - s]]);
    case 'plus': return pathData([[x - s, y, x + s, y], [x, y - s, x, y + s]]);
    case 'square': return pathData([[x - s, y - s, x + s, y - s, x + s, y + s, x - s, y + s]], true);
    case 'triangle': return pathData([[x, y - s, x + s, y + s * 0.8, x - s, y + s * 0.8]], true);
    case 'diamond': return pathData([[x, y - s, x + s, y, x, y + s, x - s, y]], true);
    case 'circle':
    case 'dot': {
      const r = shape === 'dot' ? s / 2 : s;
      return `M${r2(x - r)} ${r2(y)}A${r2(r)} ${r2(r)} 0 1 0 ${r2(x + r)} ${r2(y)}A${r2(r)} ${r2(r)} 0 1 0 ${r2(x - r)} ${r2(y)}Z`;
    }
  }
}

/** Arrow from (x1, y1) to (x2, y2): shaft runs and a closed head, as two path items' runs. */
export function arrowRuns(x1: number, y1: number, x2: number, y2: number, head = 7): { shaft: number[][]; head: number[][] } {
  const len = Math.hypot(x2 - x1, y2 - y1);
  if (len < 1e-9) return { shaft: [], head: [] };
  const ux = (x2 - x1) / len, uy = (y2 - y1) / len;
  const h = Math.min(head, len * 0.6);
  const bx = x2 - ux * h, by = y2 - uy * h;
  return {
    shaft: [[x1, y1, bx, by]],
    head: [[x2, y2, bx - uy * h * 0.45, by + ux * h * 0.45, bx + uy * h * 0.45, by - ux * h * 0.45]],
  };
}
