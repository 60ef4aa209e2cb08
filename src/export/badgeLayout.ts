// Badge boxes kept clear of the symbols: every badge gets a world box near its anchor that hits no
// symbol body (placedBounds, with a small margin) and no other badge, preferring spots close to
// the anchor and off the parts' text and the wires. Greedy in a fixed order (slowest node first,
// then by position), so the result is deterministic. Pure TS: annotate() places the badges here
// and both the SVG export and the canvas overlay draw the boxes it returns.
// Obstacles sit in a uniform grid of buckets (BoxGrid below), so a candidate spot is scored against
// the few boxes near it instead of all of them; the overlap sums run in obstacle order, so the
// figures (and the chosen spots) are those of the all-pairs sums.
import type { DrawingDocument, Point } from '../schematic/document';
import { badgeSize } from './annotations';
import { placedBounds, symbolOf, toWorld } from '../schematic/symbols';

export interface Box { x: number; y: number; width: number; height: number }

export const BODY_MARGIN = 2;
const DISTANCES = [6, 12, 20, 32, 48, 70];

export const boxArea = (a: Box, b: Box) =>
  Math.max(0, Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x)) * Math.max(0, Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y));

/** Symbol bodies (hard obstacles) and their reference/value text (soft), in world units. */
export function symbolObstacles(doc: DrawingDocument): { bodies: (Box & { ref: string })[]; texts: Box[] } {
  const bodies: (Box & { ref: string })[] = [];
  const texts: Box[] = [];
  for (const p of Object.values(doc.parts)) {
    const b = placedBounds(p);
    bodies.push({ ref: p.ref, x: b.x - BODY_MARGIN, y: b.y - BODY_MARGIN, width: b.width + 2 * BODY_MARGIN, height: b.height + 2 * BODY_MARGIN });
    const sym = symbolOf(p.kind);
    for (const a of [sym.labelAnchor, sym.valueAnchor]) {
      const w = toWorld({ x: a.x, y: a.y }, p);
      texts.push({ x: w.x - 30, y: w.y - 6, width: 60, height: 12 });
    }
  }
  return { bodies, texts };
}

// A uniform grid of buckets over boxes (the spatial hash of collision detection, e.g. Ericson,
// Real-Time Collision Detection, 2005, ch. 7): overlapSum(q) is Σ boxArea(q, box) over the stored
// boxes, visiting only the buckets q covers; it sums in insertion order over the boxes that
// overlap, so it equals the all-pairs sum exactly (the left-out terms are +0). Boxes spanning
// very many buckets (or with non-finite corners) sit in a list every query visits.
export const GRID_CELL = 48;
const MAX_CELLS_PER_BOX = 256;

interface CellRange { x0: number; x1: number; y0: number; y1: number }

function cellsOf(b: Box): CellRange | null {
  const x0 = Math.floor(b.x / GRID_CELL), x1 = Math.floor((b.x + b.width) / GRID_CELL);
  const y0 = Math.floor(b.y / GRID_CELL), y1 = Math.floor((b.y + b.height) / GRID_CELL);
  if (![x0, x1, y0, y1].every(Number.isFinite)) return null;
  if ((x1 - x0 + 1) * (y1 - y0 + 1) > MAX_CELLS_PER_BOX) return null;
  return { x0, x1, y0, y1 };
}

// Two integers → one Map key; a collision would only add a box to a query's list (its overlap
// is then computed, so the sum stays right).
const cellKey = (cx: number, cy: number) => cx * 1_048_576 + cy;

export class BoxGrid {
  private readonly boxes: Box[] = [];
  private readonly buckets = new Map<number, number[]>();
  private readonly wide: number[] = [];
  private seen = new Int32Array(64);
  private hits = new Int32Array(64);
  private stamp = 0;

  constructor(boxes: Box[]) {
    for (const b of boxes) this.add(b);
  }

  get size(): number { return this.boxes.length; }

  add(b: Box): void {
    const i = this.boxes.length;
    this.boxes.push(b);
    if (i >= this.seen.length) {
      const grown = new Int32Array(this.seen.length * 2);
      grown.set(this.seen);
      this.seen = grown;
      this.hits = new Int32Array(grown.length);
    }
    const r = cellsOf(b);
    if (!r) { this.wide.push(i); return; }
    for (let cx = r.x0; cx <= r.x1; cx++) {
      for (let cy = r.y0; cy <= r.y1; cy++) {
        const k = cellKey(cx, cy);
        const list = this.buckets.get(k);
        if (list) list.push(i);
        else this.buckets.set(k, [i]);
      }
    }
  }

  private collect(q: Box, list: readonly number[], count: number, stamp: number): number {
    for (let j = 0; j < list.length; j++) {
      const i = list[j];
      if (this.seen[i] === stamp) continue;
      this.seen[i] = stamp;
      if (boxArea(q, this.boxes[i]) > 0) this.hits[count++] = i;
    }
    return count;
  }

