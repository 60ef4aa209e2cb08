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

// A common-source stage: input marker → gate of M1, R1 from the rail to the drain, source on
// ground, output marker on the drain (labelled "out").
export function commonSource() {
  return drawing([
    part('nmos', 'M1', 100, 100), // g (80,100) d (110,70) s (110,130)
    part('ground', 'GND1', 110, 130),
    part('resistor', 'R1', 110, 40, { params: { value: '4.7k' } }), // p (110,10) n (110,70)
    part('supply', 'VR1', 110, 10),
    part('input', 'IN1', 40, 100), // p (60,100)
    part('output', 'OUT1', 150, 70), // p (130,70)
    part('netLabel', 'NL1', 110, 70, { params: { net: 'out' } }),
  ], [['g', pt(60, 100), pt(80, 100)], ['o', pt(110, 70), pt(130, 70)]]);
}
