// Issues to show on the canvas: the drawing checks (already placed) and engine errors placed at
// the net or part they name.
import type { EngineIssue } from '../engine/types';
import type { DrawingDocument } from '../schematic/document';
import type { DrawingNetlist } from '../schematic/toNetlist';
import { netAnchor } from '../export/annotate';
import type { LiveIssue } from './types';

/** Drawing-check codes that concern the whole drawing (no single place). */
const WHOLE_DRAWING = new Set(['no-ground', 'no-input', 'no-output']);

export function drawingIssues(drawing: DrawingNetlist): LiveIssue[] {
  return drawing.issues.map((i) => ({
    severity: i.severity, code: i.code, message: i.message,
    x: WHOLE_DRAWING.has(i.code) ? null : i.x, y: WHOLE_DRAWING.has(i.code) ? null : i.y,
    part: i.part, node: i.net, field: i.field, source: 'drawing' as const,
  }));
}

/** Engine issues placed on the drawing: a named node at its net's anchor, a part at its origin. */
export function engineIssues(list: EngineIssue[], doc: DrawingDocument, drawing: DrawingNetlist): LiveIssue[] {
  const nets = new Map(drawing.nets.map((n) => [n.name, n]));
  const parts = new Map(Object.values(doc.parts).map((p) => [p.ref, p]));
  return list.map((i) => {
    let x: number | null = null, y: number | null = null;
    const net = i.node ? nets.get(i.node) : undefined;
    const part = i.part ? parts.get(i.part) : undefined;
    if (net) ({ x, y } = netAnchor(doc, net));
    else if (part) ({ x, y } = part);
    return { severity: i.severity, code: i.code, message: i.message, x, y, part: i.part, node: i.node, field: i.field, source: 'engine' as const };
  });
}
