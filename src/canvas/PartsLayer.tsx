// Parts and wires of the document. Records are immutable (immer), so memoised views redraw only
// the records that changed, and the selection changes only the colour prop of the items it touches.
// The wires and the parts are drawn on separate layers, the parts on a few (see PARTS_PER_LAYER).
// The wire layer also holds the live analysis colours of the wires (wireMarks), drawn over them.
import { memo, type ReactElement } from 'react';
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
  /** Drawn in the wire layer above the plain wires (the analysis colours): one canvas less. */
  wireMarks?: ReactElement | null;
}

type ItemState = 'plain' | 'hover' | 'selected';

/** Parts per Konva layer. Konva redraws a whole layer when one of its shapes changes, so the
 *  parts are spread over a few layers (each its own canvas): a value edit or a selection redraws
 *  the layer holding that part only, not all the symbols and their texts. Few layers, though:
 *  every canvas is a compositor layer the size of the sheet, and in the 2-core headless bench
 *  (tests/bench/browser-bench.ts, 252 parts) 4 part layers gave a faster edit → overlay frame
 *  than 7 or 16, although each redraws more parts. */
export const PARTS_PER_LAYER = 64;
const MAX_PART_LAYERS = 4;

const sameItems = <T,>(a: { items: T[]; states: ItemState[] }, b: { items: T[]; states: ItemState[] }) =>
  a.items.length === b.items.length && a.items.every((x, i) => x === b.items[i] && a.states[i] === b.states[i]);

const PartChunk = memo(function PartChunk({ items, states }: { items: PartRecord[]; states: ItemState[] }) {
  return <Layer listening={false}>{items.map((p, i) => <PartView key={p.id} part={p} state={states[i]} />)}</Layer>;
}, sameItems);

const WireItems = memo(function WireItems({ items, states }: { items: WireRecord[]; states: ItemState[] }) {
  return <>{items.map((w, i) => <WireView key={w.id} wire={w} state={states[i]} />)}</>;
}, sameItems);

function PartsLayerView({ doc, selection, hover, wireMarks }: Props) {
  const hoverId = hover.type === 'part' || hover.type === 'pin' ? hover.part : hover.type === 'wire' ? hover.wire : null;
  const stateOf = (id: ItemId): ItemState => (selection.has(id) ? 'selected' : id === hoverId ? 'hover' : 'plain');
  const wires = Object.values(doc.wires);
  const parts = Object.values(doc.parts).sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const size = Math.max(PARTS_PER_LAYER, Math.ceil(parts.length / MAX_PART_LAYERS));
  const chunks: PartRecord[][] = [];
  for (let i = 0; i < parts.length; i += size) chunks.push(parts.slice(i, i + size));
  return (
    <>
      <Layer listening={false}>
        <WireItems items={wires} states={wires.map((w) => stateOf(w.id))} />
        {wireMarks ?? null}
      </Layer>
      {chunks.map((c, k) => <PartChunk key={k} items={c} states={c.map((p) => stateOf(p.id))} />)}
    </>
  );
}

/** Same element type and shallowly equal props (the wire marks are made anew on each render). */
const sameElement = (a: ReactElement | null | undefined, b: ReactElement | null | undefined) => {
  if (!a || !b) return a === b;
  if (a.type !== b.type || a.key !== b.key) return false;
  const pa = a.props as Record<string, unknown>, pb = b.props as Record<string, unknown>;
  const ka = Object.keys(pa), kb = Object.keys(pb);
  return ka.length === kb.length && ka.every((k) => Object.is(pa[k], pb[k]));
};

export const PartsLayer = memo(PartsLayerView, (a, b) =>
  a.doc === b.doc && a.selection === b.selection && a.hover === b.hover && sameElement(a.wireMarks, b.wireMarks));
