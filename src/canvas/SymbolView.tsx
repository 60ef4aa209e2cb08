// Konva views of symbols, all drawn by drawSymbols (drawSymbol.ts) from the symbol JSON's one
// reading (symbolItems): SymbolView is one symbol (the shelf, the part following the pointer),
// SymbolBatch many placed parts in one shape (a layer of the sheet).
import { memo, useMemo } from 'react';
import { Shape } from 'react-konva';
import type { Context } from 'konva/lib/Context';
import type { SymbolDef } from '../schematic/symbols';
import { symbolItems } from '../export/symbolGeometry';
import type { Rotation } from '../schematic/document';
import { drawSymbols, type SymbolDrawing } from './drawSymbol';
import { SYMBOL_STROKE } from './theme';

export { TEXT_FONT } from './drawSymbol';

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

function SymbolViewInner({ symbol, x, y, rotation, mirror, showBulk, color, strokeWidth, opacity, label, value, labelColor }: Props) {
  const list = useMemo((): SymbolDrawing[] => [{
    items: symbolItems(symbol, { x, y, rotation, mirror, showBulk: !!showBulk, label, value }),
    style: { color, width: strokeWidth ?? SYMBOL_STROKE, labelColor: labelColor ?? color, opacity },
  }], [symbol, x, y, rotation, mirror, showBulk, color, strokeWidth, opacity, label, value, labelColor]);
  return <SymbolBatch list={list} />;
}

export const SymbolView = memo(SymbolViewInner);

/** Symbols drawn by one Konva shape; memoised on the list (make it with useMemo). */
export const SymbolBatch = memo(function SymbolBatch({ list }: { list: readonly SymbolDrawing[] }) {
  if (list.length === 0) return null;
  return (
    <Shape listening={false} perfectDrawEnabled={false}
      sceneFunc={(ctx: Context) => drawSymbols(ctx._context as CanvasRenderingContext2D, list)} />
  );
});