  /** Indices (ascending) of the stored boxes that overlap q with a positive area. */
  overlapping(q: Box): number[] {
    const stamp = ++this.stamp;
    let count = this.collect(q, this.wide, 0, stamp);
    const r = cellsOf(q);
    if (!r) {
      count = 0;
      for (let i = 0; i < this.boxes.length; i++) if (boxArea(q, this.boxes[i]) > 0) this.hits[count++] = i;
    } else {
      for (let cx = r.x0; cx <= r.x1; cx++) {
        for (let cy = r.y0; cy <= r.y1; cy++) {
          const list = this.buckets.get(cellKey(cx, cy));
          if (list) count = this.collect(q, list, count, stamp);
        }
      }
    }
    return Array.from(this.hits.subarray(0, count)).sort((x, y) => x - y);
  }

  /** Σ boxArea(q, box) over the stored boxes (in insertion order, as the all-pairs sum). */
  overlapSum(q: Box): number {
    const idx = this.overlapping(q);
    let s = 0;
    for (let j = 0; j < idx.length; j++) s += boxArea(q, this.boxes[idx[j]]);
    return s;
  }
}

function wireBoxes(doc: DrawingDocument): Box[] {
  const out: Box[] = [];
  for (const w of Object.values(doc.wires)) {
    for (let i = 1; i < w.points.length; i++) {
      const a = w.points[i - 1], b = w.points[i];
      out.push({ x: Math.min(a.x, b.x) - 1.5, y: Math.min(a.y, b.y) - 1.5, width: Math.abs(a.x - b.x) + 3, height: Math.abs(a.y - b.y) + 3 });
    }
  }
  return out;
}

function candidates(anchor: Point, w: number, h: number): Box[] {
  const out: Box[] = [];
  for (const d of DISTANCES) {
    const spots = [
      { x: anchor.x + d, y: anchor.y - d - h }, { x: anchor.x - d - w, y: anchor.y - d - h },
      { x: anchor.x + d, y: anchor.y + d }, { x: anchor.x - d - w, y: anchor.y + d },
      { x: anchor.x - w / 2, y: anchor.y - d - h }, { x: anchor.x - w / 2, y: anchor.y + d },
      { x: anchor.x + d, y: anchor.y - h / 2 }, { x: anchor.x - d - w, y: anchor.y - h / 2 },
    ];
    for (const s of spots) out.push({ ...s, width: w, height: h });
  }
  return out;
}

/** A badge to place: its net, text lines and the point on the net it belongs to. */
export interface BadgeText { net: string; lines: string[]; anchor: Point }

export interface PlacedBadge extends BadgeText {
  box: Box;
  /** Box is far enough from the anchor to need a leader line. */
  leader: boolean;
  /** No spot free of symbols was found (the least covering one is used). */
  crowded: boolean;
}

/** Place every badge; `first` nets are placed before the others (e.g. the slowest node);
 *  `avoid` are further boxes to keep clear of where the space allows (e.g. the slowest node's label). */
export function layoutBadges<B extends BadgeText>(doc: DrawingDocument, badges: B[], first: string[] = [], avoid: Box[] = []): (B & PlacedBadge)[] {
  const symbols = symbolObstacles(doc);
  const bodies = new BoxGrid(symbols.bodies);
  const texts = new BoxGrid([...symbols.texts, ...avoid]);
  const wires = new BoxGrid(wireBoxes(doc));
  const placedBoxes = new BoxGrid([]);
  const rank = (b: B) => (first.includes(b.net) ? first.indexOf(b.net) : first.length);
  const order = [...badges].sort((a, b) => rank(a) - rank(b) || a.anchor.y - b.anchor.y || a.anchor.x - b.anchor.x || (a.net < b.net ? -1 : 1));
  const placed: (B & PlacedBadge)[] = [];
  for (const b of order) {
    const { width, height } = badgeSize(b.lines);
    let best: { box: Box; cost: number; hard: number } | null = null;
    for (const [i, c] of candidates(b.anchor, width, height).entries()) {
      const hard = bodies.overlapSum(c) + placedBoxes.overlapSum(c);
      const soft = texts.overlapSum(c) + 0.3 * wires.overlapSum(c);
      const cost = soft + i * 4;
      if (!best || hard < best.hard || (hard === best.hard && cost < best.cost)) best = { box: c, cost, hard };
      if (best.hard === 0 && soft === 0) break;
    }
    const box = best!.box;
    const gap = Math.max(box.x - b.anchor.x, b.anchor.x - (box.x + box.width), box.y - b.anchor.y, b.anchor.y - (box.y + box.height));
    placed.push({ ...b, box, leader: gap > 14, crowded: best!.hard > 0 });
    placedBoxes.add(box);
  }
  const index = new Map(badges.map((b, i) => [b.net, i]));
  return placed.sort((a, b) => index.get(a.net)! - index.get(b.net)!);
}
