// Part-level view of the coupling graph (coupling.ts): the controlled sources of one part (a MOSFET's
// gm and gmb, an amplifier macro's A0, stage2 and out) are one vertex, and part i → part j is an edge
// when some source of i moves some control of j.
//
// Gains, with D the source coupling matrix (c_j = Σ_i d_ij·c_i, all sources cut) and D_PQ its block
// from the sources of P to those of Q (row-vector convention, c_Q = c_P·D_PQ):
//   local loop of P:   T_P = det(I − D_PP) − 1 — the return difference of the part alone, so a
//                      MOSFET's gm and gmb sharing its source node count as one loop:
//                      (gm + gmb)·R for a follower into R (common practice);
//   cycle P1 → … → Pk: T = det(I − L) − 1 with L = D_12·H_2·D_23·H_3 ⋯ D_k1·H_1 and H_P = (I − D_PP)⁻¹,
//                      the cycle's transmission with each part's own local loop closed (Mason 1953
//                      applied to the block graph). For single-source parts both reduce to −∏d.
import type { Cx } from '../types';
import type { CouplingGraph } from './coupling';
import { cmatDetInv, cmatIdentityMinus, cmatMul, cmatZeros } from './cmat';
import type { CMat } from './cmat';
import { hypot2 } from './cx';

/** Roles of the chain inside an amplifier macro (stamps/amplifier.ts). */
export const MACRO_ROLES = ['A0', 'stage2', 'out'];

export interface PartGraph {
  parts: string[];
  /** Source-vertex indices (into graph.stamps) of each part. */
  sourcesOf: number[][];
  partOf: Int32Array;
  /** max over frequency and source pairs of |d| from part a to part b (a ≠ b), [a*P + b]; 0 on the diagonal. */
  peak: Float64Array;
  /** The part is an amplifier macro: its loops close outside it. */
  macro: boolean[];
}

export function buildPartGraph(g: CouplingGraph): PartGraph {
  const N = g.stamps.length;
  const parts: string[] = [];
  const sourcesOf: number[][] = [];
  const partOf = new Int32Array(N);
  for (let i = 0; i < N; i++) {
    let p = parts.indexOf(g.stamps[i].part);
    if (p < 0) { parts.push(g.stamps[i].part); sourcesOf.push([]); p = parts.length - 1; }
    sourcesOf[p].push(i);
    partOf[i] = p;
  }
  const P = parts.length;
  const peak = new Float64Array(P * P);
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      const a = partOf[i], b = partOf[j];
      if (a === b) continue;
      const v = g.peak[i * N + j];
      if (v > peak[a * P + b]) peak[a * P + b] = v;
    }
  }
  const macro = sourcesOf.map((list) => list.some((i) => MACRO_ROLES.includes(g.stamps[i].role)));
  return { parts, sourcesOf, partOf, peak, macro };
}

/** Block of D at frequency index fi: rows = sources of `from`, columns = sources of `to`. */
export function couplingBlock(g: CouplingGraph, fi: number, from: number[], to: number[]): CMat {
  const N = g.stamps.length;
  const m = cmatZeros(from.length, to.length);
  for (let a = 0; a < from.length; a++) {
    for (let b = 0; b < to.length; b++) {
      m.re[a * to.length + b] = g.re[fi][from[a] * N + to[b]];
      m.im[a * to.length + b] = g.im[fi][from[a] * N + to[b]];
    }
  }
  return m;
}

/** Per frequency and part: det(I − D_PP) and H_P = (I − D_PP)⁻¹ (null when singular). */
export interface PartClosures { det: Cx[][]; h: (CMat | null)[][] }

