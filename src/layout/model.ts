// What the tidy layout works on, read from a drawing: the parts that move (with the box each one
// needs, its pins and the rail stubs that will hang off it), the parts that stay, and the nets as
// lists of pins. Ground and supply symbols are not laid out as nodes: every pin on a rail gets its
// own small rail symbol next to it (supply above, ground below), as schematics usually show them.

import type { DrawingDocument, PartId, PartRecord, Point, Rotation, SymbolKind } from '../schematic/document';
import { GRID, pinKey } from '../schematic/document';
import { computeConnectivity } from '../schematic/connectivity';
import { labelNet } from '../schematic/kinds';
import { placedBounds, placedPins, symbolOf, toWorld, type PinSide, type PlacedPin } from '../schematic/symbols';
import { orientAlign } from '../export/symbolGeometry';
import { placedSymbolOf } from '../canvas/drawSymbol';

export interface Rect { x: number; y: number; width: number; height: number }

/** A rail symbol hung off one pin: the wire from the pin and where the symbol sits. */
export interface RailStub {
  pin: string;
  kind: 'ground' | 'supply';
  /** Rail name of a supply (params.net). */
  rail?: string;
  /** Offsets from the part origin. */
  at: Point;
  rotation: Rotation;
  wire: Point[];
}

export interface LayoutPart {
  id: PartId;
  /** Box around body, pins, stubs and text, relative to the part origin, on the grid. */
  box: Rect;
  pins: PlacedPin[];
  stubs: RailStub[];
}

export interface LayoutNet {
  /** Stable key of the net (its name in the rail-split connectivity). */
  key: string;
  /** Pins of non-rail parts on the net ("part#pin"). */
  pins: string[];
  rail: 'ground' | 'supply' | null;
  railName?: string;
}

export interface LayoutModel {
  moving: LayoutPart[];
  /** Parts that stay where they are (pinned, outside the selection, pinned rail symbols). */
  fixed: PartId[];
  /** Ground / supply symbols that the tidy removes (they come back as stubs). */
  dropped: PartId[];
  nets: LayoutNet[];
  /** pinKey → net key, and wire id → net key, in the rail-split connectivity. */
  netOfPin: Record<string, string>;
  netOfWire: Record<string, string>;
}

export const RAIL_KINDS: ReadonlySet<SymbolKind> = new Set(['ground', 'supply']);
const GROUND_TAG = '__rail:ground';
const SUPPLY_TAG = '__rail:supply:';

/** Connectivity where each rail (ground, each named supply) is its own net, so the tidy can tell
 *  which rail symbol a pin was wired to (the engine sees all of them as node "0"). */
export function railSplitConnectivity(doc: DrawingDocument) {
  const parts: DrawingDocument['parts'] = {};
  for (const p of Object.values(doc.parts)) {
    if (p.kind === 'ground') parts[p.id] = { ...p, kind: 'netLabel', params: { net: GROUND_TAG } };
    else if (p.kind === 'supply') parts[p.id] = { ...p, kind: 'netLabel', params: { net: SUPPLY_TAG + (labelNet(p) ?? 'vdd') } };
    else if (p.kind === 'netLabel' && labelNet(p) === '0') parts[p.id] = { ...p, params: { net: GROUND_TAG } };
    else parts[p.id] = p;
  }
  return computeConnectivity({ ...doc, parts });
}

