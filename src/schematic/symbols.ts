// Symbol data: one JSON file per symbol under symbols/ (format described in symbols/README.md).
// The canvas, the SVG export and the connectivity all read these; nothing else draws a symbol.
// Transform of a placed symbol (local → world): mirror x → −x first, then turn clockwise on
// screen (y down) by the rotation, then translate by the part position.

import type { PartKind } from '../engine/types';
import type { Point, Rotation, SymbolKind } from './document';

import resistor from '../../symbols/resistor.json';
import capacitor from '../../symbols/capacitor.json';
import inductor from '../../symbols/inductor.json';
import ground from '../../symbols/ground.json';
import supply from '../../symbols/supply.json';
import nmos from '../../symbols/nmos.json';
import pmos from '../../symbols/pmos.json';
import npn from '../../symbols/npn.json';
import pnp from '../../symbols/pnp.json';
import vccs from '../../symbols/vccs.json';
import vcvs from '../../symbols/vcvs.json';
import amplifier from '../../symbols/amplifier.json';
import vsource from '../../symbols/vsource.json';
import isource from '../../symbols/isource.json';
import input from '../../symbols/input.json';
import output from '../../symbols/output.json';
import netLabel from '../../symbols/netLabel.json';

export type PinSide = 'left' | 'right' | 'top' | 'bottom';
export type TextAlign = 'start' | 'middle' | 'end';

export interface SymbolPin {
  /** Symbol pin name (engine pin names where the symbol maps to an engine part). */
  name: string;
  /** Local position, a multiple of 10. */
  x: number;
  y: number;
  /** Which side of the body the pin leaves from (before the part transform). */
  side: PinSide;
  /** 'bulk': shown and connected only when the part's bulk is 'pin'. */
  optional?: 'bulk';
}

/** Drawing primitives in local units; stroke only unless `fill` is set. Arc angles in degrees,
 *  measured clockwise on screen from +x, drawn from `start` to `end` clockwise. */
export type Primitive =
  | { type: 'line'; x1: number; y1: number; x2: number; y2: number; optional?: 'bulk' }
  | { type: 'polyline'; points: number[]; closed?: boolean; fill?: boolean; optional?: 'bulk' }
  | { type: 'arc'; cx: number; cy: number; r: number; start: number; end: number }
  | { type: 'circle'; cx: number; cy: number; r: number; fill?: boolean }
  | { type: 'text'; x: number; y: number; text: string; size?: number; align?: TextAlign };

export interface TextAnchor {
  x: number;
  y: number;
  align: TextAlign;
}

export interface SymbolParam {
  /** Key in PartRecord.params and engine value name. */
  name: string;
  label: string;
  /** SI unit symbol for parsing and display ('' for a plain number). */
  unit: string;
  default: string;
  /** Only used in this parameter mode (transistors); absent = always used. */
  mode?: 'bias' | 'direct';
  /** The engine needs this value (bad or empty is an error). */
  required?: boolean;
  /** Plain text (not an SI number), e.g. a net name. */
  text?: boolean;
  /** One of a set of alternatives: exactly one parameter of the group should be given. */
  oneOf?: string;
  /** Short help text shown with the field (e.g. what a blank value means). */
  hint?: string;
}

export type SymbolRole = 'device' | 'ground' | 'supply' | 'netLabel' | 'input' | 'output';

export interface SymbolDef {
  format: 'polesketch-symbol';
  version: 1;
  kind: SymbolKind;
  title: string;
  /** Reference designator prefix (R, C, M, Q …). */
  refPrefix: string;
  role: SymbolRole;
  pins: SymbolPin[];
  primitives: Primitive[];
  /** Local bounding box of the body, used as hit area. */
  bounds: { x: number; y: number; width: number; height: number };
  labelAnchor: TextAnchor;
  valueAnchor: TextAnchor;
  /** Engine part it maps to; pins maps symbol pin → engine pin. null for ground/supply/netLabel/
   *  output (they shape nets) — input maps to a vsource driving the analysis. */
  engine: { kind: PartKind; pins: Record<string, string> } | null;
  params: SymbolParam[];
}

