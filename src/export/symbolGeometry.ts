// A placed symbol as plain drawing items in world units, read from the symbol JSON (symbols/*.json
// via src/schematic/symbols.ts). DOM-free: the SVG writer renders these items; the canvas view can
// render the very same list, so there is one reading of the symbol primitives for every output.
// Transform as symbols/README.md: mirror x first, then the clockwise quarter turn, then translate.
// Text stays upright; only its anchor point moves.

import type { Point, Rotation } from '../schematic/document';
import { orient, type Primitive, type SymbolDef, type TextAlign } from '../schematic/symbols';

/** Sample an arc (degrees clockwise on screen from +x, drawn start → end clockwise) as a polyline,
 *  one point per ≤ 10° (the same sampling the canvas uses). */
export function arcPoints(cx: number, cy: number, r: number, start: number, end: number): number[] {
  let sweep = end - start;
  while (sweep <= 0) sweep += 360;
  const steps = Math.max(4, Math.ceil(sweep / 10));
  const pts: number[] = [];
  for (let i = 0; i <= steps; i++) {
    const a = ((start + (sweep * i) / steps) * Math.PI) / 180;
    pts.push(cx + r * Math.cos(a), cy + r * Math.sin(a));
  }
  return pts;
}

/** Alignment of upright text after the part transform: a label that sat to the right of the body
 *  must still read away from the body when the symbol is mirrored or turned. */
export function orientAlign(align: TextAlign, anchor: Point, rotation: Rotation, mirror: boolean): TextAlign {
  const ex = orient({ x: 1, y: 0 }, rotation, mirror).x;
  if (ex < 0) return align === 'start' ? 'end' : align === 'end' ? 'start' : 'middle';
  if (ex > 0) return align;
  const wx = orient(anchor, rotation, mirror).x;
  if (align === 'middle' || wx === 0) return 'middle';
  return wx > 0 ? 'start' : 'end';
}

/** Upright text written inside a body (a net label's name) cannot fit once the body stands
 *  vertical; it then goes just past the body's far end, centred, above or below it. */
export function textBeyondTurnedBody(
  symbol: SymbolDef, anchor: Point, rotation: Rotation, mirror: boolean, size: number,
): { local: Point; dy: number } | null {
  if (rotation !== 90 && rotation !== 270) return null;
  const b = symbol.bounds;
  const inside = anchor.x > b.x && anchor.x < b.x + b.width && anchor.y > b.y && anchor.y < b.y + b.height;
  if (!inside) return null;
  const local = { x: b.x + b.width + 2, y: 0 };
  const down = orient({ x: 1, y: 0 }, rotation, mirror).y > 0;
  return { local, dy: down ? size * 0.75 : -size * 0.75 };
}

/** Line spacing of multi-line text, in text sizes. */
export const LINE_SPACING = 1.1;

/** The lines of a text item ("50 µA\n8u/1u") with the vertical middle of each: the first line
 *  centred on the item's anchor, the others below it. */
export function textLines(it: { y: number; text: string; size: number }): { text: string; y: number }[] {
  return it.text.split('\n').map((text, i) => ({ text, y: it.y + i * it.size * LINE_SPACING }));
}

export type DrawItem =
  | { type: 'poly'; points: number[]; closed: boolean; fill: boolean }
  | { type: 'circle'; cx: number; cy: number; r: number; fill: boolean }
  | { type: 'text'; x: number; y: number; text: string; size: number; align: TextAlign; role: 'fixed' | 'label' | 'value' };

export interface PlacedSymbol {
  x: number;
  y: number;
  rotation: Rotation;
  mirror: boolean;
  showBulk?: boolean;
  label?: string;
  value?: string;
}

export const LABEL_SIZE = 8.5;
export const VALUE_SIZE = 8;
export const FIXED_TEXT_SIZE = 8;

/** World-space drawing items of a placed symbol. */
export function symbolItems(symbol: SymbolDef, at: PlacedSymbol): DrawItem[] {
  const world = (x: number, y: number): Point => {
    const o = orient({ x, y }, at.rotation, at.mirror);
    return { x: o.x + at.x, y: o.y + at.y };
  };
  const flat = (pts: number[]): number[] => {
    const out: number[] = [];
    for (let i = 0; i + 1 < pts.length; i += 2) {
      const w = world(pts[i], pts[i + 1]);
      out.push(w.x, w.y);
    }
    return out;
  };
  const items: DrawItem[] = [];
  for (const p of symbol.primitives as Primitive[]) {
    switch (p.type) {
      case 'line':
        if (p.optional === 'bulk' && !at.showBulk) break;
        items.push({ type: 'poly', points: flat([p.x1, p.y1, p.x2, p.y2]), closed: false, fill: false });
        break;
      case 'polyline':
        if (p.optional === 'bulk' && !at.showBulk) break;
        items.push({ type: 'poly', points: flat(p.points), closed: !!p.closed, fill: !!p.fill });
        break;
      case 'arc':
        items.push({ type: 'poly', points: flat(arcPoints(p.cx, p.cy, p.r, p.start, p.end)), closed: false, fill: false });
        break;
      case 'circle': {
        const c = world(p.cx, p.cy);
        items.push({ type: 'circle', cx: c.x, cy: c.y, r: p.r, fill: !!p.fill });
        break;
      }
      case 'text': {
        const w = world(p.x, p.y);
        items.push({ type: 'text', x: w.x, y: w.y, text: p.text, size: p.size ?? FIXED_TEXT_SIZE, align: 'middle', role: 'fixed' });
        break;
      }
    }
  }
  const anchored = (anchor: SymbolDef['labelAnchor'], text: string | undefined, size: number, role: 'label' | 'value') => {
    if (!text) return;
    const moved = textBeyondTurnedBody(symbol, anchor, at.rotation, at.mirror, size);
    if (moved) {
      const w = world(moved.local.x, moved.local.y);
      items.push({ type: 'text', x: w.x, y: w.y + moved.dy, text, size, align: 'middle', role });
      return;
    }
    const w = world(anchor.x, anchor.y);
    items.push({ type: 'text', x: w.x, y: w.y, text, size, align: orientAlign(anchor.align, anchor, at.rotation, at.mirror), role });
  };
  anchored(symbol.labelAnchor, at.label, LABEL_SIZE, 'label');
  anchored(symbol.valueAnchor, at.value, VALUE_SIZE, 'value');
  return items;
}
