// Saving and opening drawings: our own versioned JSON schema (format 'polesketch-drawing').
// Opening runs numbered migrations up to the current version and validates every record; a file
// from a newer version or a broken file is refused with a message naming the problem, so the
// caller can keep the current drawing.

import type { DrawingDocument, PartRecord, Point, Rotation, WireRecord } from './document';
import { DRAWING_FORMAT, DRAWING_VERSION, isPartId, isWireId } from './document';
import { isSymbolKind } from './symbols';

export type LoadResult =
  | { ok: true; doc: DrawingDocument; migratedFrom?: number }
  | { ok: false; reason: string };

/** Migration n turns a version-n document into a version-(n+1) one. Empty while the format is
 *  at version 1; add entries here (never edit old ones) when the format changes. */
export type Migration = (doc: Record<string, unknown>) => Record<string, unknown>;
export const MIGRATIONS: Readonly<Record<number, Migration>> = {};

export function runMigrations(
  json: Record<string, unknown>,
  from: number,
  to: number,
  table: Readonly<Record<number, Migration>> = MIGRATIONS,
): { ok: true; doc: Record<string, unknown> } | { ok: false; reason: string } {
  let doc = json;
  for (let v = from; v < to; v++) {
    const step = table[v];
    if (!step) return { ok: false, reason: `No migration from drawing version ${v} to ${v + 1}.` };
    doc = { ...step(doc), version: v + 1 };
  }
  return { ok: true, doc };
}

/** Text of a saved drawing (stable: parts and wires sorted by id). */
export function saveDrawing(doc: DrawingDocument): string {
  const sortById = <T extends { id: string }>(rec: Record<string, T>) =>
    Object.fromEntries(Object.values(rec).sort((a, b) => (a.id < b.id ? -1 : 1)).map((r) => [r.id, r]));
  const out: Record<string, unknown> = { format: DRAWING_FORMAT, version: DRAWING_VERSION };
  if (doc.title !== undefined) out.title = doc.title;
  if (doc.process !== undefined) out.process = doc.process;
  if (doc.notes !== undefined) out.notes = doc.notes;
  out.parts = sortById(doc.parts);
  out.wires = sortById(doc.wires);
  return JSON.stringify(out, null, 2) + '\n';
}

export function loadDrawing(input: string | unknown, versionLimit: number = DRAWING_VERSION, table = MIGRATIONS): LoadResult {
  let json: unknown = input;
  if (typeof input === 'string') {
    try {
      json = JSON.parse(input);
    } catch (e) {
      return { ok: false, reason: jsonProblem(input, e) };
    }
  }
  if (typeof json !== 'object' || json === null || Array.isArray(json)) return { ok: false, reason: 'The file does not hold a drawing (not a JSON object).' };
  const obj = json as Record<string, unknown>;
  if (obj.format === 'polesketch-netlist') return { ok: false, reason: 'This is an engine netlist, not a drawing; it has no positions to draw.' };
  if (obj.format !== DRAWING_FORMAT) return { ok: false, reason: `The file is not a drawing (format is ${JSON.stringify(obj.format)}, expected "${DRAWING_FORMAT}").` };
  const v = obj.version;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 1) return { ok: false, reason: `The drawing version ${JSON.stringify(v)} is not valid.` };
  if (v > versionLimit) {
    return { ok: false, reason: `The drawing was saved by a newer version of the app (format version ${v}); this one reads up to version ${versionLimit}. Nothing was changed.` };
  }
  let migratedFrom: number | undefined;
  let current = obj;
  if (v < versionLimit) {
    const m = runMigrations(obj, v, versionLimit, table);
    if (!m.ok) return m;
    current = m.doc;
    migratedFrom = v;
  }
  const checked = validateDrawing(current);
  if (!checked.ok) return checked;
  return migratedFrom === undefined ? checked : { ...checked, migratedFrom };
}

/** Where a JSON text breaks (line and column from the parser's position), and whether it was
 *  cut off: a truncated save is the common case. */
function jsonProblem(text: string, e: unknown): string {
  const msg = (e as Error).message;
  if (text.trim() === '') return 'The file is empty (there is no drawing in it).';
  const m = /position (\d+)/.exec(msg);
  const at = m ? Number(m[1]) : /end of JSON input/i.test(msg) ? text.length : null;
  if (at === null) return `The file is not valid JSON (${msg}).`;
  const before = text.slice(0, at);
  const line = before.split('\n').length;
  const column = at - before.lastIndexOf('\n');
  const cut = at >= text.trimEnd().length ? '; the text ends too early, the file looks cut off' : '';
  return `The file is not valid JSON at line ${line}, column ${column}${cut} (${msg}).`;
}

