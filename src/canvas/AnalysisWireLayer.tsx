// Konva marks of the live analysis: wires coloured per net (annotate() colours; one batch per
// colour, WireStrokes), a halo on nets lit by a hovered pole or the selected net, the selected
// loop's path with direction arrows, and a ring on the slowest node. A group drawn in the wire
// layer over the plain wires (PartsLayer's wireMarks); it never takes pointer input.
import { memo, useMemo } from 'react';
import { Arrow, Circle, Group, Line } from 'react-konva';
import type { DrawingDocument } from '../schematic/document';
import type { SchematicAnnotations } from '../export/annotations';
import { INK } from './theme';
import { groupWires, WireStrokes, type WireStrokeGroup } from './WireStrokes';

/** Loop path colour: a magenta outside the blue → amber impedance palette. */
export const LOOP_COLOR = '#b0177a';
/** Halo of lit nets: a violet kept lighter than the palette's dark end. */
export const LIT_COLOR = '#8e6cf0';
export const OVERLAY_WIRE_WIDTH = 3;

interface Props {
  doc: DrawingDocument;
  ann: SchematicAnnotations | null;
  /** Wire id → net name. */
  netOfWire: Map<string, string>;
  lit: ReadonlySet<string>;
  scale: number;
}

// Memoised on plain numbers: a re-render with the same ring (new dash array) draws nothing.
const SlowestRing = memo(function SlowestRing({ x, y, k }: { x: number; y: number; k: number }) {
  return (
    <Group x={x} y={y} listening={false}>
      <Circle radius={9 * k} stroke="#ffffff" strokeWidth={5 * k} perfectDrawEnabled={false} />
      <Circle radius={9 * k} stroke={INK} strokeWidth={2.5 * k} perfectDrawEnabled={false} />
      <Circle radius={14 * k} stroke={INK} strokeWidth={1.2 * k} dash={[3 * k, 2 * k]} perfectDrawEnabled={false} />
    </Group>
  );
});

function AnalysisWireMarksView({ doc, ann, netOfWire, lit, scale }: Props) {
  const k = 1 / Math.max(scale, 0.3);
  const wires = doc.wires;
  // The colour of every wire, as one key: a result with the same colours (the sweep or the
  // feedback stage arriving) keeps the same batches, and Konva draws nothing again.
  const colourKey = ann ? Object.values(wires).map((w) => ann.nets[netOfWire.get(w.id) ?? '']?.color ?? '').join(',') : '';
  const marks = useMemo((): WireStrokeGroup[] => {
    if (!ann) return [];
    const byColour = groupWires(Object.values(wires), (w) => ann.nets[netOfWire.get(w.id) ?? '']?.color ?? null);
    return [...byColour].map(([color, list]) => ({ color, width: OVERLAY_WIRE_WIDTH, wires: list }));
  }, [wires, colourKey, netOfWire]);
  const halos = useMemo((): WireStrokeGroup[] => {
    if (lit.size === 0) return [];
    const list = Object.values(wires).filter((w) => lit.has(netOfWire.get(w.id) ?? ''));
    return [{ color: LIT_COLOR, opacity: 0.45, width: 10 * k + OVERLAY_WIRE_WIDTH, wires: list }];
  }, [wires, lit, netOfWire, k]);
  if (!ann) return null;
  return (
    <Group listening={false}>
      <WireStrokes groups={halos} />
      <WireStrokes groups={marks} />
      {ann.slowest && <SlowestRing x={ann.slowest.anchor.x} y={ann.slowest.anchor.y} k={k} />}
      {ann.loop && <LoopPath points={ann.loop.points} k={k} />}
    </Group>
  );
}

/** The loop's path: dashed segments, each with an arrowhead at its middle pointing onwards. */
function LoopPathView({ points, k }: { points: { x: number; y: number }[]; k: number }) {
  const segs = points.slice(1).map((b, i) => ({ a: points[i], b }));
  return (
    <Group listening={false}>
      <Line points={points.flatMap((p) => [p.x, p.y])} stroke="#ffffff" strokeWidth={5 * k} opacity={0.8} lineJoin="round" perfectDrawEnabled={false} />
      <Line points={points.flatMap((p) => [p.x, p.y])} stroke={LOOP_COLOR} strokeWidth={2 * k} dash={[7 * k, 4 * k]} lineJoin="round" perfectDrawEnabled={false} />
      {segs.filter(({ a, b }) => a.x !== b.x || a.y !== b.y).map(({ a, b }, i) => {
        const mx = (a.x + b.x) / 2, my = (a.y + b.y) / 2;
        const len = Math.hypot(b.x - a.x, b.y - a.y);
        const ux = (b.x - a.x) / len, uy = (b.y - a.y) / len;
        return (
          <Arrow key={i} points={[mx - ux * 6 * k, my - uy * 6 * k, mx + ux * 2 * k, my + uy * 2 * k]} stroke={LOOP_COLOR} fill={LOOP_COLOR}
            strokeWidth={2 * k} pointerLength={8 * k} pointerWidth={8 * k} perfectDrawEnabled={false} />
        );
      })}
      {points.slice(0, -1).map((p, i) => (
        <Circle key={`v${i}`} x={p.x} y={p.y} radius={3 * k} fill={LOOP_COLOR} perfectDrawEnabled={false} />
      ))}
    </Group>
  );
}

const LoopPath = memo(LoopPathView);

export const AnalysisWireMarks = memo(AnalysisWireMarksView);
