// Wires drawn in batches: one Konva shape strokes many wires, one canvas path per colour and width,
// instead of one Konva line (with its own save/restore and stroke) per wire. A drawing of a few
// hundred wires then costs a handful of strokes per redraw of the wire layer. Never listens.
import { memo } from 'react';
import { Shape } from 'react-konva';
import type { Context } from 'konva/lib/Context';
import type { WireRecord } from '../schematic/document';

export interface WireStrokeGroup {
  color: string;
  /** Line width in world units. */
  width: number;
  opacity?: number;
  wires: readonly WireRecord[];
}

/** Strokes each group as one path (round caps and joins, like a single wire drawn alone). */
export function strokeWireGroups(c: CanvasRenderingContext2D, groups: readonly WireStrokeGroup[]): void {
  c.lineCap = 'round';
  c.lineJoin = 'round';
  for (const g of groups) {
    if (g.wires.length === 0) continue;
    c.beginPath();
    for (const w of g.wires) {
      const pts = w.points;
      if (pts.length === 0) continue;
      c.moveTo(pts[0].x, pts[0].y);
      for (let i = 1; i < pts.length; i++) c.lineTo(pts[i].x, pts[i].y);
    }
    c.globalAlpha = g.opacity ?? 1;
    c.strokeStyle = g.color;
    c.lineWidth = g.width;
    c.stroke();
  }
  c.globalAlpha = 1;
}

/** Groups of wires by a key per wire (null: not drawn), in first-seen order of the keys. */
export function groupWires(wires: readonly WireRecord[], keyOf: (w: WireRecord) => string | null): Map<string, WireRecord[]> {
  const out = new Map<string, WireRecord[]>();
  for (const w of wires) {
    const k = keyOf(w);
    if (k === null) continue;
    const list = out.get(k);
    if (list) list.push(w); else out.set(k, [w]);
  }
  return out;
}

/** One Konva shape drawing the groups; memoised on the groups array (make it with useMemo). */
export const WireStrokes = memo(function WireStrokes({ groups }: { groups: readonly WireStrokeGroup[] }) {
  if (groups.every((g) => g.wires.length === 0)) return null;
  return (
    <Shape listening={false} perfectDrawEnabled={false}
      sceneFunc={(ctx: Context) => strokeWireGroups(ctx._context as CanvasRenderingContext2D, groups)} />
  );
});
