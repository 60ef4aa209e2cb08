// Drawing → engine netlist (src/engine/types.ts). Part names are the reference designators,
// node names the net names (ground "0"). The netlist is returned only when the drawing has no
// error; the issues say what to fix and where.

import type { Netlist, NetlistPart } from '../engine/types';
import { DEFAULT_PROCESS_NAME } from '../engine/process';
import type { DrawingDocument } from './document';
import { DRAWING_FORMAT, pinKey } from './document';
import { loadDrawing } from './file';
import { computeConnectivity, GROUND_NET, type Connectivity, type NetInfo } from './connectivity';
import { checkDrawing, type DrawingIssue } from './drawingChecks';
import { engineValues } from './kinds';
import { symbolOf } from './symbols';

export interface DrawingNetlist {
  netlist?: Netlist;
  issues: DrawingIssue[];
  /** pinKey(part, pin) → net name. */
  netOfPin: Record<string, string>;
  nets: NetInfo[];
  /** Junction dots of the drawing (three or more conductors meet). */
  junctions: { x: number; y: number }[];
}

/** Does a parsed JSON value look like a saved drawing (as opposed to an engine netlist)? */
export function isDrawing(json: unknown): boolean {
  return typeof json === 'object' && json !== null && (json as { format?: unknown }).format === DRAWING_FORMAT;
}

// Caches (the live overlay converts the drawing on every edit, and the app's panels convert the
// same revision again): a frozen document (every revision the editor makes with immer is one)
// maps to its result by identity; connectivity is kept per geometry key, so an edit that changes
// only values reuses the nets.
const byRevision = new WeakMap<object, DrawingNetlist>();
const CONNECTIVITY_SLOTS = 4;
const connectivitySlots: { key: string; conn: Connectivity }[] = [];

/** Everything computeConnectivity reads: per part its id, ref (net naming order), kind, place,
 *  bulk pin and net label; per wire its points. */
export function geometryKey(doc: DrawingDocument): string {
  if (!isFrozenDoc(doc)) return makeGeometryKey(doc);
  let key = geometryKeys.get(doc);
  if (key === undefined) geometryKeys.set(doc, (key = makeGeometryKey(doc)));
  return key;
}
const geometryKeys = new WeakMap<object, string>();
// Pieces of the key by record identity: an edit (immer) replaces the records it changes only, so
// a new revision rebuilds the key from the cached pieces of the unchanged parts and, when no wire
// changed, of the whole wire map.
const partPieces = new WeakMap<object, string>();
const wirePieces = new WeakMap<object, string>();

const frozenRecord = (r: object & { params?: object }) => Object.isFrozen(r) && (r.params === undefined || Object.isFrozen(r.params));

function makeGeometryKey(doc: DrawingDocument): string {
  const out: string[] = [];
  for (const p of Object.values(doc.parts)) {
    let piece = partPieces.get(p);
    if (piece === undefined) {
      piece = `${p.id}|${p.ref}|${p.kind}|${p.x}|${p.y}|${p.rotation}|${p.mirror ? 1 : 0}|${p.bulk ?? ''}|${p.params?.net ?? ''}`;
      if (frozenRecord(p)) partPieces.set(p, piece);
    }
    out.push(piece);
  }
  out.push('#');
  let wires = wirePieces.get(doc.wires);
  if (wires === undefined) {
    wires = Object.values(doc.wires).map((w) => `${w.id}:${w.points.map((q) => `${q.x},${q.y}`).join(';')}`).join('\n');
    if (isFrozenDoc(doc)) wirePieces.set(doc.wires, wires);
  }
  out.push(wires);
  return out.join('\n');
}

/** computeConnectivity(doc), shared by every document of the same geometry (small LRU). The
 *  result is shared: callers must not change it. */
export function cachedConnectivity(doc: DrawingDocument): Connectivity {
  const key = geometryKey(doc);
  const at = connectivitySlots.findIndex((s) => s.key === key);
  if (at >= 0) {
    const [hit] = connectivitySlots.splice(at, 1);
    connectivitySlots.unshift(hit);
    return hit.conn;
  }
  const conn = computeConnectivity(doc);
  connectivitySlots.unshift({ key, conn });
  connectivitySlots.length = Math.min(connectivitySlots.length, CONNECTIVITY_SLOTS);
  return conn;
}

const isFrozenDoc = (d: unknown): d is DrawingDocument =>
  typeof d === 'object' && d !== null && Object.isFrozen(d) && Object.isFrozen((d as DrawingDocument).parts) && Object.isFrozen((d as DrawingDocument).wires);

/** Accepts a document or unchecked JSON (e.g. a file read by the CLI): it is validated (and
 *  migrated) first, so a broken input gives one 'bad-value' issue with field 'file', never a crash. */
export function documentToNetlist(source: DrawingDocument | unknown): DrawingNetlist {
  if (!isFrozenDoc(source)) return convert(source);
  const known = byRevision.get(source);
  if (known) return known;
  const made = convert(source);
  byRevision.set(source, made);
  return made;
}

function convert(source: DrawingDocument | unknown): DrawingNetlist {
  const loaded = loadDrawing(source);
  if (!loaded.ok) {
    return { issues: [{ severity: 'error', code: 'bad-value', field: 'file', message: loaded.reason, x: 0, y: 0 }], netOfPin: {}, nets: [], junctions: [] };
  }
  const doc = loaded.doc;
  const conn = cachedConnectivity(doc);
  const issues = checkDrawing(doc, conn);
  const base = { issues, netOfPin: conn.netOfPin, nets: conn.nets, junctions: conn.junctions };
  if (issues.some((i) => i.severity === 'error')) return base;

  const parts: NetlistPart[] = [];
  let input: string | undefined;
  let outputNode: string | undefined;
  const sorted = Object.values(doc.parts).sort((a, b) => (a.ref < b.ref ? -1 : a.ref > b.ref ? 1 : 0));
  for (const part of sorted) {
    const sym = symbolOf(part.kind);
    const netOf = (pin: string) => conn.netOfPin[pinKey({ part: part.id, pin })];
    if (sym.role === 'output') {
      outputNode ??= netOf('p');
      continue;
    }
    if (!sym.engine) continue;
    const pins: Record<string, string> = {};
    for (const [symPin, enginePin] of Object.entries(sym.engine.pins)) {
      const net = netOf(symPin);
      if (net !== undefined) pins[enginePin] = net;
    }
    if (sym.role === 'input') pins.n = GROUND_NET;
    if ((part.kind === 'nmos' || part.kind === 'pmos') && part.bulk === 'rail') pins.b = GROUND_NET;
    parts.push({ name: part.ref, kind: sym.engine.kind, pins, values: engineValues(part).values });
    if (sym.role === 'input' || ((part.kind === 'vsource' || part.kind === 'isource') && part.isInput)) input ??= part.ref;
  }

  const netlist: Netlist = { format: 'polesketch-netlist', version: 1, parts };
  if (doc.title) netlist.title = doc.title;
  if (input) netlist.input = input;
  if (outputNode !== undefined) netlist.output = { kind: 'voltage', node: outputNode };
  const needsProcess = sorted.some((p) => (p.kind === 'nmos' || p.kind === 'pmos') && (p.mode ?? 'bias') === 'bias');
  if (doc.process) netlist.process = doc.process;
  else if (needsProcess) netlist.process = DEFAULT_PROCESS_NAME;
  return { ...base, netlist };
}
