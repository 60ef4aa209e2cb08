// Blackman's impedance formula (Blackman 1943): the impedance from a node to ground is
//   Z = Z⁰·(1 + T_sc)/(1 + T_oc)
// with Z⁰ the impedance with the key source set to zero, and T_sc / T_oc the key source's return
// ratios with that node shorted to ground / left open. Here T_oc is the plain return ratio, and the
// shorted case follows from the source-removed network M⁰ by holding the node at 0 V with a current
// (Schur complement): T_sc = T_oc − (vᵀM⁰⁻¹e_X)(e_XᵀM⁰⁻¹u)/Z⁰_X. Z itself is solved directly
// from the full network, so Z = Z⁰(1+T_sc)/(1+T_oc) is a consistency check, not an identity of code.
// Many keys at one frequency share the full factor and the node impedances Z (FullPencil); then M⁰
// follows from M by Sherman–Morrison (M⁰ = M − u vᵀ: M⁰⁻¹u = M⁻¹u/(1 − a), Z⁰_X = Z_X +
// (e_XᵀM⁻¹u)(vᵀM⁻¹e_X)/(1 − a), a = vᵀM⁻¹u), two solves per key instead of two factors.
import type { Cx, MnaSystem } from '../types';
import { PencilAt, addRankOne, scaledG, sourceStamps, uVector, vVector } from './pencil';
import type { SourceStamp } from './pencil';
import { scaleStamp } from './returnRatio';
import { cabs, cadd, cdiv, cmul, csub, cx } from './cx';
import { UNDETERMINED_CONDITION, pencilCondition } from './condition';

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
  status: 'ok' | 'unknown-source' | 'singular' | 'ill-conditioned';
  message?: string;
  tOc: Cx | null;
  nodes: BlackmanNode[];
}

/** The full network factored at one frequency, with every node's impedance to ground. */
export interface FullPencil { fHz: number; pencil: PencilAt; z: Cx[] }

export function fullPencil(sys: MnaSystem, G: Float64Array, fHz: number): FullPencil {
  const pencil = new PencilAt(G, sys.C, sys.n, 2 * Math.PI * fHz);
  const z: Cx[] = [];
  if (!pencil.singular) {
    const d = pencil.inverseDiagonal(sys.nodeCount);
    for (let i = 0; i < sys.nodeCount; i++) z.push(cx(d.re[i], d.im[i]));
  }
  return { fHz, pencil, z };
}

export function blackmanAt(
  sys: MnaSystem, key: string,
  opts: { fHz?: number; scale?: Record<string, number>; shared?: FullPencil; stamps?: SourceStamp[]; G?: Float64Array } = {},
): BlackmanResult {
  const fHz = opts.fHz ?? 0;
  const n = sys.n;
  // `opts.stamps`: sourceStamps(sys) when the caller holds them
  const stamps = opts.stamps ?? sourceStamps(sys);
  const raw = stamps.find((s) => s.id === key);
  if (!raw) return { key, fHz, status: 'unknown-source', message: `no controlled source "${key}" in this network`, tOc: null, nodes: [] };
  const s = scaleStamp(raw, opts.scale?.[key]);
  if (opts.shared && opts.shared.fHz === fHz && !opts.shared.pencil.singular) {
    const r = viaShared(sys, key, s, opts.shared);
    if (r) return r;
  }
  // `opts.G`: G with the scales applied, when the caller holds it; the shared factor is that of the
  // same network at this frequency
  const G = opts.G ?? scaledG(sys, stamps, opts.scale ?? {});
  const G0 = Float64Array.from(G);
  addRankOne(G0, n, s, -1);
  const omega = 2 * Math.PI * fHz;
  const full = opts.shared && opts.shared.fHz === fHz ? opts.shared.pencil : new PencilAt(G, sys.C, n, omega);
  const cut = new PencilAt(G0, sys.C, n, omega);
  if (full.singular || cut.singular) {
    const which = full.singular ? 'the network' : `the network with ${key} removed`;
    return { key, fHz, status: 'singular', message: `${which} is singular at ${fHz} Hz (a node with no path to ground)`, tOc: null, nodes: [] };
  }
  // reached when the loop gain is too large for Sherman–Morrison (|T| > 1e9): with the key removed
  // the network may be singular in all but name, and then nothing read from its factor means anything
  const kappa = Math.max(pencilCondition(G, sys.C, n, omega, full), pencilCondition(G0, sys.C, n, omega, cut));
  if (kappa > UNDETERMINED_CONDITION) {
    return {
      key, fHz, status: 'ill-conditioned', tOc: null, nodes: [],
      message: `${key}: with it removed the network at ${fHz} Hz is too ill-conditioned (condition ≈ ${kappa.toExponential(1)}) for its impedance factors to be determined in double precision; the loop gain there is beyond 1e15`,
    };
  }
  const u = uVector(s, n);
  const v = vVector(s, n);
  const m0u = cut.solve(u); // M⁰⁻¹u
  const vm0 = cut.solveTransposed(v); // (vᵀM⁰⁻¹)ᵀ
  const rows: { z: Cx; z0: Cx }[] = [];
  for (let i = 0; i < sys.nodeCount; i++) {
    const e = new Float64Array(n);
    e[i] = 1;
    const xf = full.solve(e);
    const x0 = cut.solve(e);
    rows.push({ z: cx(xf.re[i], xf.im[i]), z0: cx(x0.re[i], x0.im[i]) });
  }
  return factorsFrom(sys, key, fHz, v, m0u, vm0, rows);
}

