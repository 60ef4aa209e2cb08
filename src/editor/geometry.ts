// Hit-testing, box selection, wire shapes (automatic elbow, clean-up) and drawing bounds.

import type { DrawingDocument, ItemId, PartId, Point, WireRecord } from '../schematic/document';
import { samePoint } from '../schematic/document';
import { hitsPart, partPins } from '../schematic/kinds';
import { placedBounds } from '../schematic/symbols';
import type { HitTarget } from './types';

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

export function distanceToSegment(p: Point, a: Point, b: Point): number {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p.x - a.x) * dx + (p.y - a.y) * dy) / len2));
  return Math.hypot(p.x - (a.x + t * dx), p.y - (a.y + t * dy));
}

export interface HitOptions {
  /** World radius around a pin end (default 4). */
  pinRadius?: number;
  /** World distance to a wire (default 4). */
  wireTolerance?: number;
}

/** What is under a world point: a pin end first, then a wire, then a part body. */
export function hitTest(doc: DrawingDocument, p: Point, opts: HitOptions = {}): HitTarget {
  const pinR = opts.pinRadius ?? 4;
  const wireTol = opts.wireTolerance ?? 4;
  const parts = Object.values(doc.parts);
  let best: { d: number; hit: HitTarget } | null = null;
  for (const part of parts) {
    for (const pin of partPins(part)) {
      const d = Math.hypot(pin.x - p.x, pin.y - p.y);
      if (d <= pinR && (!best || d < best.d)) best = { d, hit: { type: 'pin', part: part.id, pin: pin.name, x: pin.x, y: pin.y } };
    }
  }
  if (best) return best.hit;
  for (const w of Object.values(doc.wires)) {
    for (let i = 1; i < w.points.length; i++) {
      const d = distanceToSegment(p, w.points[i - 1], w.points[i]);
      if (d <= wireTol && (!best || d < best.d)) best = { d, hit: { type: 'wire', wire: w.id, segment: i - 1 } };
    }
  }
  if (best) return best.hit;
  // Topmost (last drawn) part wins.
  for (let i = parts.length - 1; i >= 0; i--) if (hitsPart(parts[i], p)) return { type: 'part', part: parts[i].id };
  return { type: 'none' };
}

export function itemOfHit(hit: HitTarget): ItemId | null {
  if (hit.type === 'part' || hit.type === 'pin') return hit.part;
  if (hit.type === 'wire') return hit.wire;
  return null;
}

const inside = (p: Point, b: Box) => p.x >= b.x && p.x <= b.x + b.width && p.y >= b.y && p.y <= b.y + b.height;

/** Items wholly inside a box: parts by their body, wires by all their points. */
export function itemsInBox(doc: DrawingDocument, box: Box): ItemId[] {
  const out: ItemId[] = [];
  for (const part of Object.values(doc.parts)) {
    const b = placedBounds(part);
    if (inside({ x: b.x, y: b.y }, box) && inside({ x: b.x + b.width, y: b.y + b.height }, box)) out.push(part.id);
  }
  for (const w of Object.values(doc.wires)) if (w.points.every((p) => inside(p, box))) out.push(w.id);
  return out;
}

/** Orthogonal path from a to b with one automatic elbow; horizontal leg first when the pointer
 *  has moved further in x than in y. */
export function elbowPath(a: Point, b: Point, horizontalFirst?: boolean): Point[] {
  if (a.x === b.x || a.y === b.y) return samePoint(a, b) ? [a] : [a, b];
  const hFirst = horizontalFirst ?? Math.abs(b.x - a.x) >= Math.abs(b.y - a.y);
  const corner = hFirst ? { x: b.x, y: a.y } : { x: a.x, y: b.y };
  return [a, corner, b];
}

/** Drop repeated points and points in the middle of a straight run. */
export function cleanPolyline(points: Point[]): Point[] {
  const out: Point[] = [];
  for (const p of points) if (out.length === 0 || !samePoint(out[out.length - 1], p)) out.push({ x: p.x, y: p.y });
  for (let i = out.length - 2; i >= 1; i--) {
    const a = out[i - 1];
    const b = out[i];
    const c = out[i + 1];
    if ((a.x === b.x && b.x === c.x) || (a.y === b.y && b.y === c.y)) out.splice(i, 1);
  }
  return out;
}

export function isOrthogonal(points: Point[]): boolean {
  for (let i = 1; i < points.length; i++) if (points[i].x !== points[i - 1].x && points[i].y !== points[i - 1].y) return false;
  return true;
}

/** Is a point a place where a wire may end and connect: a pin, or on a wire. */
export function isConnectionPoint(doc: DrawingDocument, p: Point, exceptWire?: string): boolean {
  for (const part of Object.values(doc.parts)) for (const pin of partPins(part)) if (pin.x === p.x && pin.y === p.y) return true;
  for (const w of Object.values(doc.wires)) {
    if (w.id === exceptWire) continue;
    for (let i = 1; i < w.points.length; i++) if (distanceToSegment(p, w.points[i - 1], w.points[i]) === 0) return true;
  }
  return false;
}

/** Bounds of the items (parts by body and pins, wires by points); null when none. */
export function boundsOf(doc: DrawingDocument, ids?: Iterable<ItemId>): Box | null {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  const add = (p: Point) => {
    x0 = Math.min(x0, p.x); y0 = Math.min(y0, p.y); x1 = Math.max(x1, p.x); y1 = Math.max(y1, p.y);
  };
  const partIds = ids ? [...ids].filter((i) => i in doc.parts) : Object.keys(doc.parts);
  const wireIds = ids ? [...ids].filter((i) => i in doc.wires) : Object.keys(doc.wires);
  for (const id of partIds) {
    const part = doc.parts[id as PartId];
    const b = placedBounds(part);
    add({ x: b.x, y: b.y });
    add({ x: b.x + b.width, y: b.y + b.height });
    for (const pin of partPins(part)) add(pin);
  }
  for (const id of wireIds) for (const p of (doc.wires[id as keyof typeof doc.wires] as WireRecord).points) add(p);
  if (!Number.isFinite(x0)) return null;
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}
