// Shared checks of a laid-out drawing: symbol bodies apart, wires orthogonal and on the grid.
import { expect } from 'vitest';
import type { DrawingDocument } from '../../src/schematic/document';
import { GRID } from '../../src/schematic/document';
import { placedBounds } from '../../src/schematic/symbols';

/** Pairs of parts whose body boxes overlap (touching edges allowed). */
export function overlappingBodies(doc: DrawingDocument): string[] {
  const parts = Object.values(doc.parts);
  const out: string[] = [];
  for (let i = 0; i < parts.length; i++) {
    const a = placedBounds(parts[i]);
    for (let j = i + 1; j < parts.length; j++) {
      const b = placedBounds(parts[j]);
      const apart = a.x + a.width <= b.x || b.x + b.width <= a.x || a.y + a.height <= b.y || b.y + b.height <= a.y;
      if (!apart) out.push(`${parts[i].ref} / ${parts[j].ref}`);
    }
  }
  return out;
}

/** Wires with a slanted segment or a point off the grid. */
export function badWires(doc: DrawingDocument): string[] {
  const out: string[] = [];
  for (const w of Object.values(doc.wires)) {
    if (w.points.length < 2) out.push(`${w.id}: fewer than two points`);
    w.points.forEach((p, i) => {
      if (p.x % GRID !== 0 || p.y % GRID !== 0) out.push(`${w.id}: point ${p.x},${p.y} off the grid`);
      const q = w.points[i - 1];
      if (q && q.x !== p.x && q.y !== p.y) out.push(`${w.id}: slanted segment ${q.x},${q.y} → ${p.x},${p.y}`);
    });
  }
  return out;
}

/** Wire points strictly inside a symbol body (a wire through a symbol). */
export function wiresThroughBodies(doc: DrawingDocument): string[] {
  const out: string[] = [];
  const bodies = Object.values(doc.parts).map((p) => ({ ref: p.ref, b: placedBounds(p) }));
  for (const w of Object.values(doc.wires)) {
    for (let i = 1; i < w.points.length; i++) {
      const a = w.points[i - 1], c = w.points[i];
      const steps = Math.max(Math.abs(c.x - a.x), Math.abs(c.y - a.y)) / GRID;
      for (let k = 0; k <= steps; k++) {
        const x = a.x + ((c.x - a.x) * k) / Math.max(steps, 1), y = a.y + ((c.y - a.y) * k) / Math.max(steps, 1);
        for (const { ref, b } of bodies) {
          if (x > b.x && x < b.x + b.width && y > b.y && y < b.y + b.height) out.push(`${w.id} through ${ref} at ${x},${y}`);
        }
      }
    }
  }
  return [...new Set(out)];
}

/** A tidy drawing: no body overlaps, no off-grid or slanted wire, no wire through a body. */
export function expectTidy(doc: DrawingDocument): void {
  expect(overlappingBodies(doc)).toEqual([]);
  expect(badWires(doc)).toEqual([]);
  expect(wiresThroughBodies(doc)).toEqual([]);
}
