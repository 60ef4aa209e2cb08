// Blackman's impedance formula (Blackman 1943): the impedance from a node to ground is
//   Z = Z⁰·(1 + T_sc)/(1 + T_oc)
// with Z⁰ the impedance with the key source set to zero, and T_sc / T_oc the key source's return
// ratios with that node shorted to ground / left open. Here T_oc is the plain return ratio, and the
// shorted case follows from the source-removed network M⁰ by holding the node at 0 V with a current
// (Schur complement): T_sc = T_oc − (vᵀM⁰⁻¹e_X)(e_XᵀM⁰⁻¹u)/Z⁰_X. Z itself is solved directly
// from the full network, so Z = Z⁰(1+T_sc)/(1+T_oc) is a consistency check, not an identity of code.
import type { Cx, MnaSystem } from '../types';
import { PencilAt, addRankOne, scaledG, sourceStamps, uVector, vVector } from './pencil';
import { scaleStamp } from './returnRatio';
import { cabs, cadd, cdiv, cmul, csub, cx } from './cx';

export interface BlackmanNode {
  node: string;
  index: number;
  /** Impedance to ground with everything in place (solved directly). */
  z: Cx;
  /** Impedance with the key source set to zero. */
  z0: Cx;
  tSc: Cx;
  tOc: Cx;
  /** Z/Z⁰ = (1 + T_sc)/(1 + T_oc). */
  factor: Cx;
  /** 'held': the node is tied to ground by an ideal source with the key removed (Z⁰ = 0). */
  status: 'ok' | 'held';
}

export interface BlackmanResult {
  key: string;
  fHz: number;
  status: 'ok' | 'unknown-source' | 'singular';
  message?: string;
  tOc: Cx | null;
  nodes: BlackmanNode[];
}

export function blackmanAt(sys: MnaSystem, key: string, opts: { fHz?: number; scale?: Record<string, number> } = {}): BlackmanResult {
  const fHz = opts.fHz ?? 0;
  const n = sys.n;
  const stamps = sourceStamps(sys);
  const raw = stamps.find((s) => s.id === key);
  if (!raw) return { key, fHz, status: 'unknown-source', message: `no controlled source "${key}" in this network`, tOc: null, nodes: [] };
  const G = scaledG(sys, stamps, opts.scale ?? {});
  const s = scaleStamp(raw, opts.scale?.[key]);
  const G0 = Float64Array.from(G);
  addRankOne(G0, n, s, -1);
  const omega = 2 * Math.PI * fHz;
  const full = new PencilAt(G, sys.C, n, omega);
  const cut = new PencilAt(G0, sys.C, n, omega);
  if (full.singular || cut.singular) {
    const which = full.singular ? 'the network' : `the network with ${key} removed`;
    return { key, fHz, status: 'singular', message: `${which} is singular at ${fHz} Hz (a node with no path to ground)`, tOc: null, nodes: [] };
  }
  const u = uVector(s, n);
  const v = vVector(s, n);
  const m0u = cut.solve(u); // M⁰⁻¹u
  const vm0 = cut.solveTransposed(v); // (vᵀM⁰⁻¹)ᵀ
  let tOc = cx(0);
  for (let i = 0; i < n; i++) { tOc = cadd(tOc, cmul(cx(v[i]), cx(m0u.re[i], m0u.im[i]))); }
  const nodes: BlackmanNode[] = [];
  let zScale = 0;
  const rows: { z: Cx; z0: Cx; i: number }[] = [];
  for (let i = 0; i < sys.nodeCount; i++) {
    const e = new Float64Array(n);
    e[i] = 1;
    const xf = full.solve(e);
    const x0 = cut.solve(e);
    const z = cx(xf.re[i], xf.im[i]);
    const z0 = cx(x0.re[i], x0.im[i]);
    zScale = Math.max(zScale, cabs(z0), cabs(z));
    rows.push({ z, z0, i });
  }
  for (const { z, z0, i } of rows) {
    const name = sys.nodeNames[i];
    // vᵀM⁰⁻¹e_X and e_XᵀM⁰⁻¹u
    const a = cx(vm0.re[i], vm0.im[i]);
    const b = cx(m0u.re[i], m0u.im[i]);
    if (cabs(z0) <= 1e-12 * zScale) {
      nodes.push({ node: name, index: i, z, z0, tSc: tOc, tOc, factor: cx(1), status: 'held' });
      continue;
    }
    const tSc = csub(tOc, cdiv(cmul(a, b), z0)!);
    const factor = cdiv(cadd(cx(1), tSc), cadd(cx(1), tOc)) ?? cx(Infinity);
    nodes.push({ node: name, index: i, z, z0, tSc, tOc, factor, status: 'ok' });
  }
  return { key, fHz, status: 'ok', tOc, nodes };
}
