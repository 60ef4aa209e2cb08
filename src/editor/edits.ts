// Document edits used by the tools and commands: move with rubber-banding, turn, flip, delete
// (cleaning up wires left hanging), all as plain functions on a mutable document (an immer draft).

import type { DrawingDocument, ItemId, PartId, PartRecord, Point, Rotation, WireId } from '../schematic/document';
import { pointKey, snap } from '../schematic/document';
import { partPins } from '../schematic/kinds';
import { boundsOf, cleanPolyline, distanceToSegment } from './geometry';

type Mover = (p: Point) => Point | null;

/** Re-route a wire whose end points move (`mover` gives the new place of a moved point, null for
 *  a fixed one), keeping every segment horizontal or vertical. Both ends moved alike → the wire
 *  is translated; one end → its neighbour vertex slides along the perpendicular leg, or an elbow
 *  is inserted when the wire is a single segment. */
export function rubberBand(points: Point[], mover: Mover): Point[] {
  const n = points.length;
  if (n < 2) return points;
  const a = mover(points[0]);
  const b = mover(points[n - 1]);
  if (!a && !b) return points;
  if (a && b && a.x - points[0].x === b.x - points[n - 1].x && a.y - points[0].y === b.y - points[n - 1].y) {
    const dx = a.x - points[0].x;
    const dy = a.y - points[0].y;
    return points.map((p) => ({ x: p.x + dx, y: p.y + dy }));
  }
  let pts = points.map((p) => ({ ...p }));
  const moveEnd = (atStart: boolean, to: Point) => {
    const i = atStart ? 0 : pts.length - 1;
    const j = atStart ? 1 : pts.length - 2;
    const horizontal = pts[i].y === pts[j].y;
    if (pts.length === 2) {
      const fixed = pts[j];
      const corner = horizontal ? { x: to.x, y: fixed.y } : { x: fixed.x, y: to.y };
      pts = atStart ? [to, corner, fixed] : [fixed, corner, to];
      return;
    }
    if (horizontal) pts[j].y = to.y;
    else pts[j].x = to.x;
    pts[i] = { ...to };
  };
  if (a) moveEnd(true, a);
  if (b) moveEnd(false, b);
  return cleanPolyline(pts);
}

/** Move the items by (dx, dy); wires attached to moved pins or moved wires follow. */
export function moveItems(doc: DrawingDocument, ids: ReadonlySet<ItemId>, dx: number, dy: number): void {
  if (dx === 0 && dy === 0) return;
  const moved = new Set<string>();
  const movedSegments: [Point, Point][] = [];
  for (const id of ids) {
    const part = doc.parts[id as PartId];
    if (part) for (const pin of partPins(part)) moved.add(pointKey(pin));
    const wire = doc.wires[id as WireId];
    if (wire) {
      wire.points.forEach((p, i) => {
        moved.add(pointKey(p));
        if (i > 0) movedSegments.push([wire.points[i - 1], p]);
      });
    }
  }
  const mover: Mover = (p) =>
    moved.has(pointKey(p)) || movedSegments.some(([s, e]) => distanceToSegment(p, s, e) === 0) ? { x: p.x + dx, y: p.y + dy } : null;
  for (const w of Object.values(doc.wires)) {
    if (ids.has(w.id)) continue;
    const next = rubberBand(w.points, mover);
    if (next !== w.points) w.points = next;
  }
  for (const id of ids) {
    const part = doc.parts[id as PartId];
    if (part) {
      part.x += dx;
      part.y += dy;
    }
    const wire = doc.wires[id as WireId];
    if (wire) wire.points = wire.points.map((p) => ({ x: p.x + dx, y: p.y + dy }));
  }
}

/** Transform about a grid pivot: a quarter turn clockwise (y down) or a mirror in x. */
type PointMap = (p: Point) => Point;

function transformItems(doc: DrawingDocument, ids: ReadonlySet<ItemId>, map: PointMap, orient: (p: PartRecord) => void): void {
  const pinMoves = new Map<string, Point>();
  for (const id of ids) {
    const part = doc.parts[id as PartId];
    if (!part) continue;
    const before = partPins(part);
    const at = map(part);
    part.x = at.x;
    part.y = at.y;
    orient(part);
    const after = partPins(part);
    before.forEach((pin, i) => pinMoves.set(pointKey(pin), { x: after[i].x, y: after[i].y }));
  }
  for (const w of Object.values(doc.wires)) {
    if (ids.has(w.id)) {
      w.points = w.points.map(map);
      continue;
    }
    const next = rubberBand(w.points, (p) => pinMoves.get(pointKey(p)) ?? null);
    if (next !== w.points) w.points = next;
  }
}

/** Set a part's rotation and mirror in place (about its origin); attached wires follow. */
export function reorientPart(doc: DrawingDocument, id: PartId, rotation: Rotation, mirror: boolean): void {
  if (!doc.parts[id]) return;
  transformItems(doc, new Set<ItemId>([id]), (p) => ({ x: p.x, y: p.y }), (part) => {
    part.rotation = rotation;
    part.mirror = mirror;
  });
}