/** Rounded out to the grid. */
export function gridRect(r: Rect, pad = 0): Rect {
  const x0 = Math.floor((r.x - pad) / GRID) * GRID;
  const y0 = Math.floor((r.y - pad) / GRID) * GRID;
  const x1 = Math.ceil((r.x + r.width + pad) / GRID) * GRID;
  const y1 = Math.ceil((r.y + r.height + pad) / GRID) * GRID;
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

export function unionRect(rs: Rect[]): Rect {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const r of rs) {
    x0 = Math.min(x0, r.x); y0 = Math.min(y0, r.y);
    x1 = Math.max(x1, r.x + r.width); y1 = Math.max(y1, r.y + r.height);
  }
  if (x0 === Infinity) return { x: 0, y: 0, width: 0, height: 0 };
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

const STEP: Record<PinSide, Point> = { left: { x: -1, y: 0 }, right: { x: 1, y: 0 }, top: { x: 0, y: -1 }, bottom: { x: 0, y: 1 } };

/** Where a rail symbol goes for a pin leaving on `side` (offsets from the part origin). */
export function railStub(pin: PlacedPin, kind: 'ground' | 'supply', rail?: string): RailStub {
  const p = { x: pin.x, y: pin.y };
  // Supply symbols point up (rotation 0) and ground symbols down (rotation 0), except on a pin that
  // leaves the other way, where the symbol sits right at the pin, turned over.
  if (pin.side === 'top' || pin.side === 'bottom') {
    const natural = (kind === 'supply') === (pin.side === 'top');
    const rotation: Rotation = natural ? 0 : 180;
    return { pin: pin.name, kind, rail, at: p, rotation, wire: [] };
  }
  const s = STEP[pin.side];
  const end = { x: p.x + 2 * GRID * s.x, y: p.y };
  return { pin: pin.name, kind, rail, at: end, rotation: 0, wire: [p, end] };
}

/** Rough width of a text line in drawing units (labels are drawn at about 8.5 units). */
export function textWidth(text: string, size = 8.5): number {
  return text.length * size * 0.6;
}

function textRect(part: PartRecord): Rect[] {
  const sym = symbolOf(part.kind);
  const out: Rect[] = [];
  const place = (anchor: { x: number; y: number; align: string }, text: string) => {
    if (!text) return;
    const w = textWidth(text);
    const at = toWorld(anchor, part);
    const align = orientAlign(anchor.align as 'start' | 'middle' | 'end', anchor, part.rotation, part.mirror);
    const x = align === 'start' ? at.x : align === 'end' ? at.x - w : at.x - w / 2;
    out.push({ x, y: at.y - 6, width: w, height: 12 });
  };
  const shown = placedSymbolOf(part, sym);
  place(sym.labelAnchor, shown.label ?? '');
  place(sym.valueAnchor, shown.value ?? '');
  return out;
}

/** Box (relative to the part origin) of a part with its stubs. */
export function partBox(part: PartRecord, stubs: RailStub[]): Rect {
  const atOrigin = { ...part, x: 0, y: 0 };
  const rects: Rect[] = [placedBounds(atOrigin), ...textRect(atOrigin)];
  for (const pin of placedPins(atOrigin)) rects.push({ x: pin.x, y: pin.y, width: 0, height: 0 });
  for (const s of stubs) {
    rects.push(placedBounds({ kind: s.kind, x: s.at.x, y: s.at.y, rotation: s.rotation, mirror: false }));
    for (const w of s.wire) rects.push({ x: w.x, y: w.y, width: 0, height: 0 });
  }
  return gridRect(unionRect(rects));
}

export interface ModelOptions {
  /** Parts that must not move. */
  pinned?: Iterable<PartId>;
  /** Lay out only these parts (the rest stays); all parts when absent. */
  scope?: Iterable<PartId>;
}

/** A part the user pinned: the option list, or a `pinned: true` flag on the record. */
export function isPinned(part: PartRecord, pinned: ReadonlySet<PartId>): boolean {
  return pinned.has(part.id) || (part as PartRecord & { pinned?: unknown }).pinned === true;
}

export function buildModel(doc: DrawingDocument, opts: ModelOptions = {}): LayoutModel {
  const pinned = new Set(opts.pinned ?? []);
  const scope = opts.scope ? new Set(opts.scope) : null;
  const conn = railSplitConnectivity(doc);
  const moving: LayoutPart[] = [];
  const fixed: PartId[] = [];
  const dropped: PartId[] = [];
  const netRail = new Map<string, { rail: 'ground' | 'supply'; name?: string }>();
  for (const n of conn.nets) {
    const lab = n.labels.find((l) => l === GROUND_TAG) ?? n.labels.find((l) => l.startsWith(SUPPLY_TAG));
    if (lab === GROUND_TAG) netRail.set(n.name, { rail: 'ground' });
    else if (lab) netRail.set(n.name, { rail: 'supply', name: lab.slice(SUPPLY_TAG.length) });
  }
  const sorted = Object.values(doc.parts).sort((a, b) => (a.ref < b.ref ? -1 : a.ref > b.ref ? 1 : a.id < b.id ? -1 : 1));
  for (const part of sorted) {
    const inScope = !scope || scope.has(part.id);
    if (!inScope || isPinned(part, pinned)) { fixed.push(part.id); continue; }
    if (RAIL_KINDS.has(part.kind)) { dropped.push(part.id); continue; }
    const pins = placedPins({ ...part, x: 0, y: 0 });
    const stubs: RailStub[] = [];
    for (const pin of pins) {
      const rail = netRail.get(conn.netOfPin[pinKey({ part: part.id, pin: pin.name })]);
      if (rail) stubs.push(railStub(pin, rail.rail, rail.name));
    }
    moving.push({ id: part.id, box: partBox(part, stubs), pins, stubs });
  }
  const nets: LayoutNet[] = [];
  for (const n of conn.nets) {
    const pins = n.pins.filter((p) => !RAIL_KINDS.has(doc.parts[p.part].kind)).map((p) => pinKey(p));
    const r = netRail.get(n.name);
    nets.push({ key: n.name, pins, rail: r?.rail ?? null, railName: r?.name });
  }
  return { moving, fixed, dropped, nets, netOfPin: conn.netOfPin, netOfWire: conn.netOfWire };
}
