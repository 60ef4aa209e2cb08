// Parts and wires of the document. Records are immutable (immer), so memoised views redraw only
// the records that changed, and the selection changes only the colour prop of the items it touches.
import { memo } from 'react';
import { Layer, Line } from 'react-konva';
import type { DrawingDocument, ItemId, PartRecord, WireRecord } from '../schematic/document';
import { symbolOf } from '../schematic/symbols';
import type { HitTarget } from '../editor/types';
import { SymbolView } from './SymbolView';
import { partValueText } from './partText';
import { HOVER, INK, INK_SOFT, SELECTED, WIRE, WIRE_HIT_WIDTH, WIRE_WIDTH } from './theme';

const PartView = memo(function PartView({ part, state }: { part: PartRecord; state: 'plain' | 'hover' | 'selected' }) {
  const sym = symbolOf(part.kind);
  const color = state === 'selected' ? SELECTED : state === 'hover' ? HOVER : INK;
  return (
    <SymbolView
      symbol={sym} x={part.x} y={part.y} rotation={part.rotation} mirror={part.mirror}
      showBulk={part.bulk === 'pin'} color={color} strokeWidth={state === 'selected' ? 2 : undefined}
      label={sym.role === 'device' || sym.role === 'input' || sym.role === 'output' ? part.ref : undefined}
      value={partValueText(part, sym)} labelColor={state === 'plain' ? INK_SOFT : color}
    />
  );
});

const WireView = memo(function WireView({ wire, state }: { wire: WireRecord; state: 'plain' | 'hover' | 'selected' }) {
  const points = wire.points.flatMap((p) => [p.x, p.y]);
  return (
    <Line
      points={points} stroke={state === 'selected' ? SELECTED : state === 'hover' ? HOVER : WIRE}
      strokeWidth={state === 'selected' ? 2.2 : WIRE_WIDTH} hitStrokeWidth={WIRE_HIT_WIDTH}
      lineCap="round" lineJoin="round" listening={false} perfectDrawEnabled={false}
    />
  );
});

interface Props {
  doc: DrawingDocument;
  selection: ReadonlySet<ItemId>;
  hover: HitTarget;
}

function PartsLayerView({ doc, selection, hover }: Props) {
  const hoverId = hover.type === 'part' || hover.type === 'pin' ? hover.part : hover.type === 'wire' ? hover.wire : null;
  const stateOf = (id: ItemId) => (selection.has(id) ? 'selected' : id === hoverId ? 'hover' : 'plain');
  return (
    <Layer listening={false}>
      {Object.values(doc.wires).map((w) => <WireView key={w.id} wire={w} state={stateOf(w.id)} />)}
      {Object.values(doc.parts).map((p) => <PartView key={p.id} part={p} state={stateOf(p.id)} />)}
    </Layer>
  );
}

export const PartsLayer = memo(PartsLayerView);