const ALL: SymbolDef[] = [
  resistor, capacitor, inductor, ground, supply, nmos, pmos, npn, pnp, vccs, vcvs, amplifier,
  vsource, isource, input, output, netLabel,
] as unknown as SymbolDef[];

export const SYMBOLS: Readonly<Record<SymbolKind, SymbolDef>> = Object.fromEntries(
  ALL.map((s) => [s.kind, s]),
) as Record<SymbolKind, SymbolDef>;

export const SYMBOL_KINDS: readonly SymbolKind[] = ALL.map((s) => s.kind);

export function symbolOf(kind: SymbolKind): SymbolDef {
  return SYMBOLS[kind];
}

export function isSymbolKind(k: unknown): k is SymbolKind {
  return typeof k === 'string' && Object.prototype.hasOwnProperty.call(SYMBOLS, k);
}

/** Local → world offset for a rotation and mirror (no translation). */
export function orient(p: Point, rotation: Rotation, mirror: boolean): Point {
  const x = mirror ? -p.x : p.x;
  const y = p.y;
  let r: Point;
  switch (rotation) {
    case 90: r = { x: -y, y: x }; break;
    case 180: r = { x: -x, y: -y }; break;
    case 270: r = { x: y, y: -x }; break;
    default: r = { x, y };
  }
  return { x: r.x + 0, y: r.y + 0 }; // +0 turns -0 into 0
}

/** Local → world point for a placed part. */
export function toWorld(p: Point, at: { x: number; y: number; rotation: Rotation; mirror: boolean }): Point {
  const o = orient(p, at.rotation, at.mirror);
  return { x: o.x + at.x, y: o.y + at.y };
}

const SIDE_VECTOR: Record<PinSide, Point> = {
  left: { x: -1, y: 0 }, right: { x: 1, y: 0 }, top: { x: 0, y: -1 }, bottom: { x: 0, y: 1 },
};

/** Side a pin leaves from after rotation and mirror. */
export function orientSide(side: PinSide, rotation: Rotation, mirror: boolean): PinSide {
  const v = orient(SIDE_VECTOR[side], rotation, mirror);
  if (v.x < 0) return 'left';
  if (v.x > 0) return 'right';
  return v.y < 0 ? 'top' : 'bottom';
}

export interface PlacedPin {
  name: string;
  x: number;
  y: number;
  side: PinSide;
}

/** World pin positions of a placed part; the bulk pin only when `bulk === 'pin'`. */
export function placedPins(part: {
  kind: SymbolKind; x: number; y: number; rotation: Rotation; mirror: boolean; bulk?: string;
}): PlacedPin[] {
  const sym = SYMBOLS[part.kind];
  const out: PlacedPin[] = [];
  for (const pin of sym.pins) {
    if (pin.optional === 'bulk' && part.bulk !== 'pin') continue;
    const w = toWorld(pin, part);
    out.push({ name: pin.name, x: w.x, y: w.y, side: orientSide(pin.side, part.rotation, part.mirror) });
  }
  return out;
}

/** World bounding box of a placed part's body. */
export function placedBounds(part: { kind: SymbolKind; x: number; y: number; rotation: Rotation; mirror: boolean }): {
  x: number; y: number; width: number; height: number;
} {
  const b = SYMBOLS[part.kind].bounds;
  const a = toWorld({ x: b.x, y: b.y }, part);
  const c = toWorld({ x: b.x + b.width, y: b.y + b.height }, part);
  const x = Math.min(a.x, c.x);
  const y = Math.min(a.y, c.y);
  return { x, y, width: Math.abs(c.x - a.x), height: Math.abs(c.y - a.y) };
}
