// The selected loop's path on the schematic: through its nets in order, and between two nets
// through the body of the loop member that joins them (so a two-net loop reads as a circuit, not
// as one line drawn twice). Pure TS: annotate() routes the loop here for the export and the canvas.
import type { DrawingDocument, Point } from '../schematic/document';
import { pinKey } from '../schematic/document';
import { placedBounds, placedPins } from '../schematic/symbols';

/** `anchors[i]` is the mark point of `nets[i]`; `parts` the member part names (refs). */
export function loopPathPoints(doc: DrawingDocument, netOfPin: Record<string, string>, nets: string[], anchors: Point[], parts: string[]): Point[] {
  if (nets.length === 0 || anchors.length === 0) return [];
  const members = Object.values(doc.parts).filter((p) => parts.includes(p.ref));
  const netsOf = new Map(members.map((p) => [p.id, new Set(placedPins(p).map((pin) => netOfPin[pinKey({ part: p.id, pin: pin.name })]))]));
  const out: Point[] = [anchors[0]];
  const used = new Set<string>();
  for (let i = 0; i < nets.length; i++) {
    const a = nets[i], b = nets[(i + 1) % nets.length];
    const via = members.find((p) => !used.has(p.id) && netsOf.get(p.id)!.has(a) && netsOf.get(p.id)!.has(b))
      ?? members.find((p) => netsOf.get(p.id)!.has(a) && netsOf.get(p.id)!.has(b));
    if (via) {
      used.add(via.id);
      const r = placedBounds(via);
      out.push({ x: r.x + r.width / 2, y: r.y + r.height / 2 });
    }
    out.push(anchors[(i + 1) % anchors.length]);
  }
  return out;
}
