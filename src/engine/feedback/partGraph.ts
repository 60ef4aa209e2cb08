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
      const r = cmatDetInv(cmatIdentityMinus(couplingBlock(g, fi, list, list)), true);
      dRow.push(r.det);
      hRow.push(r.inv);
    }
    det.push(dRow);
    h.push(hRow);
  }
  return { det, h };
}

/** Local loop gain of part p at frequency index fi: det(I − D_pp) − 1. */
export function localGain(cl: PartClosures, p: number, fi: number): Cx {
  const d = cl.det[fi][p];
  return { re: d.re - 1, im: d.im };
}

/** Gain of the part cycle (part indices, closing last → first) at frequency index fi; null when a
 *  part's own loop is exactly at the edge (I − D_PP singular). */
export function partCycleGain(g: CouplingGraph, pg: PartGraph, cl: PartClosures, cycle: number[], fi: number): Cx | null {
  let L: CMat | null = null;
  for (let k = 0; k < cycle.length; k++) {
    const a = cycle[k], b = cycle[(k + 1) % cycle.length];
    const hb = cl.h[fi][b];
    if (!hb) return null;
    const step = cmatMul(couplingBlock(g, fi, pg.sourcesOf[a], pg.sourcesOf[b]), hb);
    L = L ? cmatMul(L, step) : step;
  }
  const d = cmatDetInv(cmatIdentityMinus(L!), false).det;
  return { re: d.re - 1, im: d.im };
}
