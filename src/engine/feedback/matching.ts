// Matching two pole sets: minimum-cost assignment (Hungarian method, Kuhn 1955, with the
// shortest-augmenting-path potentials of Jonker & Volgenant 1987) on a log-distance between poles.
import type { Cx } from '../types';
import { hypot2 } from './cx';

/** Distance between two poles on log |p| and angle, so a decade counts the same at any speed;
 *  poles at the origin are put at a floor magnitude. */
export function poleDistance(a: Cx, b: Cx, floor = 1e-3): number {
  const ma = Math.max(hypot2(a.re, a.im), floor);
  const mb = Math.max(hypot2(b.re, b.im), floor);
  const da = Math.log(ma / mb);
  let dArg = Math.atan2(a.im, a.re) - Math.atan2(b.im, b.re);
  while (dArg > Math.PI) dArg -= 2 * Math.PI;
  while (dArg < -Math.PI) dArg += 2 * Math.PI;
  return hypot2(da, dArg);
}

/** Minimum-cost assignment of rows to columns for a rows×cols cost (row-major). Returns for each
 *  row its column or −1 (when rows > cols). Square padding with zero-cost dummies. */
export function assign(cost: Float64Array, rows: number, cols: number): Int32Array {
  const n = Math.max(rows, cols);
  const c = (i: number, j: number) => (i < rows && j < cols ? cost[i * cols + j] : 0);
  const INF = Infinity;
  const u = new Float64Array(n + 1);
  const v = new Float64Array(n + 1);
  const p = new Int32Array(n + 1); // p[j] = row matched to column j (1-based), 0 = free
  const way = new Int32Array(n + 1);
  for (let i = 1; i <= n; i++) {
    p[0] = i;
    let j0 = 0;
    const minv = new Float64Array(n + 1).fill(INF);
    const used = new Uint8Array(n + 1);
    do {
      used[j0] = 1;
      const i0 = p[j0];
      let delta = INF;
      let j1 = 0;
      for (let j = 1; j <= n; j++) {
        if (used[j]) continue;
        const cur = c(i0 - 1, j - 1) - u[i0] - v[j];
        if (cur < minv[j]) { minv[j] = cur; way[j] = j0; }
        if (minv[j] < delta) { delta = minv[j]; j1 = j; }
      }
      for (let j = 0; j <= n; j++) {
        if (used[j]) { u[p[j]] += delta; v[j] -= delta; } else minv[j] -= delta;
      }
      j0 = j1;
    } while (p[j0] !== 0);
    do {
      const j1 = way[j0];
      p[j0] = p[j1];
      j0 = j1;
    } while (j0);
  }
  const out = new Int32Array(rows).fill(-1);
  for (let j = 1; j <= n; j++) {
    const i = p[j] - 1;
    if (i >= 0 && i < rows && j - 1 < cols) out[i] = j - 1;
  }
  return out;
}

/** Match poles `a` to poles `b`; pairs farther apart than `maxDistance` are left unmatched. */
export function matchPoles(a: Cx[], b: Cx[], maxDistance = Infinity): Int32Array {
  const cost = new Float64Array(a.length * b.length);
  // magnitudes and angles once per pole; each pair then as in poleDistance (same operations)
  const floor = 1e-3;
  const ma = a.map((p) => Math.max(hypot2(p.re, p.im), floor)), mb = b.map((p) => Math.max(hypot2(p.re, p.im), floor));
  const aa = a.map((p) => Math.atan2(p.im, p.re)), ab = b.map((p) => Math.atan2(p.im, p.re));
  for (let i = 0; i < a.length; i++) {
    for (let j = 0; j < b.length; j++) {
      const da = Math.log(ma[i] / mb[j]);
      let dArg = aa[i] - ab[j];
      while (dArg > Math.PI) dArg -= 2 * Math.PI;
      while (dArg < -Math.PI) dArg += 2 * Math.PI;
      cost[i * b.length + j] = hypot2(da, dArg);
    }
  }
  const m = assign(cost, a.length, b.length);
  for (let i = 0; i < a.length; i++) if (m[i] >= 0 && cost[i * b.length + m[i]] > maxDistance) m[i] = -1;
  return m;
}
