// Grid maze router for the wires the layout engine's routes cannot give cleanly: a shortest path
// with a bend penalty (Lee 1961 wave expansion, run as A* with Manhattan distance, Hart, Nilsson &
// Raphael 1968) over the 10-unit grid, obeying the occupancy rules (occupancy.ts): no symbol
// bodies, no touching other nets, crossings only at right angles.

import type { Point } from '../schematic/document';
import { GRID, pointKey } from '../schematic/document';
import type { PinSide } from '../schematic/symbols';
import type { Occupancy } from './occupancy';
import { simplify } from './occupancy';
import type { Rect } from './model';

const DIRS: Point[] = [{ x: 1, y: 0 }, { x: 0, y: 1 }, { x: -1, y: 0 }, { x: 0, y: -1 }];
const SIDE_DIR: Record<PinSide, number> = { right: 0, bottom: 1, left: 2, top: 3 };
const BEND = 4;
const WRONG_START = 6;

class Heap {
  private a: { f: number; s: number }[] = [];
  get size(): number { return this.a.length; }
  push(f: number, s: number): void {
    const a = this.a;
    a.push({ f, s });
    let i = a.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (a[p].f <= a[i].f) break;
      [a[p], a[i]] = [a[i], a[p]];
      i = p;
    }
  }
  pop(): { f: number; s: number } {
    const a = this.a;
    const top = a[0];
    const last = a.pop()!;
    if (a.length > 0) {
      a[0] = last;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1, r = l + 1;
        let m = i;
        if (l < a.length && a[l].f < a[m].f) m = l;
        if (r < a.length && a[r].f < a[m].f) m = r;
        if (m === i) break;
        [a[m], a[i]] = [a[i], a[m]];
        i = m;
      }
    }
    return top;
  }
}

export interface MazeRequest {
  net: string;
  from: Point;
  /** Side the start pin leaves from (the first step prefers it). */
  side?: PinSide;
  /** Grid points already connected to the net (any one of them ends the route). */
  targets: Point[];
  /** Search area. */
  area: Rect;
}

/** A route as orthogonal wire points, or null when the area holds none. */
export function mazeRoute(occ: Occupancy, req: MazeRequest): Point[] | null {
  const { net, from, area } = req;
  const x0 = Math.floor(area.x / GRID), y0 = Math.floor(area.y / GRID);
  const w = Math.ceil((area.x + area.width) / GRID) - x0 + 1;
  const h = Math.ceil((area.y + area.height) / GRID) - y0 + 1;
  const inside = (gx: number, gy: number) => gx >= 0 && gy >= 0 && gx < w && gy < h;
  const targetSet = new Set(req.targets.map(pointKey));
  if (targetSet.size === 0) return null;
  const fx = from.x / GRID - x0, fy = from.y / GRID - y0;
  if (!inside(fx, fy)) return null;
  const heur = (gx: number, gy: number) => {
    let best = Infinity;
    for (const t of req.targets) best = Math.min(best, Math.abs(t.x / GRID - x0 - gx) + Math.abs(t.y / GRID - y0 - gy));
    return best;
  };
  const state = (gx: number, gy: number, d: number) => (gy * w + gx) * 4 + d;
  const cost = new Float64Array(w * h * 4).fill(Infinity);
  const prev = new Int32Array(w * h * 4).fill(-1);
  const heap = new Heap();
  const pref = req.side ? SIDE_DIR[req.side] : -1;
  for (let d = 0; d < 4; d++) {
    const s = state(fx, fy, d);
    cost[s] = pref === -1 || d === pref ? 0 : WRONG_START;
    heap.push(cost[s] + heur(fx, fy), s);
  }
  const world = (gx: number, gy: number): Point => ({ x: (gx + x0) * GRID, y: (gy + y0) * GRID });
  let found = -1;
  let budget = w * h * 16;
  while (heap.size > 0 && budget-- > 0) {
    const { f, s } = heap.pop();
    const d = s % 4, cell = (s - d) / 4;
    const gx = cell % w, gy = (cell - gx) / w;
    if (f - heur(gx, gy) > cost[s] + 1e-9) continue; // stale entry
    const here = world(gx, gy);
    const isStart = gx === fx && gy === fy;
    if (!isStart && targetSet.has(pointKey(here)) && occ.canStop(here, net)) { found = s; break; }
    for (let nd = 0; nd < 4; nd++) {
      if (nd === (d + 2) % 4) continue;
      const bend = nd !== d && !isStart;
      if (bend && !occ.canStop(here, net)) continue;
      const nx = gx + DIRS[nd].x, ny = gy + DIRS[nd].y;
      if (!inside(nx, ny)) continue;
      const next = world(nx, ny);
      const stopOk = targetSet.has(pointKey(next)) && occ.canStop(next, net);
      if (!stopOk && !occ.canPass(next, net, nd % 2 === 0 ? 'h' : 'v')) continue;
      const c = cost[s] + 1 + (bend ? BEND : 0);
      const ns = state(nx, ny, nd);
      if (c < cost[ns]) {
        cost[ns] = c;
        prev[ns] = s;
        heap.push(c + heur(nx, ny), ns);
      }
    }
  }
  if (found < 0) return null;
  const pts: Point[] = [];
  for (let s = found; s >= 0; s = prev[s]) {
    const cell = (s - (s % 4)) / 4;
    const gx = cell % w;
    pts.push(world(gx, (cell - gx) / w));
  }
  pts.reverse();
  return simplify(pts);
}
