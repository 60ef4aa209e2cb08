// Open-circuit time constants (Gray & Searle 1969; Gray & Meyer, Analysis and Design of Analog
// ICs): each capacitance sees, at DC with every other capacitor open and independent sources
// zeroed, the port resistance R = dᵀG⁻¹d, d = e_a − e_b (unit current injected across it).
// τ = R·C; ω₋₃dB ≈ 1/Στ. Per node: total capacitance touching it, τ_node = Z_kk(0)·C_node.

import type { Element, MnaSystem } from '../types';
import { dcBilinear, dcSolve, factorDc, type DcFactor } from './dc';
import type { DcImpedance } from './impedance';

export type OctcSys = Pick<MnaSystem, 'n' | 'nodeCount' | 'nodeNames' | 'G' | 'C' | 'elements'>;

export interface CapTimeConstant {
  part: string;
  role: string;
  /** Node names of the two plates ('0' for ground). */
  nodes: [string, string];
  farads: number;
  /** Resistance seen, ohms; null when unbounded (the port is open at DC). */
  ohms: number | null;
  /** τ = R·C in seconds; null when R is unbounded. */
  tau: number | null;
}

export interface OctcResult {
  caps: CapTimeConstant[];
  /** Στ in seconds; null when some τ is unbounded. */
  sumTau: number | null;
  /** 1/(2π·Στ) in Hz; null with a reason when Στ is unbounded or zero. */
  bandwidthHz: number | null;
  reason?: string;
}

const nodeName = (sys: OctcSys, i: number) => (i < 0 ? '0' : sys.nodeNames[i]);

export function openCircuitTimeConstants(sys: OctcSys, dc: DcFactor = factorDc(sys)): OctcResult {
  const caps: CapTimeConstant[] = [];
  const d = new Float64Array(sys.n);
  let sum = 0;
  let unbounded = false;
  let singular = false;
  // With G regular, R = X_aa + X_bb − X_ab − X_ba from the columns X = G⁻¹e_k of the cap nodes
  // (one solve per node instead of one per capacitor).
  const cols = new Map<number, Float64Array>();
  const col = (k: number) => {
    let x = cols.get(k);
    if (!x) { const e = new Float64Array(sys.n); e[k] = 1; x = dcSolve(dc, e)!.x; cols.set(k, x); }
    return x;
  };
  const seen = new Map<string, ReturnType<typeof dcBilinear>>();
  for (const el of sys.elements) {
    if (el.type !== 'capacitance' || el.c === 0 || el.a === el.b) continue;
    const key = `${Math.min(el.a, el.b)}:${Math.max(el.a, el.b)}`;
    let r = seen.get(key);
    if (!r && dc.status === 'regular') {
      const { a, b } = el;
      const xa = a >= 0 ? col(a) : null, xb = b >= 0 ? col(b) : null;
      const v = (xa ? xa[a] - (b >= 0 ? xa[b] : 0) : 0) + (xb ? xb[b] - (a >= 0 ? xb[a] : 0) : 0);
      r = Number.isFinite(v) ? { value: v, unbounded: false } : { value: null, unbounded: false, singular: true };
    }
    if (!r) {
      d.fill(0);
      if (el.a >= 0) d[el.a] += 1;
      if (el.b >= 0) d[el.b] -= 1;
      r = dcBilinear(dc, d, d);
    }
    seen.set(key, r);
    const ohms = r.value;
    if (r.unbounded) unbounded = true;
    else if (ohms === null) singular = true;
    const tau = ohms === null ? null : ohms * el.c;
    if (tau !== null) sum += tau;
    caps.push({ part: el.part, role: el.role, nodes: [nodeName(sys, el.a), nodeName(sys, el.b)], farads: el.c, ohms, tau });
  }
  if (singular) return { caps, sumTau: null, bandwidthHz: null, reason: 'undefined at DC: a repeated pole at s = 0 (e.g. cascaded integrators) or degenerate DC equations' };
  if (unbounded) return { caps, sumTau: null, bandwidthHz: null, reason: 'a capacitor sees an unbounded resistance (a pole at s = 0), so Στ is unbounded' };
  if (!(sum > 0)) return { caps, sumTau: sum, bandwidthHz: null, reason: caps.length ? 'Στ is not positive' : 'no capacitors' };
  return { caps, sumTau: sum, bandwidthHz: 1 / (2 * Math.PI * sum) };
}

export interface NodeTimeConstant {
  node: string;
  /** Sum of capacitances with a plate on this node, farads. */
  farads: number;
  /** Z_kk(0), ohms; null when open at DC. */
  ohms: number | null;
  /** τ_node = Z·C, seconds; null when Z is unbounded. */
  tau: number | null;
  /** 1/(2π·τ_node), Hz; 0 when open at DC (an integrator), null when τ is 0 (no capacitance). */
  poleHz: number | null;
  slowest: boolean;
}

/** Sum of capacitance touching each node (a cap between two nodes counts for both). */
export function nodeCapacitances(nodeCount: number, elements: Element[]): Float64Array {
  const cap = new Float64Array(nodeCount);
  for (const el of elements) {
    if (el.type !== 'capacitance' || el.a === el.b) continue;
    if (el.a >= 0) cap[el.a] += el.c;
    if (el.b >= 0) cap[el.b] += el.c;
  }
  return cap;
}

/** Node table; `zDc` from dcImpedances. The slowest node (largest τ, open-at-DC first) is marked. */
export function nodeTimeConstants(sys: OctcSys, zDc: DcImpedance[]): NodeTimeConstant[] {
  const cap = nodeCapacitances(sys.nodeCount, sys.elements);
  const rows: NodeTimeConstant[] = [];
  let slowest = -1;
  let slowestTau = -1;
  for (let k = 0; k < sys.nodeCount; k++) {
    const z = zDc[k];
    const farads = cap[k];
    let tau: number | null = null;
    let poleHz: number | null = null;
    if (z.openAtDc) {
      tau = null;
      poleHz = farads > 0 ? 0 : null;
    } else if (z.ohms !== null) {
      tau = Math.abs(z.ohms) * farads;
      poleHz = tau > 0 ? 1 / (2 * Math.PI * tau) : null;
    }
    // Nodes private to a part macro ("<part>#<label>") model that part's own poles; they are
    // listed but not chosen as the slowest node of the drawing.
    const key = z.openAtDc && farads > 0 ? Infinity : (tau ?? -1);
    if (!sys.nodeNames[k].includes('#') && key > slowestTau) { slowestTau = key; slowest = k; }
    rows.push({ node: sys.nodeNames[k], farads, ohms: z.ohms, tau, poleHz, slowest: false });
  }
  if (slowest >= 0 && slowestTau > 0) rows[slowest].slowest = true;
  return rows;
}