function pivotOf(doc: DrawingDocument, ids: ReadonlySet<ItemId>): Point | null {
  const parts = [...ids].filter((i) => i in doc.parts);
  if (parts.length === 1) {
    const p = doc.parts[parts[0] as PartId];
    return { x: p.x, y: p.y };
  }
  const b = boundsOf(doc, ids);
  return b ? { x: snap(b.x + b.width / 2), y: snap(b.y + b.height / 2) } : null;
}

/** Turn the items a quarter turn clockwise (1) or counter-clockwise (3) about their centre. */
export function turnItems(doc: DrawingDocument, ids: ReadonlySet<ItemId>, quarterTurns: 1 | 3): void {
  const c = pivotOf(doc, ids);
  if (!c) return;
  const map: PointMap = (p) => {
    const x = p.x - c.x;
    const y = p.y - c.y;
    return quarterTurns === 1 ? { x: c.x - y + 0, y: c.y + x + 0 } : { x: c.x + y + 0, y: c.y - x + 0 };
  };
  transformItems(doc, ids, map, (part) => {
    part.rotation = (((part.rotation + quarterTurns * 90) % 360) as Rotation);
  });
}

/** Mirror the items about the vertical line through their centre. For a part with rotation θ,
 *  mirror·rot(θ) = rot(−θ)·mirror, so the rotation is negated and the mirror flag toggled. */
export function flipItems(doc: DrawingDocument, ids: ReadonlySet<ItemId>): void {
  const c = pivotOf(doc, ids);
  if (!c) return;
  transformItems(doc, ids, (p) => ({ x: 2 * c.x - p.x + 0, y: p.y }), (part) => {
    part.rotation = (((360 - part.rotation) % 360) as Rotation);
    part.mirror = !part.mirror;
  });
}

/** Number of distinct things a wire touches: pins on it and other wires meeting it. */
function wireContacts(doc: DrawingDocument, wire: WireId): number {
  const w = doc.wires[wire];
  const onWire = (p: Point) => w.points.some((q, i) => (i === 0 ? q.x === p.x && q.y === p.y : distanceToSegment(p, w.points[i - 1], q) === 0));
  let count = 0;
  for (const part of Object.values(doc.parts)) for (const pin of partPins(part)) if (onWire(pin)) count++;
  for (const other of Object.values(doc.wires)) {
    if (other.id === wire) continue;
    const meets = other.points.some(onWire) || w.points.some((p) => other.points.some((q, i) => (i === 0 ? q.x === p.x && q.y === p.y : distanceToSegment(p, other.points[i - 1], q) === 0)));
    if (meets) count++;
  }
  return count;
}

/** Delete items. Wires that ended on a deleted pin and now touch at most one thing are removed
 *  too; wires that still join other things are kept, and their new open ends are counted so the
 *  caller can tell the user. */
export function deleteItems(doc: DrawingDocument, ids: ReadonlySet<ItemId>): { removedWires: number; openEnds: number } {
  const freed = new Set<string>();
  for (const id of ids) {
    const part = doc.parts[id as PartId];
    if (part) for (const pin of partPins(part)) freed.add(pointKey(pin));
  }
  for (const id of ids) {
    delete doc.parts[id as PartId];
    delete doc.wires[id as WireId];
  }
  let removedWires = 0;
  let openEnds = 0;
  let candidates = Object.values(doc.wires).filter((w) => freed.has(pointKey(w.points[0])) || freed.has(pointKey(w.points[w.points.length - 1])));
  for (let pass = 0; pass < 4 && candidates.length > 0; pass++) {
    const next: typeof candidates = [];
    for (const w of candidates) {
      if (!doc.wires[w.id]) continue;
      if (wireContacts(doc, w.id) <= 1) {
        for (const p of [w.points[0], w.points[w.points.length - 1]]) freed.add(pointKey(p));
        delete doc.wires[w.id];
        removedWires++;
      }
    }
    for (const w of Object.values(doc.wires)) {
      if (freed.has(pointKey(w.points[0])) || freed.has(pointKey(w.points[w.points.length - 1]))) next.push(w);
    }
    if (next.length === candidates.length && next.every((w, i) => w.id === candidates[i].id)) break;
    candidates = next;
  }
  for (const w of Object.values(doc.wires)) {
    for (const p of [w.points[0], w.points[w.points.length - 1]]) {
      if (freed.has(pointKey(p)) && !endTouches(doc, w.id, p)) openEnds++;
    }
  }
  return { removedWires, openEnds };
}

function endTouches(doc: DrawingDocument, wire: WireId, p: Point): boolean {
  for (const part of Object.values(doc.parts)) for (const pin of partPins(part)) if (pin.x === p.x && pin.y === p.y) return true;
  for (const other of Object.values(doc.wires)) {
    if (other.id === wire) continue;
    if (other.points.some((q, i) => (i === 0 ? q.x === p.x && q.y === p.y : distanceToSegment(p, other.points[i - 1], q) === 0))) return true;
  }
  return false;
}