const ROTATIONS = new Set([0, 90, 180, 270]);
const finite = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);

function validatePart(key: string, raw: unknown): { ok: true; part: PartRecord } | { ok: false; reason: string } {
  if (typeof raw !== 'object' || raw === null) return { ok: false, reason: `Part ${key} is not an object.` };
  const r = raw as Record<string, unknown>;
  const name = typeof r.ref === 'string' && r.ref ? r.ref : key;
  if (r.id !== key || !isPartId(key)) return { ok: false, reason: `Part ${name}: its id ${JSON.stringify(r.id)} does not match its key ${key} (ids start with "part:").` };
  if (!isSymbolKind(r.kind)) return { ok: false, reason: `Part ${name}: unknown kind ${JSON.stringify(r.kind)}.` };
  if (typeof r.ref !== 'string') return { ok: false, reason: `Part ${key}: field "ref" must be a text.` };
  if (!finite(r.x) || !finite(r.y)) return { ok: false, reason: `Part ${name}: position x, y must be finite numbers.` };
  if (!ROTATIONS.has(r.rotation as number)) return { ok: false, reason: `Part ${name}: rotation must be 0, 90, 180 or 270 (got ${JSON.stringify(r.rotation)}).` };
  if (typeof r.mirror !== 'boolean') return { ok: false, reason: `Part ${name}: field "mirror" must be true or false.` };
  if (typeof r.params !== 'object' || r.params === null || Array.isArray(r.params)) return { ok: false, reason: `Part ${name}: field "params" must be an object.` };
  const params: Record<string, string> = {};
  for (const [k, val] of Object.entries(r.params as Record<string, unknown>)) {
    if (typeof val === 'number' && Number.isFinite(val)) params[k] = String(val);
    else if (typeof val === 'string') params[k] = val;
    else if (typeof val === 'number') return { ok: false, reason: `Part ${name}: parameter "${k}" is a number too large to hold (beyond ±1.8e308).` };
    else return { ok: false, reason: `Part ${name}: parameter "${k}" must be a text or a number.` };
  }
  const part: PartRecord = { id: key, kind: r.kind, ref: r.ref, x: r.x, y: r.y, rotation: r.rotation as Rotation, mirror: r.mirror, params };
  if (r.bulk !== undefined) {
    if (r.bulk !== 'pin' && r.bulk !== 'source' && r.bulk !== 'rail') return { ok: false, reason: `Part ${name}: field "bulk" must be "pin", "source" or "rail".` };
    part.bulk = r.bulk;
  }
  if (r.mode !== undefined) {
    if (r.mode !== 'bias' && r.mode !== 'direct') return { ok: false, reason: `Part ${name}: field "mode" must be "bias" or "direct".` };
    part.mode = r.mode;
  }
  if (r.isInput !== undefined) {
    if (typeof r.isInput !== 'boolean') return { ok: false, reason: `Part ${name}: field "isInput" must be true or false.` };
    part.isInput = r.isInput;
  }
  if (r.pinned !== undefined) {
    if (typeof r.pinned !== 'boolean') return { ok: false, reason: `Part ${name}: field "pinned" must be true or false.` };
    if (r.pinned) part.pinned = true;
  }
  return { ok: true, part };
}

function validateWire(key: string, raw: unknown): { ok: true; wire: WireRecord } | { ok: false; reason: string } {
  if (typeof raw !== 'object' || raw === null) return { ok: false, reason: `Wire ${key} is not an object.` };
  const r = raw as Record<string, unknown>;
  if (r.id !== key || !isWireId(key)) return { ok: false, reason: `Wire ${key}: its id ${JSON.stringify(r.id)} does not match its key (ids start with "wire:").` };
  if (!Array.isArray(r.points) || r.points.length < 2) return { ok: false, reason: `Wire ${key}: needs at least two points.` };
  const points: Point[] = [];
  for (const [i, p] of r.points.entries()) {
    const q = p as Record<string, unknown>;
    if (typeof q !== 'object' || q === null || !finite(q.x) || !finite(q.y)) return { ok: false, reason: `Wire ${key}: point ${i} must have finite x and y.` };
    points.push({ x: q.x, y: q.y });
    if (i > 0) {
      const a = points[i - 1];
      if (a.x !== q.x && a.y !== q.y) return { ok: false, reason: `Wire ${key}: segment ${i} is not horizontal or vertical.` };
    }
  }
  return { ok: true, wire: { id: key, points } };
}

