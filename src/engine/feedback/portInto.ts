// Blackman's factor for the impedance looking INTO a part at one of its nodes (e.g. into a cascode's
// drain), not the node's impedance to ground: a loaded output node is set by its load, while the
// designer's "Rout of the current source" is the impedance of the part side alone. The node is split
// in two (the part's own elements move to a fresh unknown X′, everything else stays), and Blackman's
// formula (Blackman 1943) is applied at X′: Z = Z⁰·(1 + T_sc)/(1 + T_oc), T_sc with X′ shorted to
// ground, T_oc with X′ open (the part's terminal current held at zero). One factor of the split
// network per (part, node, frequency) serves every key; the key-removed quantities follow by
// Sherman–Morrison as in blackman.ts.
import type { Cx, Element, MnaSystem } from '../types';
import { PencilAt, scaledG, sourceStamps, uVector, vVector } from './pencil';
import type { SourceStamp } from './pencil';
import { scaleStamp } from './returnRatio';
import { SplitBorder } from './splitBorder';
import { cabs, cadd, cdiv, cmul, csub, cx } from './cx';

export interface PortFactor {
  part: string;
  node: string;
  /** Impedance looking into the part at that node, with and without the key source. */
  z: Cx;
  z0: Cx;
  /** Z/Z⁰ = (1 + T_sc)/(1 + T_oc). */
  factor: Cx;
}

/** The network with `part`'s connections at a node moved to a fresh last unknown X′, factored at
 *  one frequency; shared by every key (Sherman–Morrison per key, as in blackman.ts). */
export interface SplitNetwork {
  part: string;
  node: number;
  m: number;
  /** The split network's own factor; null when it is worked from the full network's factor
   *  (`border`, splitBorder.ts). */
  pencil: PencilAt | null;
  border: SplitBorder | null;
  /** Impedance to ground at X′ with everything in place. */
  z: Cx;
}

export function splitNetwork(
  sys: MnaSystem, part: string, node: number,
  opts: { fHz?: number; scale?: Record<string, number>; G?: Float64Array; full?: PencilAt } = {},
): SplitNetwork | null {
  if (node < 0 || node >= sys.nodeCount) return null;
  const scale = opts.scale ?? {};
  const n = sys.n;
  const m = n + 1;
  const omega = 2 * Math.PI * (opts.fHz ?? 0);
  // `opts.G`: G with the scales already applied, when the caller holds it
  const Gn = opts.G ?? scaledG(sys, sourceStamps(sys), scale);
  const own = sys.elements.filter((el) => el.part === part);
  const gainOf = (el: Element) => (el.type === 'vccs' || el.type === 'vcvs' ? (scale[el.id] ?? 1) : 1);
  // `opts.full`: the full network (same scales) factored at this frequency; then only the border
  // of the split matrix (row and column X′) is needed (splitBorder.ts)
  if (opts.full && !opts.full.singular && opts.full.omega === omega) {
    const bd = { gb: new Float64Array(n), gc: new Float64Array(n), cb: new Float64Array(n), cc: new Float64Array(n), gd: 0, cd: 0 };
    const add = (isC: boolean, i: number, j: number, val: number) => {
      if (i < 0 || j < 0) return;
      if (i === n && j === n) { if (isC) bd.cd += val; else bd.gd += val; } else if (j === n) (isC ? bd.cb : bd.gb)[i] += val;
      else if (i === n) (isC ? bd.cc : bd.gc)[j] += val;
    };
    let moved = false;
    for (const el of own) moved = moveElement(add, (i, j) => Gn[i * n + j], sys.nodeCount, el, node, n, gainOf(el)) || moved;
    if (!moved) return null;
    const border = SplitBorder.of(bd, n, node, omega, opts.full);
    if (border) return { part, node, m, pencil: null, border, z: border.z };
  }
  const G = embed(Gn, n, m);
  const C = embed(sys.C, n, m);
  const add = (isC: boolean, i: number, j: number, val: number) => { if (i >= 0 && j >= 0) (isC ? C : G)[i * m + j] += val; };
  let moved = false;
  for (const el of own) moved = moveElement(add, (i, j) => G[i * m + j], sys.nodeCount, el, node, n, gainOf(el)) || moved;
  if (!moved) return null;
  const pencil = new PencilAt(G, C, m, omega);
  if (pencil.singular) return null;
  const e = new Float64Array(m);
  e[n] = 1;
  const x = pencil.solve(e);
  return { part, node, m, pencil, border: null, z: cx(x.re[n], x.im[n]) };
}

/** Factor looking into the split part for one key; null when the key is unknown or the
 *  key-removed split network is singular (1 − a ≈ 0). */