export function partClosures(g: CouplingGraph, pg: PartGraph): PartClosures {
  const det: Cx[][] = [];
  const h: (CMat | null)[][] = [];
  for (let fi = 0; fi < g.fHz.length; fi++) {
    const dRow: Cx[] = [];
    const hRow: (CMat | null)[] = [];
    for (const list of pg.sourcesOf) {
      const r = list.length === 1 ? closeOne(g, fi, list[0]) : cmatDetInv(cmatIdentityMinus(couplingBlock(g, fi, list, list)), true);
      dRow.push(r.det);
      hRow.push(r.inv);
    }
    det.push(dRow);
    h.push(hRow);
  }
  return { det, h };
}

/** cmatDetInv(I − [d_ii]) for a one-source part without the general elimination: the same
 *  operations on the 1 × 1 case (det = pivot, inverse = 1/pivot). */
function closeOne(g: CouplingGraph, fi: number, i: number): { det: Cx; inv: CMat | null } {
  const N = g.stamps.length;
  const pr = 1 - g.re[fi][i * N + i], pi = -g.im[fi][i * N + i];
  if (hypot2(pr, pi) === 0) return { det: { re: 0, im: 0 }, inv: null };
  const q = pr * pr + pi * pi;
  const inv: CMat = { rows: 1, cols: 1, re: new Float64Array([(1 * pr + 0 * pi) / q]), im: new Float64Array([(0 * pr - 1 * pi) / q]) };
  return { det: { re: 1 * pr - 0 * pi, im: 1 * pi + 0 * pr }, inv };
}

/** Local loop gain of part p at frequency index fi: det(I − D_pp) − 1. */
export function localGain(cl: PartClosures, p: number, fi: number): Cx {
  const d = cl.det[fi][p];
  return { re: d.re - 1, im: d.im };
}

/** Gain of the part cycle (part indices, closing last → first) at frequency index fi; null when a
 *  part's own loop is exactly at the edge (I − D_PP singular). `steps` caches D_ab·H_b per part edge
 *  and frequency across calls (key a·P + b). */
export function partCycleGain(
  g: CouplingGraph, pg: PartGraph, cl: PartClosures, cycle: number[], fi: number, steps?: Map<number, (CMat | null)[]>,
): Cx | null {
  const P = pg.parts.length;
  let L: CMat | null = null;
  for (let k = 0; k < cycle.length; k++) {
    const a = cycle[k], b = cycle[(k + 1) % cycle.length];
    let row = steps?.get(a * P + b);
    if (!row) { row = new Array(g.fHz.length).fill(undefined); steps?.set(a * P + b, row); }
    let step = row[fi];
    if (step === undefined) {
      const hb = cl.h[fi][b];
      step = hb ? cmatMul(couplingBlock(g, fi, pg.sourcesOf[a], pg.sourcesOf[b]), hb) : null;
      row[fi] = step;
    }
    if (!step) return null;
    L = L ? cmatMul(L, step) : step;
  }
  const d = cmatDetInv(cmatIdentityMinus(L!), false).det;
  return { re: d.re - 1, im: d.im };
}

/** Evaluates part-cycle gains at every sweep frequency without per-call allocation: the steps
 *  D_ab·H_b are formed once per part edge (all frequencies) and a cycle is started at its part with
 *  the fewest sources (det(I − L) does not depend on where L starts, det(I − AB) = det(I − BA)). */
export class CycleEvaluator {
  private readonly steps = new Map<number, Float64Array | null>();
  private readonly F: number;
  private readonly P: number;
  private readonly size: number[];
  private readonly vr: Float64Array;
  private readonly vi: Float64Array;
  private readonly wr: Float64Array;
  private readonly wi: Float64Array;

  constructor(private readonly g: CouplingGraph, private readonly pg: PartGraph, private readonly cl: PartClosures) {
    this.F = g.fHz.length;
    this.P = pg.parts.length;
    this.size = pg.sourcesOf.map((l) => l.length);
    const m = Math.max(1, ...this.size);
    this.vr = new Float64Array(m); this.vi = new Float64Array(m);
    this.wr = new Float64Array(m); this.wi = new Float64Array(m);
  }