/** Structural check of a (current-version) drawing object, returning a clean copy. */
export function validateDrawing(obj: Record<string, unknown>): LoadResult {
  const doc: DrawingDocument = { format: DRAWING_FORMAT, version: DRAWING_VERSION, parts: {}, wires: {} };
  for (const k of ['title', 'process', 'notes'] as const) {
    if (obj[k] === undefined) continue;
    if (typeof obj[k] !== 'string') return { ok: false, reason: `Field "${k}" must be a text.` };
    doc[k] = obj[k] as string;
  }
  for (const k of ['parts', 'wires'] as const) {
    if (typeof obj[k] !== 'object' || obj[k] === null || Array.isArray(obj[k])) return { ok: false, reason: `Field "${k}" must be an object keyed by id.` };
  }
  for (const [key, raw] of Object.entries(obj.parts as Record<string, unknown>)) {
    const r = checkedOnce(checkedParts, key, raw, validatePart);
    if (!r.ok) return r;
    doc.parts[r.part.id] = r.part;
  }
  for (const [key, raw] of Object.entries(obj.wires as Record<string, unknown>)) {
    const r = checkedOnce(checkedWires, key, raw, validateWire);
    if (!r.ok) return r;
    doc.wires[r.wire.id] = r.wire;
  }
  return { ok: true, doc };
}

// An immutable record (every record of an editor revision is frozen by immer) is checked once:
// its checked copy is kept, frozen, so a new revision of the drawing hands the unchanged records
// on as the same objects, and the caches keyed on records (toNetlist's geometry pieces, the
// canvas symbol items) keep their entries across edits.
const checkedParts = new WeakMap<object, { key: string; result: { ok: true; part: PartRecord } }>();
const checkedWires = new WeakMap<object, { key: string; result: { ok: true; wire: WireRecord } }>();

function checkedOnce<R extends { ok: true }>(
  cache: WeakMap<object, { key: string; result: R }>, key: string, raw: unknown,
  check: (key: string, raw: unknown) => R | { ok: false; reason: string },
): R | { ok: false; reason: string } {
  // a record in the cache was deeply frozen when it went in, and still is
  const hit = typeof raw === 'object' && raw !== null ? cache.get(raw) : undefined;
  if (hit && hit.key === key) return hit.result;
  const frozen = typeof raw === 'object' && raw !== null && isDeepFrozen(raw);
  const r = check(key, raw);
  if (r.ok && frozen) cache.set(raw as object, { key, result: deepFreeze(r) });
  return r;
}

function isDeepFrozen(v: unknown): boolean {
  if (typeof v !== 'object' || v === null) return true;
  if (!Object.isFrozen(v)) return false;
  for (const k in v) if (!isDeepFrozen((v as Record<string, unknown>)[k])) return false;
  return true;
}

function deepFreeze<T>(v: T): T {
  if (typeof v === 'object' && v !== null && !Object.isFrozen(v)) {
    Object.freeze(v);
    for (const k in v) deepFreeze((v as Record<string, unknown>)[k]);
  }
  return v;
}

/** Browser-storage autosave (any object with getItem / setItem, e.g. localStorage). */
export const AUTOSAVE_KEY = 'polesketch.drawing.autosave';

export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
}

export function autosave(store: KeyValueStore, doc: DrawingDocument): { ok: true } | { ok: false; reason: string } {
  try {
    store.setItem(AUTOSAVE_KEY, saveDrawing(doc));
    return { ok: true };
  } catch (e) {
    return { ok: false, reason: `Autosave failed: ${(e as Error).message}` };
  }
}

/** The autosaved drawing, or null when none; a broken one is refused like a file. */
export function restoreAutosave(store: KeyValueStore): LoadResult | null {
  let text: string | null;
  try {
    text = store.getItem(AUTOSAVE_KEY);
  } catch {
    return null;
  }
  return text === null ? null : loadDrawing(text);
}
