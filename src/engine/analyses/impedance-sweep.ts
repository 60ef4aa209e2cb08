// Node impedances Z_kk(j2πf) of every node over many frequencies.
// Fast path, the modal (partial-fraction) form of the resolvent for simple finite poles λ_i with
// right/left vectors x_i, y_i (Kailath, Linear Systems, §6.3; residue of (G + sC)⁻¹ at λ_i is
// x_i·y_iᴴ/(y_iᴴ·C·x_i)):
//   Z_kk(s) = D_k + Σ_i x_ik·ȳ_ik / ((s − λ_i)·y_iᴴCx_i),
// with the constant D_k fixed at a real point above every pole (Z_kk there from one real solve per
// node). It is checked against the direct solve (one LU per frequency, one solve per node) at
// three frequencies; on any mismatch (repeated or defective poles, higher-index
// equations) the direct solve is used for every frequency.

import type { Cx, MnaSystem } from '../types';
import { scaledLuReal, solveScaledReal } from './scaling';
import { bilinear, sparseRows } from '../linalg/sparse';
import { shiftedReduction, type ShiftedReduction } from './hessenberg';
import { impedancesAt } from './impedance';
import { poleVectors, type ModalVectors } from './modal';
import type { Pole } from './poles';

export interface ImpedanceSweep {
  hz: number[];
  nodes: string[];
  /** values[k][i]: Z of node k at hz[i] in complex ohms; null where undefined (s is a pole). */
  values: (Cx | null)[][];
  method: 'modal' | 'direct';
}

type Sys = Pick<MnaSystem, 'n' | 'nodeCount' | 'nodeNames' | 'G' | 'C'>;

const CHECK_TOL = 1e-7;

interface ModalForm { lr: Float64Array; li: Float64Array; rr: Float64Array[]; ri: Float64Array[]; d: Float64Array; byNodeRe: Float64Array; byNodeIm: Float64Array }

function buildModal(sys: Sys, poles: Pole[], red: ShiftedReduction, vectors?: ModalVectors[]): ModalForm | null {
  const { n, nodeCount: nc, C } = sys;
  const vs = vectors ?? poleVectors(sys, poles, red);
  const m = poles.length;
  const lr = new Float64Array(m), li = new Float64Array(m);
  const rr: Float64Array[] = [], ri: Float64Array[] = [];
  let cn = 0;
  for (let k = 0; k < n * n; k++) cn = Math.max(cn, Math.abs(C[k]));
  const Cs = sparseRows(C, n);
  for (let i = 0; i < m; i++) {
    const p = poles[i];
    lr[i] = p.re; li[i] = p.im;
    const v = vs[i];
    if (!(v.residual <= 1e-9)) return null;
    // d = yᴴ·C·x
    const [dr, di] = bilinear(Cs, v.leftRe, v.leftIm, v.rightRe, v.rightIm);
    let xs = 0, ys = 0;
    for (let r = 0; r < n; r++) { xs += v.rightRe[r] ** 2 + v.rightIm[r] ** 2; ys += v.leftRe[r] ** 2 + v.leftIm[r] ** 2; }
    const dd = dr * dr + di * di;
    if (!(Math.sqrt(dd) > 1e-8 * cn * Math.sqrt(xs * ys))) return null; // (near) defective pole
    const a = new Float64Array(nc), b = new Float64Array(nc);
    for (let k = 0; k < nc; k++) {
      // x_k·ȳ_k / d
      const pr = v.rightRe[k] * v.leftRe[k] + v.rightIm[k] * v.leftIm[k];
      const pi = v.rightIm[k] * v.leftRe[k] - v.rightRe[k] * v.leftIm[k];
      a[k] = (pr * dr + pi * di) / dd;
      b[k] = (pi * dr - pr * di) / dd;
    }
    rr.push(a); ri.push(b);
  }
  // D_k = Z_kk(σ_d) − Σ_i r_ik/(σ_d − λ_i), pinned at a real σ_d above every pole: there Z_kk is
  // small and the residue sum nearly vanishes, so the rounding of the residues does not reappear
  // as cancellation at high frequency, where |Z| is smallest.
  let fastest = 0;
  for (let i = 0; i < m; i++) fastest = Math.max(fastest, Math.hypot(lr[i], li[i]));
  const sd = fastest > 0 ? 10 * fastest : red.sigma;
  const A = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) A[k] = sys.G[k] + sd * C[k];
  const lu = scaledLuReal(A, n);
  if (lu.lu.singularAt >= 0) return null;
  const d = new Float64Array(nc);
  const e = new Float64Array(n);
  for (let k = 0; k < nc; k++) {
    e.fill(0); e[k] = 1;
    let z = solveScaledReal(lu, e)[k];
    for (let i = 0; i < m; i++) {
      const ur = sd - lr[i], ui = -li[i], uu = ur * ur + ui * ui;
      z -= (rr[i][k] * ur + ri[i][k] * ui) / uu;
    }
    if (!Number.isFinite(z)) return null;
    d[k] = z;
  }
  // Node-major copies of the residues for the per-frequency loop (contiguous over the poles).
  const byNodeRe = new Float64Array(nc * m), byNodeIm = new Float64Array(nc * m);
  for (let i = 0; i < m; i++) for (let k = 0; k < nc; k++) { byNodeRe[k * m + i] = rr[i][k]; byNodeIm[k * m + i] = ri[i][k]; }
  return { lr, li, rr, ri, d, byNodeRe, byNodeIm };
}

