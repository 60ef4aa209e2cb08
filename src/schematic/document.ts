// The drawing document: plain, versioned JSON records with typed ids. Selection, camera and hover
// are NOT part of it (they live in the editor). World coordinates: x to the right, y DOWN, in
// drawing units; the snapping grid is GRID = 10 units and every pin lands on it.

export const DRAWING_FORMAT = 'polesketch-drawing';
/** Current format version; older versions are migrated on load (see file.ts). */
export const DRAWING_VERSION = 1;
export const GRID = 10;

export type PartId = `part:${string}`;
export type WireId = `wire:${string}`;
export type ItemId = PartId | WireId;

export interface Point {
  x: number;
  y: number;
}

/** Symbol kinds of the drawing (one JSON file each under symbols/). Some map to an engine part,
 *  others only shape connectivity (ground, supply, netLabel) or the analysis (input, output). */
export type SymbolKind =
  | 'resistor'
  | 'capacitor'
  | 'inductor'
  | 'ground'
  | 'supply'
  | 'nmos'
  | 'pmos'
  | 'npn'
  | 'pnp'
  | 'vccs'
  | 'vcvs'
  | 'amplifier'
  | 'vsource'
  | 'isource'
  | 'input'
  | 'output'
  | 'netLabel';

/** Quarter turns, clockwise on screen (y down). */
export type Rotation = 0 | 90 | 180 | 270;

/** How a MOSFET's bulk is handled: a visible pin to wire, or hidden and tied to the source or
 *  to the rail (the rail is AC ground in the small-signal model). */
export type BulkTie = 'pin' | 'source' | 'rail';

/** Which parameter set of a transistor is used: bias point (id, gm/Id or Vov, W, L / ic, beta…)
 *  or direct small-signal values (gm, gds, caps…). */
export type ParamMode = 'bias' | 'direct';

export interface PartRecord {
  id: PartId;
  kind: SymbolKind;
  /** Reference designator shown on the drawing and used as the engine part name (R1, M3 …).
   *  For netLabel / supply it is only an id; the net name is params.net. */
  ref: string;
  /** Position of the symbol origin (on the grid). */
  x: number;
  y: number;
  rotation: Rotation;
  /** Mirror about the symbol's vertical axis, applied BEFORE the rotation. */
  mirror: boolean;
  /** Parameter texts exactly as typed (SI prefixes and units allowed, e.g. "4.7k", "2 pF").
   *  Kept even when invalid, so a bad value is shown and explained, never dropped. */
  params: Record<string, string>;
  /** nmos / pmos only; default 'source'. */
  bulk?: BulkTie;
  /** nmos / pmos / npn / pnp only; default 'bias'. */
  mode?: ParamMode;
  /** vsource / isource only: this source drives the analysis (Netlist.input). */
  isInput?: boolean;
  /** The tidy layout leaves this part where it is (src/layout/model.ts isPinned). */
  pinned?: boolean;
}

/** An orthogonal polyline (each segment horizontal or vertical), points on the grid.
 *  A wire connects where one of its END points lies on a pin, on a vertex of another wire or on
 *  the inside of another wire's segment (T-junction). Wires that merely cross do not connect. */
export interface WireRecord {
  id: WireId;
  points: Point[];
}

export interface DrawingDocument {
  format: typeof DRAWING_FORMAT;
  version: typeof DRAWING_VERSION;
  title?: string;
  /** Process card name for bias-mode MOSFETs (engine built-in set); default the demo card. */
  process?: string;
  parts: Record<PartId, PartRecord>;
  wires: Record<WireId, WireRecord>;
  /** Free text notes about the drawing (not analysed). */
  notes?: string;
}

export function emptyDocument(title?: string): DrawingDocument {
  const doc: DrawingDocument = { format: DRAWING_FORMAT, version: DRAWING_VERSION, parts: {}, wires: {} };
  if (title !== undefined) doc.title = title;
  return doc;
}

export function isPartId(id: string): id is PartId {
  return id.startsWith('part:');
}
export function isWireId(id: string): id is WireId {
  return id.startsWith('wire:');
}

/** A fresh id not present in `taken`: deterministic (counter based) so tests and files are stable. */
export function freshId<P extends 'part' | 'wire'>(
  prefix: P,
  taken: Record<string, unknown>,
  hint?: string,
): `${P}:${string}` {
  const base = hint ? hint.toLowerCase().replace(/[^a-z0-9_]+/g, '') || prefix : prefix === 'part' ? 'p' : 'w';
  let n = 1;
  for (;;) {
    const id = `${prefix}:${base}${n}` as `${P}:${string}`;
    if (!(id in taken)) return id;
    n += 1;
  }
}

export function snap(v: number, grid = GRID): number {
  const s = Math.round(v / grid) * grid;
  return s === 0 ? 0 : s; // avoid -0 in saved files
}
export function snapPoint(p: Point, grid = GRID): Point {
  return { x: snap(p.x, grid), y: snap(p.y, grid) };
}
export function samePoint(a: Point, b: Point): boolean {
  return a.x === b.x && a.y === b.y;
}
export function pointKey(p: Point): string {
  return `${p.x},${p.y}`;
}

/** A pin of a placed part, by part id and symbol pin name. */
export interface PinRef {
  part: PartId;
  pin: string;
}
export function pinKey(ref: PinRef): string {
  return `${ref.part}#${ref.pin}`;
}
