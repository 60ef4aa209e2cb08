// Small builders for drawings in tests.
import type { DrawingDocument, PartRecord, Point, Rotation, SymbolKind, WireId } from '../../src/schematic/document';
import { emptyDocument } from '../../src/schematic/document';
import { newPart } from '../../src/schematic/kinds';

export function drawing(parts: PartRecord[], wires: [string, ...Point[]][] = []): DrawingDocument {
  const doc = emptyDocument('test');
  for (const p of parts) doc.parts[p.id] = p;
  for (const [id, ...points] of wires) doc.wires[`wire:${id}` as WireId] = { id: `wire:${id}` as WireId, points };
  return doc;
}

export function part(
  kind: SymbolKind, ref: string, x: number, y: number,
  opts: { rotation?: Rotation; mirror?: boolean; params?: Record<string, string> } & Partial<PartRecord> = {},
): PartRecord {
  const p = newPart(kind, `part:${ref.toLowerCase()}`, ref, { x, y }, opts.rotation ?? 0, opts.mirror ?? false);
  const { params, rotation: _r, mirror: _m, ...rest } = opts;
  return { ...p, ...rest, params: { ...p.params, ...(params ?? {}) } };
}

export const pt = (x: number, y: number): Point => ({ x, y });
