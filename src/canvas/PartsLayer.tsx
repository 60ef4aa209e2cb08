// Parts and wires of the document. Records are immutable (immer), so memoised views redraw only
// the records that changed, and the selection changes only the colour prop of the items it touches.
// The wires and the parts are drawn on separate layers, the parts on a few (see PARTS_PER_LAYER).
// The wire layer also holds the live analysis colours of the wires (wireMarks), drawn over the
// plain wires and under the hovered and selected ones. Wires are drawn in batches (WireStrokes).
import { memo, useMemo, type ReactElement } from 'react';
import { Layer } from 'react-konva';
import type { DrawingDocument, ItemId, PartRecord, WireRecord } from '../schematic/document';
import type { HitTarget } from '../editor/types';
import { SymbolBatch } from './SymbolView';
import { partItems, type SymbolStyle } from './drawSymbol';
import { HOVER, INK, INK_SOFT, SELECTED, SYMBOL_STROKE, WIRE, WIRE_WIDTH } from './theme';
import { WireStrokes, type WireStrokeGroup } from './WireStrokes';

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
 *  than 7 or 16, and, with the batched drawing, than 1 (tests/bench/RESULTS.md). */
export const PARTS_PER_LAYER = 64;
const MAX_PART_LAYERS = 4;

const sameItems = <T,>(a: { items: T[]; states: ItemState[] }, b: { items: T[]; states: ItemState[] }) =>
  a.items.length === b.items.length && a.items.every((x, i) => x === b.items[i] && a.states[i] === b.states[i]);

const styleOf = (state: ItemState): SymbolStyle => state === 'selected' ? { color: SELECTED, width: 2, labelColor: SELECTED }
  : state === 'hover' ? { color: HOVER, width: SYMBOL_STROKE, labelColor: HOVER }
    : { color: INK, width: SYMBOL_STROKE, labelColor: INK_SOFT };

/** One layer of parts, drawn as one batch (SymbolBatch); each part's items are cached on its record. */
const PartChunk = memo(function PartChunk({ items, states }: { items: PartRecord[]; states: ItemState[] }) {
  const list = useMemo(() => items.map((p, i) => ({ items: partItems(p), style: styleOf(states[i]) })), [items, states]);
  return <Layer listening={false}><SymbolBatch list={list} /></Layer>;
}, sameItems);

/** The wires in a given state as one batch (WireStrokes): the plain ones below the analysis
 *  colours, the hovered and selected ones above them, so a selection stays visible on a coloured net. */
const WireItems = memo(function WireItems({ items, states, show }: { items: WireRecord[]; states: ItemState[]; show: 'plain' | 'picked' }) {
  const groups = useMemo((): WireStrokeGroup[] => {
    if (show === 'plain') return [{ color: WIRE, width: WIRE_WIDTH, wires: items.filter((_, i) => states[i] === 'plain') }];
    return [
      { color: HOVER, width: WIRE_WIDTH, wires: items.filter((_, i) => states[i] === 'hover') },
      { color: SELECTED, width: 2.2, wires: items.filter((_, i) => states[i] === 'selected') },
    ];
  }, [items, states, show]);
  return <WireStrokes groups={groups} />;
}, (a, b) => a.show === b.show && sameItems(a, b));

function PartsLayerView({ doc, selection, hover, wireMarks }: Props) {
  const hoverId = hover.type === 'part' || hover.type === 'pin' ? hover.part : hover.type === 'wire' ? hover.wire : null;
  const stateOf = (id: ItemId): ItemState => (selection.has(id) ? 'selected' : id === hoverId ? 'hover' : 'plain');
  const wires = Object.values(doc.wires);
  const wireStates = wires.map((w) => stateOf(w.id));
  const parts = Object.values(doc.parts).sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const size = Math.max(PARTS_PER_LAYER, Math.ceil(parts.length / MAX_PART_LAYERS));
  const chunks: PartRecord[][] = [];
  for (let i = 0; i < parts.length; i += size) chunks.push(parts.slice(i, i + size));
  return (
    <>
      <Layer listening={false}>
        <WireItems items={wires} states={wireStates} show="plain" />
        {wireMarks ?? null}
        <WireItems items={wires} states={wireStates} show="picked" />
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
