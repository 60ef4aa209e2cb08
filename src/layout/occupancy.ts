// What is where on the drawing grid while wires are being rebuilt: symbol bodies, pins and the
// wires laid so far, each grid point tagged with the net that owns it. A wire of net N may cross
// another net's wire at right angles (no vertex there: crossing wires do not connect), but may not
// bend, end, run along or touch a pin of another net, and never enters a symbol body. These are
// exactly the drawing's connection rules (src/schematic/connectivity.ts), so a wire that passes
// this check cannot join two nets.

import type { Point } from '../schematic/document';
import { GRID, pointKey } from '../schematic/document';
import type { Rect } from './model';

/** How a net uses a grid point: a pin, a wire vertex (end or bend), or the inside of a segment. */
type Use = 'pin' | 'vertex' | 'h' | 'v';

export class Occupancy {
  private uses = new Map<string, Map<string, Set<Use>>>();
  readonly bodies: Rect[] = [];

  addBody(r: Rect): void {
    this.bodies.push(r);
  }

  private mark(p: Point, net: string, use: Use): void {
    const k = pointKey(p);
    let m = this.uses.get(k);
    if (!m) { m = new Map(); this.uses.set(k, m); }
    let s = m.get(net);
    if (!s) { s = new Set(); m.set(net, s); }
    s.add(use);
  }

  addPin(p: Point, net: string): void {
    this.mark(p, net, 'pin');
  }

  /** Record a wire (points on the grid, orthogonal). */
  addWire(points: Point[], net: string): void {
    points.forEach((p, i) => {
      this.mark(p, net, 'vertex');
      if (i === 0) return;
      for (const q of between(points[i - 1], p)) this.mark(q, net, points[i - 1].y === p.y ? 'h' : 'v');
    });
  }

  /** Is the point strictly inside a symbol body? */
  inBody(p: Point): boolean {
    return this.bodies.some((b) => p.x > b.x && p.x < b.x + b.width && p.y > b.y && p.y < b.y + b.height);
  }

  /** Uses of the point by nets other than `net`. */
  private others(p: Point, net: string): Set<Use> | null {
    const m = this.uses.get(pointKey(p));
    if (!m) return null;
    let out: Set<Use> | null = null;
    for (const [n, s] of m) {
      if (n === net) continue;
      out ??= new Set();
      for (const u of s) out.add(u);
    }
    return out;
  }

  /** Does net `net` already own this point (pin, vertex or segment)? */
  owns(p: Point, net: string): boolean {
    return this.uses.get(pointKey(p))?.has(net) ?? false;
  }

  /** May net `net` have a vertex (end or bend) here? */
  canStop(p: Point, net: string): boolean {
    return !this.inBody(p) && this.others(p, net) === null;
  }

  /** May net `net` pass straight through here, running horizontally (`h`) or vertically? */
  canPass(p: Point, net: string, dir: 'h' | 'v'): boolean {
    if (this.inBody(p)) return false;
    const o = this.others(p, net);
    if (!o) return true;
    // Only a right-angle crossing of another net's segment is allowed.
    return !o.has('pin') && !o.has('vertex') && !o.has(dir);
  }

  /** Check a whole candidate wire for net `net`. */
  wireFits(points: Point[], net: string): boolean {
    if (points.length < 2) return false;
    for (let i = 0; i < points.length; i++) {
      const p = points[i];
      if (p.x % GRID !== 0 || p.y % GRID !== 0) return false;
      if (!this.canStop(p, net)) return false;
      if (i === 0) continue;
      const a = points[i - 1];
      if (a.x !== p.x && a.y !== p.y) return false;
      const dir = a.y === p.y ? 'h' : 'v';
      for (const q of between(a, p)) if (!this.canPass(q, net, dir)) return false;
    }
    return true;
  }
}

/** Grid points strictly between two points of one horizontal or vertical segment. */
export function between(a: Point, b: Point): Point[] {
  const out: Point[] = [];
  if (a.y === b.y) {
    const s = Math.sign(b.x - a.x);
    for (let x = a.x + s * GRID; s !== 0 && x !== b.x; x += s * GRID) out.push({ x, y: a.y });
  } else if (a.x === b.x) {
    const s = Math.sign(b.y - a.y);
    for (let y = a.y + s * GRID; s !== 0 && y !== b.y; y += s * GRID) out.push({ x: a.x, y });
  }
  return out;
}

/** Drop repeated points and the middle of three collinear points. */
export function simplify(points: Point[]): Point[] {
  const out: Point[] = [];
  for (const p of points) {
    const last = out[out.length - 1];
    if (last && last.x === p.x && last.y === p.y) continue;
    out.push(p);
    while (out.length >= 3) {
      const [a, b, c] = out.slice(-3);
      const collinear = (a.x === b.x && b.x === c.x) || (a.y === b.y && b.y === c.y);
      const backtracks = collinear && (Math.sign(b.x - a.x) !== Math.sign(c.x - b.x) || Math.sign(b.y - a.y) !== Math.sign(c.y - b.y));
      if (!collinear || backtracks) break;
      out.splice(out.length - 2, 1);
    }
  }
  return out;
}
