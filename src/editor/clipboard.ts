// Copy / paste between tabs: a selection serialised as a small versioned JSON text (put on the
// system clipboard or in localStorage by the UI), parsed back with the drawing validator.

import type { DrawingDocument, ItemId, PartId, PartRecord, Point, WireId, WireRecord } from '../schematic/document';
import { DRAWING_FORMAT, DRAWING_VERSION, freshId, pointKey, snap } from '../schematic/document';
import { distanceToSegment } from './geometry';
import { validateDrawing } from '../schematic/file';
import { nextRef, partPins } from '../schematic/kinds';
import { symbolOf } from '../schematic/symbols';

export const CLIP_FORMAT = 'polesketch-clip';
export const CLIP_STORAGE_KEY = 'polesketch.clipboard';

export interface Clip {
  parts: PartRecord[];
  wires: WireRecord[];
}

/** The selected parts and wires, plus wires running only between selected parts' pins. */
export function clipOf(doc: DrawingDocument, ids: Iterable<ItemId>): Clip {
  const set = new Set(ids);
  const parts = Object.values(doc.parts).filter((p) => set.has(p.id));
  const pinPoints = new Set<string>();
  for (const p of parts) for (const pin of partPins(p)) pinPoints.add(pointKey(pin));
  const wires = Object.values(doc.wires).filter(
    (w) => set.has(w.id) || (pinPoints.has(pointKey(w.points[0])) && pinPoints.has(pointKey(w.points[w.points.length - 1]))),
  );
  return { parts: structuredClone(parts), wires: structuredClone(wires) };
}

export function serializeClip(clip: Clip): string {
  return JSON.stringify({ format: CLIP_FORMAT, version: DRAWING_VERSION, parts: clip.parts, wires: clip.wires });
}

export function parseClip(text: string): { ok: true; clip: Clip } | { ok: false; reason: string } {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    return { ok: false, reason: 'The clipboard does not hold parts of a drawing.' };
  }
  const o = json as Record<string, unknown>;
  if (typeof o !== 'object' || o === null || o.format !== CLIP_FORMAT) return { ok: false, reason: 'The clipboard does not hold parts of a drawing.' };
  if (typeof o.version !== 'number' || o.version > DRAWING_VERSION) return { ok: false, reason: 'The clipboard holds parts from a newer version of the app.' };
  if (!Array.isArray(o.parts) || !Array.isArray(o.wires)) return { ok: false, reason: 'The clipboard data is damaged (parts or wires missing).' };
  const asDrawing = {
    format: DRAWING_FORMAT, version: DRAWING_VERSION,
    parts: Object.fromEntries((o.parts as { id?: unknown }[]).map((p, i) => [typeof p?.id === 'string' ? p.id : `#${i}`, p])),
    wires: Object.fromEntries((o.wires as { id?: unknown }[]).map((w, i) => [typeof w?.id === 'string' ? w.id : `#${i}`, w])),
  };
  const r = validateDrawing(asDrawing);
  if (!r.ok) return { ok: false, reason: `The clipboard data is damaged: ${r.reason}` };
  return { ok: true, clip: { parts: Object.values(r.doc.parts), wires: Object.values(r.doc.wires) } };
}

/** Top-left grid point of a clip (by part positions and wire points). */
export function clipOrigin(clip: Clip): Point {
  let x = Infinity, y = Infinity;
  for (const p of clip.parts) { x = Math.min(x, p.x); y = Math.min(y, p.y); }
  for (const w of clip.wires) for (const p of w.points) { x = Math.min(x, p.x); y = Math.min(y, p.y); }
  return Number.isFinite(x) ? { x: snap(x), y: snap(y) } : { x: 0, y: 0 };
}

/** Insert a clip shifted by (dx, dy) (grid multiples) with fresh ids; references are kept when
 *  free in the target drawing and renumbered otherwise. Returns the new item ids. */
export function insertClip(doc: DrawingDocument, clip: Clip, dx: number, dy: number): ItemId[] {
  const added: ItemId[] = [];
  const newRefs: string[] = [];
  const used = new Set(Object.values(doc.parts).map((p) => p.ref));
  for (const p of clip.parts) {
    const keep = !used.has(p.ref) && !newRefs.includes(p.ref);
    const ref = keep ? p.ref : nextRef(doc, p.kind, newRefs);
    newRefs.push(ref);
    used.add(ref);
    const id = freshId('part', doc.parts, ref) as PartId;
    const copy: PartRecord = { ...structuredClone(p), id, ref, x: p.x + dx, y: p.y + dy };
    if (symbolOf(p.kind).role === 'device' && copy.isInput && Object.values(doc.parts).some((q) => q.isInput)) copy.isInput = false;
    doc.parts[id] = copy;
    added.push(id);
  }
  for (const w of clip.wires) {
    const id = freshId('wire', doc.wires) as WireId;
    doc.wires[id] = { id, points: w.points.map((p) => ({ x: p.x + dx, y: p.y + dy })) };
    added.push(id);
  }
  return added;
}

/** Contact points of a clip shifted by (dx, dy): pins and wire vertices. */
function clipPoints(clip: Clip, dx: number, dy: number): Point[] {
  const pts: Point[] = [];
  for (const p of clip.parts) for (const pin of partPins({ ...p, x: p.x + dx, y: p.y + dy })) pts.push(pin);
  for (const w of clip.wires) for (const q of w.points) pts.push({ x: q.x + dx, y: q.y + dy });
  return pts;
}

/** Would the shifted clip touch the drawing's pins or wires (and so join nets by accident)? */
export function clipTouches(doc: DrawingDocument, clip: Clip, dx: number, dy: number): boolean {
  const pins = new Set<string>();
  for (const p of Object.values(doc.parts)) for (const pin of partPins(p)) pins.add(pointKey(pin));
  const wires = Object.values(doc.wires);
  for (const q of clipPoints(clip, dx, dy)) {
    if (pins.has(pointKey(q))) return true;
    for (const w of wires) for (let i = 1; i < w.points.length; i++) if (distanceToSegment(q, w.points[i - 1], w.points[i]) === 0) return true;
  }
  return false;
}

/** An offset for a duplicate: to the right of the clip, moved on until it touches nothing. */
export function freeOffset(doc: DrawingDocument, clip: Clip): { dx: number; dy: number } {
  let x0 = Infinity, x1 = -Infinity;
  for (const q of clipPoints(clip, 0, 0)) { x0 = Math.min(x0, q.x); x1 = Math.max(x1, q.x); }
  const base = Number.isFinite(x0) ? snap(x1 - x0) + 40 : 20;
  for (let k = 0; k < 50; k++) {
    const dx = base + 10 * k;
    if (!clipTouches(doc, clip, dx, 0)) return { dx, dy: 0 };
  }
  return { dx: base, dy: 0 };
}