export function portFactor(
  sys: MnaSystem, key: string, split: SplitNetwork, scale: Record<string, number> = {}, stamps: SourceStamp[] = sourceStamps(sys),
): PortFactor | null {
  const raw = stamps.find((s) => s.id === key);
  if (!raw) return null;
  const { m, node, z } = split;
  const x = m - 1;
  const remap = (v: number) => (v === node ? x : v);
  let s: SourceStamp = scaleStamp(raw, scale[key]);
  if (s.part === split.part) s = { ...s, uRows: s.uRows.map(remap), cp: remap(s.cp), cn: remap(s.cn) };
  const { a, px, qx } = split.border ? split.border.keyTerms(s) : ownTerms(split.pencil!, s, m, x);
  const delta = csub(cx(1), a);
  if (cabs(delta) <= 1e-9 * Math.max(1, cabs(a))) return null;
  // key removed (Sherman–Morrison): Z⁰ = Z + p_X q_X/(1 − a), M⁰⁻¹u = p/(1 − a), vᵀM⁰⁻¹ = qᵀ/(1 − a)
  const z0 = cadd(z, cdiv(cmul(px, qx), delta)!);
  if (cabs(z0) === 0) return null;
  const tOc = cdiv(a, delta)!;
  // T_sc = T_oc − (vᵀM⁰⁻¹e_X)(e_XᵀM⁰⁻¹u)/Z⁰_X (Schur complement, as in blackman.ts)
  const tSc = csub(tOc, cdiv(cdiv(cmul(qx, px), cmul(delta, delta))!, z0)!);
  const factor = cdiv(cadd(cx(1), tSc), cadd(cx(1), tOc));
  if (!factor) return null;
  return { part: split.part, node: sys.nodeNames[node], z, z0, factor };
}

/** a = vᵀS⁻¹u, [S⁻¹u]_X′ and [S⁻ᵀv]_X′ from the split network's own factor. */
function ownTerms(pencil: PencilAt, s: SourceStamp, m: number, x: number): { a: Cx; px: Cx; qx: Cx } {
  const u = uVector(s, m);
  const v = vVector(s, m);
  const p = pencil.solve(u); // M⁻¹u
  const q = pencil.solveTransposed(v); // (vᵀM⁻¹)ᵀ
  let a = cx(0);
  for (let i = 0; i < m; i++) if (v[i]) a = cadd(a, cmul(cx(v[i]), cx(p.re[i], p.im[i])));
  return { a, px: cx(p.re[x], p.im[x]), qx: cx(q.re[x], q.im[x]) };
}

function embed(A: Float64Array, n: number, m: number): Float64Array {
  const out = new Float64Array(m * m);
  for (let i = 0; i < n; i++) out.set(A.subarray(i * n, i * n + n), i * m);
  return out;
}

/** Move the element's connections at `node` to `to` (through `add`, on G or C); false when it has
 *  none there. Two-terminal and VCCS stamps are taken out and put back with the new index (value × k
 *  for a scaled source); a branch element's row and column entries (read with `getG`) move as they are. */
type AddEntry = (isC: boolean, i: number, j: number, val: number) => void;

function moveElement(add: AddEntry, getG: (i: number, j: number) => number, nodeCount: number, el: Element, node: number, to: number, k: number): boolean {
  const map = (v: number) => (v === node ? to : v);
  switch (el.type) {
    case 'conductance':
    case 'capacitance': {
      if (el.a !== node && el.b !== node) return false;
      const isC = el.type === 'capacitance';
      const val = el.type === 'conductance' ? el.g : el.c;
      stampTwoTerminal(add, isC, el.a, el.b, -val);
      stampTwoTerminal(add, isC, map(el.a), map(el.b), val);
      return true;
    }
    case 'vccs': {
      if (el.p !== node && el.n !== node && el.cp !== node && el.cn !== node) return false;
      stampVccs(add, el.p, el.n, el.cp, el.cn, -el.gm * k);
      stampVccs(add, map(el.p), map(el.n), map(el.cp), map(el.cn), el.gm * k);
      return true;
    }
    case 'vcvs':
    case 'vsource':
    case 'inductance': {
      const pins = el.type === 'vcvs' ? [el.p, el.n, el.cp, el.cn] : el.type === 'vsource' ? [el.p, el.n] : [el.a, el.b];
      if (!pins.includes(node)) return false;
      const r = nodeCount + el.branch;
      const row = getG(r, node), col = getG(node, r);
      add(false, r, to, row); add(false, r, node, -row);
      add(false, to, r, col); add(false, node, r, -col);
      return true;
    }
    default:
      return false;
  }
}

function stampTwoTerminal(add: AddEntry, isC: boolean, a: number, b: number, val: number): void {
  add(isC, a, a, val); add(isC, b, b, val); add(isC, a, b, -val); add(isC, b, a, -val);
}

function stampVccs(add: AddEntry, p: number, q: number, cp: number, cn: number, gm: number): void {
  add(false, p, cp, gm); add(false, p, cn, -gm); add(false, q, cp, -gm); add(false, q, cn, gm);
}
