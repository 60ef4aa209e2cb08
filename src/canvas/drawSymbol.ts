// Canvas drawing of placed symbols: the world-space items of symbolItems (the one reading of the
// symbol primitives, shared with the SVG export) straight onto a 2D context. Many parts go through
// one call, so a layer of symbols is one Konva shape and a few canvas calls per part, not one
// Konva node (with its own state save, transform and measure) per line and per text.
import type { PartRecord } from '../schematic/document';
import { symbolOf, type SymbolDef } from '../schematic/symbols';
import { symbolItems, textLines, type DrawItem, type PlacedSymbol } from '../export/symbolGeometry';
import { partValueText } from './partText';

export const TEXT_FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, Arial, sans-serif";

export interface SymbolStyle {
  color: string;
  width: number;
  /** Colour of the reference and value lines (the symbol's own texts use `color`). */
  labelColor: string;
  opacity?: number;
}

/** A symbol ready to draw: its items and style. */
export interface SymbolDrawing {
  items: readonly DrawItem[];
  style: SymbolStyle;
}

const fontOf = (size: number, bold: boolean) => `${bold ? 'bold ' : ''}${size}px ${TEXT_FONT}`;

/** Draws the symbols in order. Line work of one symbol is one path (filled shapes filled too);
 *  texts stay upright, vertically centred on their anchors. */
export function drawSymbols(c: CanvasRenderingContext2D, list: readonly SymbolDrawing[]): void {
  c.lineCap = 'round';
  c.lineJoin = 'round';
  c.textBaseline = 'middle';
  for (const { items, style } of list) {
    c.globalAlpha = style.opacity ?? 1;
    c.strokeStyle = style.color;
    c.fillStyle = style.color;
    c.lineWidth = style.width;
    c.beginPath();
    for (const it of items) {
      if (it.type === 'poly' && !it.fill) tracePoly(c, it.points, it.closed);
      else if (it.type === 'circle' && !it.fill) { c.moveTo(it.cx + it.r, it.cy); c.arc(it.cx, it.cy, it.r, 0, 2 * Math.PI); }
    }
    c.stroke();
    for (const it of items) {
      if (it.type === 'text' || !it.fill) continue;
      c.beginPath();
      if (it.type === 'poly') tracePoly(c, it.points, true);
      else c.arc(it.cx, it.cy, it.r, 0, 2 * Math.PI);
      c.fill();
      c.stroke();
    }
    for (const it of items) {
      if (it.type !== 'text') continue;
      c.font = fontOf(it.size, it.role === 'label');
      c.textAlign = it.align === 'start' ? 'left' : it.align === 'end' ? 'right' : 'center';
      c.fillStyle = it.role === 'fixed' ? style.color : style.labelColor;
      for (const l of textLines(it)) c.fillText(l.text, it.x, l.y);
    }
  }
  c.globalAlpha = 1;
}

function tracePoly(c: CanvasRenderingContext2D, pts: readonly number[], closed: boolean) {
  if (pts.length < 2) return;
  c.moveTo(pts[0], pts[1]);
  for (let i = 2; i + 1 < pts.length; i += 2) c.lineTo(pts[i], pts[i + 1]);
  if (closed) c.closePath();
}

/** The label and value a placed part shows on the sheet, as symbolItems takes them. */
export function placedSymbolOf(part: PartRecord, sym: SymbolDef = symbolOf(part.kind)): PlacedSymbol {
  return {
    x: part.x, y: part.y, rotation: part.rotation, mirror: part.mirror, showBulk: part.bulk === 'pin',
    label: sym.role === 'device' || sym.role === 'input' || sym.role === 'output' ? part.ref : undefined,
    value: partValueText(part, sym),
  };
}

// Part records are immutable (immer): their items are computed once per record.
const itemsCache = new WeakMap<PartRecord, readonly DrawItem[]>();

/** World-space items of a placed part (cached per record). */
export function partItems(part: PartRecord): readonly DrawItem[] {
  let items = itemsCache.get(part);
  if (!items) {
    const sym = symbolOf(part.kind);
    items = symbolItems(sym, placedSymbolOf(part, sym));
    itemsCache.set(part, items);
  }
  return items;
}