/** Sherman–Morrison from the shared full factor; null when 1 − a is too small to divide by. */
function viaShared(sys: MnaSystem, key: string, s: ReturnType<typeof scaleStamp>, shared: FullPencil): BlackmanResult | null {
  const n = sys.n;
  const u = uVector(s, n);
  const v = vVector(s, n);
  const p = shared.pencil.solve(u); // M⁻¹u
  const q = shared.pencil.solveTransposed(v); // (vᵀM⁻¹)ᵀ
  let a = cx(0);
  for (let i = 0; i < n; i++) if (v[i]) a = cadd(a, cmul(cx(v[i]), cx(p.re[i], p.im[i])));
  const delta = csub(cx(1), a);
  if (cabs(delta) <= 1e-9 * Math.max(1, cabs(a))) return null;
  const inv = cdiv(cx(1), delta)!;
  const scaleVec = (x: { re: Float64Array; im: Float64Array }) => {
    const re = new Float64Array(n), im = new Float64Array(n);
    for (let i = 0; i < n; i++) { const y = cmul(cx(x.re[i], x.im[i]), inv); re[i] = y.re; im[i] = y.im; }
    return { re, im };
  };
  const m0u = scaleVec(p);
  const vm0 = scaleVec(q);
  const rows = shared.z.map((z, i) => ({ z, z0: cadd(z, cmul(cmul(cx(p.re[i], p.im[i]), cx(q.re[i], q.im[i])), inv)) }));
  return factorsFrom(sys, key, shared.fHz, v, m0u, vm0, rows);
}

function factorsFrom(
  sys: MnaSystem, key: string, fHz: number, v: Float64Array,
  m0u: { re: Float64Array; im: Float64Array }, vm0: { re: Float64Array; im: Float64Array }, rows: { z: Cx; z0: Cx }[],
): BlackmanResult {
  let tOc = cx(0);
  for (let i = 0; i < sys.n; i++) if (v[i]) tOc = cadd(tOc, cmul(cx(v[i]), cx(m0u.re[i], m0u.im[i])));
  let zScale = 0;
  for (const r of rows) zScale = Math.max(zScale, cabs(r.z0), cabs(r.z));
  const nodes: BlackmanNode[] = [];
  rows.forEach(({ z, z0 }, i) => {
    const name = sys.nodeNames[i];
    // vᵀM⁰⁻¹e_X and e_XᵀM⁰⁻¹u
    const a = cx(vm0.re[i], vm0.im[i]);
    const b = cx(m0u.re[i], m0u.im[i]);
    if (cabs(z0) <= 1e-12 * zScale) {
      nodes.push({ node: name, index: i, z, z0, tSc: tOc, tOc, factor: cx(1), status: 'held' });
      return;
    }
    const tSc = csub(tOc, cdiv(cmul(a, b), z0)!);
    const factor = cdiv(cadd(cx(1), tSc), cadd(cx(1), tOc)) ?? cx(Infinity);
    nodes.push({ node: name, index: i, z, z0, tSc, tOc, factor, status: 'ok' });
  });
  return { key, fHz, status: 'ok', tOc, nodes };
}
