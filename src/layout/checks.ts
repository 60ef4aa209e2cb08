// Final checks of a tidied drawing before it is offered: symbol bodies apart, wires orthogonal on
// the grid and never through a body. Each failure names the parts or the wire.
import type { DrawingDocument } from '../schematic/document';
import { GRID } from '../schematic/document';
import { placedBounds } from '../schematic/symbols';

export function layoutProblems(doc: DrawingDocument): string[] {
  const out: string[] = [];
  const parts = Object.values(doc.parts).map((p) => ({ ref: p.ref, b: placedBounds(p) }));
  for (let i = 0; i < parts.length; i++) {
    for (let j = i + 1; j < parts.length; j++) {
      const a = parts[i].b, b = parts[j].b;
      if (!(a.x + a.width <= b.x || b.x + b.width <= a.x || a.y + a.height <= b.y || b.y + b.height <= a.y)) out.push(`${parts[i].ref} overlaps ${parts[j].ref}`);
    }
  }
  for (const w of Object.values(doc.wires)) {
    w.points.forEach((p, i) => {
      if (p.x % GRID !== 0 || p.y % GRID !== 0) out.push(`a wire point is off the grid at ${p.x},${p.y}`);
      const q = w.points[i - 1];
      if (!q) return;
      if (q.x !== p.x && q.y !== p.y) { out.push(`a wire runs slanted from ${q.x},${q.y}`); return; }
      const n = Math.max(Math.abs(p.x - q.x), Math.abs(p.y - q.y)) / GRID;
      for (let k = 0; k <= n; k++) {
        const x = q.x + Math.sign(p.x - q.x) * k * GRID, y = q.y + Math.sign(p.y - q.y) * k * GRID;
        const hit = parts.find(({ b }) => x > b.x && x < b.x + b.width && y > b.y && y < b.y + b.height);
        if (hit) { out.push(`a wire runs through ${hit.ref} at ${x},${y}`); return; }
      }
    });
  }
  return out;
}