  /** D_ab·H_b for every frequency, [fi][row][col][re,im] flattened; null when some H_b is singular. */
  private step(a: number, b: number): Float64Array | null {
    const key = a * this.P + b;
    if (this.steps.has(key)) return this.steps.get(key)!;
    const ra = this.size[a], cb = this.size[b];
    const out = new Float64Array(this.F * ra * cb * 2);
    let ok = true;
    for (let fi = 0; fi < this.F && ok; fi++) {
      const hb = this.cl.h[fi][b];
      if (!hb) { ok = false; break; }
      // D_ab·H_b straight into the buffer (same sums, in the same order, as cmatMul)
      const from = this.pg.sourcesOf[a], to = this.pg.sourcesOf[b];
      const dr = this.g.re[fi], di = this.g.im[fi];
      const N = this.g.stamps.length;
      const base = fi * ra * cb * 2;
      for (let i = 0; i < ra; i++) {
        for (let k = 0; k < cb; k++) {
          const ar = dr[from[i] * N + to[k]], ai = di[from[i] * N + to[k]];
          if (ar === 0 && ai === 0) continue;
          for (let j = 0; j < cb; j++) {
            const br = hb.re[k * cb + j], bi = hb.im[k * cb + j];
            out[base + 2 * (i * cb + j)] += ar * br - ai * bi;
            out[base + 2 * (i * cb + j) + 1] += ar * bi + ai * br;
          }
        }
      }
    }
    const v = ok ? out : null;
    this.steps.set(key, v);
    return v;
  }

  /** Complex gains det(I − L) − 1 per frequency as [re0, im0, re1, im1, …]; null when not defined. */
  gains(cycle: number[]): Float64Array | null {
    const size = this.size;
    const len0 = cycle.length;
    let start = 0;
    for (let k = 1; k < len0; k++) if (size[cycle[k]] < size[cycle[start]]) start = k;
    const stepList: Float64Array[] = new Array(len0);
    const colsOf = new Int32Array(len0);
    for (let k = 0; k < len0; k++) {
      const a = cycle[(start + k) % len0], b = cycle[(start + k + 1) % len0];
      const s = this.step(a, b);
      if (!s) return null;
      stepList[k] = s;
      colsOf[k] = size[b];
    }
    const m = size[cycle[start]];
    const F = this.F;
    const out = new Float64Array(F * 2);
    const L = m === 1 ? null : cmatZeros(m, m);
    const vr = this.vr, vi = this.vi, wr = this.wr, wi = this.wi;
    for (let fi = 0; fi < F; fi++) {
      let l0r = 0, l0i = 0;
      for (let row = 0; row < m; row++) {
        // row vector e_row pushed through the chain of steps
        vr.fill(0); vi.fill(0); vr[row] = 1;
        let len = m;
        for (let k = 0; k < len0; k++) {
          const cols = colsOf[k];
          const s = stepList[k];
          const base = fi * len * cols * 2;
          for (let j = 0; j < cols; j++) {
            let sr = 0, si = 0;
            for (let i = 0; i < len; i++) {
              const at = base + 2 * (i * cols + j);
              const er = s[at], ei = s[at + 1];
              sr += vr[i] * er - vi[i] * ei;
              si += vr[i] * ei + vi[i] * er;
            }
            wr[j] = sr; wi[j] = si;
          }
          for (let j = 0; j < cols; j++) { vr[j] = wr[j]; vi[j] = wi[j]; }
          len = cols;
        }
        if (L) { for (let j = 0; j < m; j++) { L.re[row * m + j] = vr[j]; L.im[row * m + j] = vi[j]; } } else { l0r = vr[0]; l0i = vi[0]; }
      }
      let dr: number, di: number;
      if (!L) { dr = 1 - l0r; di = -l0i; } else {
        const d = cmatDetInv(cmatIdentityMinus(L), false).det;
        dr = d.re; di = d.im;
      }
      out[2 * fi] = dr - 1; out[2 * fi + 1] = di;
    }
    return out;
  }
}