/** Z_k(jw) for every node k: 1/(jw − λ_i) once per pole, then one complex multiply-add per node. */
function evalModalAll(f: ModalForm, w: number, inv: { re: Float64Array; im: Float64Array }): (Cx | null)[] {
  const m = f.lr.length;
  for (let i = 0; i < m; i++) {
    const ur = -f.lr[i], ui = w - f.li[i], uu = ur * ur + ui * ui; // s − λ_i, s = jw
    if (!(uu > 0)) return f.d.length ? Array.from(f.d, () => null) : [];
    inv.re[i] = ur / uu;
    inv.im[i] = -ui / uu;
  }
  const out: (Cx | null)[] = [];
  for (let k = 0; k < f.d.length; k++) {
    let re = f.d[k], im = 0;
    const o = k * m;
    for (let i = 0; i < m; i++) {
      const a = f.byNodeRe[o + i], b = f.byNodeIm[o + i], c = inv.re[i], d = inv.im[i];
      re += a * c - b * d;
      im += a * d + b * c;
    }
    out.push({ re, im });
  }
  return out;
}

function agrees(got: Cx | null, ref: Cx | null, floor: number): boolean {
  if (!got || !ref) return got === ref;
  return Math.hypot(got.re - ref.re, got.im - ref.im) <= CHECK_TOL * Math.max(Math.hypot(ref.re, ref.im), floor);
}

export function impedanceSweep(
  sys: Sys, freqsHz: ArrayLike<number>,
  opts: { poles?: Pole[]; reduction?: ShiftedReduction | null; vectors?: ModalVectors[] } = {},
): ImpedanceSweep {
  const hz = Array.from(freqsHz);
  const nodes = sys.nodeNames.slice(0, sys.nodeCount);
  const direct = (): ImpedanceSweep => {
    const values: (Cx | null)[][] = nodes.map(() => []);
    for (const f of hz) {
      const z = impedancesAt(sys, { re: 0, im: 2 * Math.PI * f });
      z.values.forEach((v, k) => values[k].push(v));
    }
    return { hz, nodes, values, method: 'direct' };
  };
  const red = opts.reduction === undefined ? shiftedReduction(sys.G, sys.C, sys.n) : opts.reduction;
  if (!red || !opts.poles || hz.length < 4) return direct();
  const form = buildModal(sys, opts.poles, red, opts.vectors);
  if (!form) return direct();
  const inv = { re: new Float64Array(form.lr.length), im: new Float64Array(form.lr.length) };
  // Check the modal form against the direct solve at two inner frequencies of the grid and at its
  // top, where |Z| is smallest and any cancellation in the residue sum shows first.
  let top = hz[0];
  for (const f of hz) if (f > top) top = f;
  for (const f of [hz[Math.floor(hz.length / 3)], hz[Math.floor((2 * hz.length) / 3)], top]) {
    const ref = impedancesAt(sys, { re: 0, im: 2 * Math.PI * f }).values;
    const got = evalModalAll(form, 2 * Math.PI * f, inv);
    let floor = 0;
    for (const z of ref) if (z) floor = Math.max(floor, Math.hypot(z.re, z.im));
    floor *= 1e-3; // nodes a thousand times stiffer than the softest are checked in absolute terms
    for (let k = 0; k < nodes.length; k++) if (!agrees(got[k], ref[k], floor)) return direct();
  }
  const values: (Cx | null)[][] = nodes.map(() => []);
  for (const f of hz) evalModalAll(form, 2 * Math.PI * f, inv).forEach((z, k) => values[k].push(z));
  return { hz, nodes, values, method: 'modal' };
}
