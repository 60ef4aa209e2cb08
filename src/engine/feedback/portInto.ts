// Blackman's factor for the impedance looking INTO a part at one of its nodes (e.g. into a cascode's
// drain), not the node's impedance to ground: a loaded output node is set by its load, while the
// designer's "Rout of the current source" is the impedance of the part side alone. The node is split
// in two (the part's own elements move to a fresh unknown X′, everything else stays), and Blackman's
// formula (Blackman 1943) is applied at X′: Z = Z⁰·(1 + T_sc)/(1 + T_oc), T_sc with X′ shorted to
// ground, T_oc with X′ open (the part's terminal current held at zero).
import type { Cx, Element, MnaSystem } from '../types';
import { PencilAt, addRankOne, scaledG, sourceStamps, uVector, vVector } from './pencil';
import type { SourceStamp } from './pencil';
import { scaleStamp } from './returnRatio';
import { cadd, cdiv, cmul, csub, cx } from './cx';

export interface PortFactor {
  part: string;
  node: string;
  /** Impedance looking into the part at that node, with and without the key source. */
  z: Cx;
  z0: Cx;
  /** Z/Z⁰ = (1 + T_sc)/(1 + T_oc). */
  factor: Cx;
}

/** Factor looking into `part` at node index `node`; null when the split network is singular, the
 *  part has no element there, or the key is unknown. */
export function portFactor(
  sys: MnaSystem, key: string, part: string, node: number, opts: { fHz?: number; scale?: Record<string, number> } = {},
): PortFactor | null {
  const scale = opts.scale ?? {};
  const stamps = sourceStamps(sys);
  const raw = stamps.find((s) => s.id === key);
  if (!raw || node < 0 || node >= sys.nodeCount) return null;
  const n = sys.n;
  const m = n + 1; // X′ is the last unknown
  const G = embed(scaledG(sys, stamps, scale), n, m);
  const C = embed(sys.C, n, m);
  let moved = false;
  for (const el of sys.elements) {
    if (el.part !== part) continue;
    const k = el.type === 'vccs' || el.type === 'vcvs' ? (scale[el.id] ?? 1) : 1;
    moved = moveElement(G, C, m, sys.nodeCount, el, node, n, k) || moved;
  }
  if (!moved) return null;
  const remap = (v: number) => (v === node ? n : v);
  let s: SourceStamp = scaleStamp(raw, scale[key]);
  if (s.part === part) s = { ...s, uRows: s.uRows.map(remap), cp: remap(s.cp), cn: remap(s.cn) };
  const G0 = Float64Array.from(G);
  addRankOne(G0, m, s, -1);
  const omega = 2 * Math.PI * (opts.fHz ?? 0);
  const full = new PencilAt(G, C, m, omega);
  const cut = new PencilAt(G0, C, m, omega);
  if (full.singular || cut.singular) return null;
  const e = new Float64Array(m);
  e[n] = 1;
  const xf = full.solve(e);
  const x0 = cut.solve(e);
  const z = cx(xf.re[n], xf.im[n]);
  const z0 = cx(x0.re[n], x0.im[n]);
  if (z0.re === 0 && z0.im === 0) return null;
  const u = uVector(s, m);
  const v = vVector(s, m);
  const m0u = cut.solve(u);
  const vm0 = cut.solveTransposed(v);
  let tOc = cx(0);
  for (let i = 0; i < m; i++) if (v[i]) tOc = cadd(tOc, cmul(cx(v[i]), cx(m0u.re[i], m0u.im[i])));
  // T_sc = T_oc − (vᵀM⁰⁻¹e_X)(e_XᵀM⁰⁻¹u)/Z⁰_X (Schur complement, as in blackman.ts)
  const tSc = csub(tOc, cdiv(cmul(cx(vm0.re[n], vm0.im[n]), cx(m0u.re[n], m0u.im[n])), z0)!);
  const factor = cdiv(cadd(cx(1), tSc), cadd(cx(1), tOc));
  if (!factor) return null;
  return { part, node: sys.nodeNames[node], z, z0, factor };
}

function embed(A: Float64Array, n: number, m: number): Float64Array {
  const out = new Float64Array(m * m);
  for (let i = 0; i < n; i++) out.set(A.subarray(i * n, i * n + n), i * m);
  return out;
}

/** Move the element's connections at `node` to `to` (in place); false when it has none there.
 *  Two-terminal and VCCS stamps are taken out and put back with the new index (value × k for a
 *  scaled source); a branch element's row and column entries move as they are. */
function moveElement(G: Float64Array, C: Float64Array, m: number, nodeCount: number, el: Element, node: number, to: number, k: number): boolean {
  const map = (v: number) => (v === node ? to : v);
  const add = (M: Float64Array, i: number, j: number, val: number) => { if (i >= 0 && j >= 0) M[i * m + j] += val; };
  const twoTerminal = (M: Float64Array, a: number, b: number, val: number, sign: number) => {
    add(M, a, a, sign * val); add(M, b, b, sign * val); add(M, a, b, -sign * val); add(M, b, a, -sign * val);
  };
  const vccs = (p: number, q: number, cp: number, cn: number, gm: number, sign: number) => {
    add(G, p, cp, sign * gm); add(G, p, cn, -sign * gm); add(G, q, cp, -sign * gm); add(G, q, cn, sign * gm);
  };
  switch (el.type) {
    case 'conductance':
    case 'capacitance': {
      if (el.a !== node && el.b !== node) return false;
      const M = el.type === 'conductance' ? G : C;
      const val = el.type === 'conductance' ? el.g : el.c;
      twoTerminal(M, el.a, el.b, val, -1);
      twoTerminal(M, map(el.a), map(el.b), val, 1);
      return true;
    }
    case 'vccs': {
      if (![el.p, el.n, el.cp, el.cn].includes(node)) return false;
      vccs(el.p, el.n, el.cp, el.cn, el.gm * k, -1);
      vccs(map(el.p), map(el.n), map(el.cp), map(el.cn), el.gm * k, 1);
      return true;
    }
    case 'vcvs':
    case 'vsource':
    case 'inductance': {
      const pins = el.type === 'vcvs' ? [el.p, el.n, el.cp, el.cn] : el.type === 'vsource' ? [el.p, el.n] : [el.a, el.b];
      if (!pins.includes(node)) return false;
      const r = nodeCount + el.branch;
      G[r * m + to] += G[r * m + node]; G[r * m + node] = 0;
      G[to * m + r] += G[node * m + r]; G[node * m + r] = 0;
      return true;
    }
    default:
      return false;
  }
}
