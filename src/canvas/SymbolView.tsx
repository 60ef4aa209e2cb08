// Draws any symbol from its JSON primitives (symbols/*.json via src/schematic/symbols.ts).
// This is the only code that draws a symbol. Line work goes in a Group carrying the part
// transform (Konva applies scale → rotation → translation, i.e. mirror first, then the clockwise
// quarter turn, as symbols/README.md specifies); text stays upright at its transformed anchor.
import { memo } from 'react';
import { Circle, Group, Line, Text } from 'react-konva';
import { orient, type Primitive, type SymbolDef, type TextAlign } from '../schematic/symbols';
import { arcPoints, orientAlign } from '../export/symbolGeometry';
import type { Point, Rotation } from '../schematic/document';

export const SYMBOL_STROKE = 1.5;
export const TEXT_FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, Arial, sans-serif";

// Arc sampling and upright-text alignment are shared with the SVG export (one reading of the
// symbol primitives): they live in the DOM-free src/export/symbolGeometry.ts.
export { arcPoints, orientAlign };

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

const TEXT_BOX = 120;
/** Konva Text with an anchor at (x, y): y is the vertical middle, align picks the horizontal end. */
export function AnchoredText(props: {
  x: number; y: number; text: string; size: number; align: TextAlign; color: string; bold?: boolean;
}) {
  const { x, y, text, size, align, color, bold } = props;
  const offsetX = align === 'start' ? 0 : align === 'end' ? TEXT_BOX : TEXT_BOX / 2;
  return (
    <Text
      x={x} y={y} offsetX={offsetX} offsetY={size * 0.6} width={TEXT_BOX}
      text={text} fontSize={size} fontFamily={TEXT_FONT} fontStyle={bold ? 'bold' : 'normal'}
      align={align === 'start' ? 'left' : align === 'end' ? 'right' : 'center'}
      fill={color} listening={false} perfectDrawEnabled={false}
    />
  );
}

interface Props {
  symbol: SymbolDef;
  x: number;
  y: number;
  rotation: Rotation;
  mirror: boolean;
  /** Draw the optional bulk lead and pin. */
  showBulk?: boolean;
  color: string;
  strokeWidth?: number;
  opacity?: number;
  /** Reference designator and value line; omitted in the palette. */
  label?: string;
  value?: string;
  labelColor?: string;
}

function LinePrimitive({ p, color, width, showBulk }: { p: Primitive; color: string; width: number; showBulk: boolean }) {
  const common = { stroke: color, strokeWidth: width, lineCap: 'round' as const, lineJoin: 'round' as const, listening: false, perfectDrawEnabled: false };
  switch (p.type) {
    case 'line':
      if (p.optional === 'bulk' && !showBulk) return null;
      return <Line points={[p.x1, p.y1, p.x2, p.y2]} {...common} />;
    case 'polyline':
      if (p.optional === 'bulk' && !showBulk) return null;
      return <Line points={p.points} closed={!!p.closed} fill={p.fill ? color : undefined} {...common} />;
    case 'arc':
      return <Line points={arcPoints(p.cx, p.cy, p.r, p.start, p.end)} {...common} />;
    case 'circle':
      return <Circle x={p.cx} y={p.cy} radius={p.r} fill={p.fill ? color : undefined} {...common} />;
    default:
      return null;
  }
}

function SymbolViewInner(props: Props) {
  const { symbol, x, y, rotation, mirror, color, label, value } = props;
  const width = props.strokeWidth ?? SYMBOL_STROKE;
  const showBulk = !!props.showBulk;
  const texts = symbol.primitives.filter((p): p is Extract<Primitive, { type: 'text' }> => p.type === 'text');
  const labelColor = props.labelColor ?? color;
  const at = (p: Point) => {
    const o = orient(p, rotation, mirror);
    return { x: o.x + x, y: o.y + y };
  };
  const anchored = (anchor: SymbolDef['labelAnchor'], text: string, size: number, bold: boolean, c: string) => {
    const moved = textBeyondTurnedBody(symbol, anchor, rotation, mirror, size);
    if (moved) {
      const w = at(moved.local);
      return <AnchoredText x={w.x} y={w.y + moved.dy} text={text} size={size} align="middle" color={c} bold={bold} />;
    }
    const w = at(anchor);
    return <AnchoredText x={w.x} y={w.y} text={text} size={size} align={orientAlign(anchor.align, anchor, rotation, mirror)} color={c} bold={bold} />;
  };
  return (
    <Group listening={false} opacity={props.opacity ?? 1}>
      <Group x={x} y={y} rotation={rotation} scaleX={mirror ? -1 : 1}>
        {symbol.primitives.map((p, i) => (
          <LinePrimitive key={i} p={p} color={color} width={width} showBulk={showBulk} />
        ))}
      </Group>
      {texts.map((t, i) => {
        const w = at(t);
        return <AnchoredText key={`t${i}`} x={w.x} y={w.y} text={t.text} size={t.size ?? 8} align="middle" color={color} />;
      })}
      {label ? anchored(symbol.labelAnchor, label, 8.5, true, labelColor) : null}
      {value ? anchored(symbol.valueAnchor, value, 8, false, labelColor) : null}
    </Group>
  );
}

export const SymbolView = memo(SymbolViewInner);
