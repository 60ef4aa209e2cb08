// Where each pole lives: participation of node unknown k in mode λ, p_k = |x_k·y_k| with x, y the
// right and left eigenvectors of (−G, C) (Pérez-Arriaga, Verghese & Schweppe 1982), normalised to
// sum 1 over the node unknowns. When the left vector is unreliable (large residual, or it carries
// almost no weight on the nodes) the right vector's energy |x_k|² is used instead.
// Vectors come from one shared Hessenberg reduction (modal.ts, O(n²) per pole) when their residual
// is small, else from a full inverse iteration per pole (linalg/eigvec).

import type { MnaSystem } from '../types';
import type { Pole } from './poles';
import type { ShiftedReduction } from './hessenberg';
import { poleVectors, type ModalVectors } from './modal';

export interface NodeShare {
  node: string;
  share: number;
}

export interface PoleParticipation {
  /** Index into the pole list. */
  pole: number;
  /** Nodes carrying the pole, largest share first (shares over all nodes sum to 1). */
  nodes: NodeShare[];
  method: 'left-right' | 'right-only' | 'unavailable';
  residual: number;
}

const RESIDUAL_OK = 1e-6;

export function poleParticipation(
  sys: Pick<MnaSystem, 'n' | 'nodeCount' | 'nodeNames' | 'G' | 'C'>,
  poles: Pole[],
  opts: { top?: number; reduction?: ShiftedReduction | null; vectors?: ModalVectors[] } = {},
): PoleParticipation[] {
  const { n, nodeCount, nodeNames } = sys;
  const top = opts.top ?? 3;
  const vectors = opts.vectors ?? poleVectors(sys, poles, opts.reduction);
  const out: PoleParticipation[] = [];
  const byPair = new Map<string, PoleParticipation>();
  poles.forEach((p, idx) => {
    // A conjugate pair shares its participation (the vectors are conjugates).
    const key = `${p.re}:${Math.abs(p.im)}`;
    const twin = byPair.get(key);
    if (twin) { out.push({ ...twin, pole: idx }); return; }
    const v = vectors[idx];
    const w = new Float64Array(nodeCount);
    let sumLR = 0, normX = 0, normY = 0;
    for (let k = 0; k < n; k++) {
      const xm = Math.hypot(v.rightRe[k], v.rightIm[k]);
      const ym = Math.hypot(v.leftRe[k], v.leftIm[k]);
      normX = Math.max(normX, xm);
      normY = Math.max(normY, ym);
      if (k < nodeCount) { w[k] = xm * ym; sumLR += w[k]; }
    }
    let method: PoleParticipation['method'] = 'left-right';
    const finite = Number.isFinite(v.residual) && Number.isFinite(sumLR);
    if (!finite || v.residual > RESIDUAL_OK || !(sumLR > 1e-10 * normX * normY)) {
      method = 'right-only';
      let s = 0;
      for (let k = 0; k < nodeCount; k++) { const xm = Math.hypot(v.rightRe[k], v.rightIm[k]); w[k] = xm * xm; s += w[k]; }
      sumLR = s;
      if (!(s > 0) || !Number.isFinite(s)) method = 'unavailable';
    }
    const nodes: NodeShare[] = [];
    if (method !== 'unavailable') {
      for (let k = 0; k < nodeCount; k++) nodes.push({ node: nodeNames[k], share: w[k] / sumLR });
      nodes.sort((a, b) => b.share - a.share);
    }
    const entry: PoleParticipation = { pole: idx, nodes: nodes.slice(0, top), method, residual: Number.isFinite(v.residual) ? v.residual : -1 };
    byPair.set(key, entry);
    out.push(entry);
  });
  return out;
}
