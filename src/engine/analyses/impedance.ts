// Driving-point impedance of every node to ground, independent sources zeroed (they already are
// in G, C): Z_kk(s) = e_kᵀ(G + sC)⁻¹e_k. One LU per frequency, one (partial) solve per node.
// At DC a node reached only through capacitors is "open at DC": Z_kk(s → 0) is unbounded iff the
// 1/s residue W·K⁻¹·Vᵀ has a nonzero (k, k) entry (see dc.ts; for one null pair: v_k·w_k ≠ 0).

import type { Cx, MnaSystem } from '../types';
import { factorPencilAt, scaledInverseDiagonal } from './scaling';
import { dcBilinear, factorDc, type DcFactor } from './dc';

export type ImpedanceSys = Pick<MnaSystem, 'n' | 'nodeCount' | 'G' | 'C'>;

export interface DcImpedance {
  /** Ohms; null when open at DC (unbounded) or when the equations are singular. */
  ohms: number | null;
  openAtDc: boolean;
  reason?: string;
}

export function dcImpedances(sys: ImpedanceSys, dc: DcFactor = factorDc(sys)): DcImpedance[] {
  const out: DcImpedance[] = [];
  const e = new Float64Array(sys.n);
  for (let k = 0; k < sys.nodeCount; k++) {
    e.fill(0);
    e[k] = 1;
    const r = dcBilinear(dc, e, e);
    if (r.unbounded) out.push({ ohms: null, openAtDc: true, reason: 'open at DC: the node reaches ground only through capacitors' });
    else if (r.value === null) out.push({ ohms: null, openAtDc: false, reason: 'undefined at DC: a repeated pole at s = 0 (e.g. cascaded integrators) or degenerate DC equations' });
    else out.push({ ohms: r.value, openAtDc: false });
  }
  return out;
}

export interface ImpedanceAt {
  /** Complex ohms per node; null entries when s is (numerically) a pole. */
  values: (Cx | null)[];
  status: 'ok' | 'singular';
  reason?: string;
}

/** Z_kk(s) for every node, one complex LU of G + sC and one solve per node. */
export function impedancesAt(sys: ImpedanceSys, s: Cx): ImpedanceAt {
  const { n, nodeCount, G, C } = sys;
  const f = factorPencilAt(G, C, n, s);
  if (f.singular) {
    return { values: new Array(nodeCount).fill(null), status: 'singular', reason: 'G + sC is singular at this s (s is a pole)' };
  }
  const [dr, di] = scaledInverseDiagonal(f, nodeCount);
  const values: (Cx | null)[] = [];
  for (let k = 0; k < nodeCount; k++) {
    const z = { re: dr[k], im: di[k] };
    values.push(Number.isFinite(z.re) && Number.isFinite(z.im) ? z : null);
  }
  return { values, status: 'ok' };
}

/** Z_kk at frequency f (Hz): s = j·2πf; f = 0 goes through the DC path. */
export function impedancesAtHz(sys: ImpedanceSys, fHz: number, dc?: DcFactor): ImpedanceAt {
  if (fHz === 0) {
    const d = dcImpedances(sys, dc);
    return { values: d.map((z) => (z.ohms === null ? null : { re: z.ohms, im: 0 })), status: 'ok' };
  }
  return impedancesAt(sys, { re: 0, im: 2 * Math.PI * fHz });
}

export const magnitude = (z: Cx | null): number | null => (z ? Math.hypot(z.re, z.im) : null);
