// Directed coupling graph between controlled sources, computed by solving the network.
//
// Edge i → j is d_ij(s) = the control of source j produced by source i driving the network with its
// unit-control excitation (−u_i, see pencil.ts), in the network with EVERY controlled source cut
// (independent sources zeroed). Cutting all of them, not only j, makes the graph a signal-flow graph
// of direct couplings (Mason 1953): the controls obey c_j = Σ_i d_ij·c_i, so the product of d along an
// elementary cycle is exactly that loop's transmission and −∏d its return-ratio-style gain (positive
// for negative feedback). Had the other sources been left in, each edge would already contain the
// paths through third sources and cycle products would count them twice.
import type { MnaSystem } from '../types';
import { PencilAt, addRankOne, controlIsGround, scaledG, sourceStamps } from './pencil';
import type { SourceStamp } from './pencil';
import { scaleStamp } from './returnRatio';
import { hypot2 } from './cx';

export interface CouplingGraph {
  stamps: SourceStamp[];
  /** Frequencies (Hz); index 0 is DC (0). */
  fHz: number[];
  /** Per frequency: d_ij at [i*N + j], real and imaginary parts. */
  re: Float64Array[];
  im: Float64Array[];
  /** max over frequency of |d_ij|, [i*N + j]. */
  peak: Float64Array;
  /** Per edge (DC, else first frequency where it exists): the output node of i and control node of j
   *  that carry the coupling (largest response), −1 when none; for drawing a loop's path. */
  outNode: Int32Array;
  ctlNode: Int32Array;
  /** Frequencies (Hz) where the cut network needed a small conductance to ground at every node
   *  (1e-12 S, common practice) because it was singular there (a node held only by sources). */
  gminAtHz: number[];
}

export interface CouplingOptions {
  freqsHz?: number[];
  scale?: Record<string, number>;
}

const GMIN = 1e-12;

export function couplingGraph(sys: MnaSystem, opts: CouplingOptions = {}): CouplingGraph {
  const n = sys.n;
  const all = sourceStamps(sys);
  const scale = opts.scale ?? {};
  const G = scaledG(sys, all, scale);
  const stamps = all.map((s) => scaleStamp(s, scale[s.id])).filter((s) => s.value !== 0 && !controlIsGround(s));
  // the cut network: every (scaled) source removed
  const Gcut = Float64Array.from(G);
  for (const s of stamps) addRankOne(Gcut, n, s, -1);
  const N = stamps.length;
  const fHz = [0, ...(opts.freqsHz ?? []).filter((f) => f > 0)];
  const re: Float64Array[] = [];
  const im: Float64Array[] = [];
  const peak = new Float64Array(N * N);
  const outNode = new Int32Array(N * N).fill(-1);
  const ctlNode = new Int32Array(N * N).fill(-1);
  const gminAtHz: number[] = [];
  // unit-control excitations −u, kept sparse (a source's u has one or two entries)
  // (typed arrays: one element kind whatever the values, so the solve loop below stays monomorphic)
  const negVals = stamps.map((s) => Float64Array.from(s.uVals, (x) => -x));
  const uRows = stamps.map((s) => Int32Array.from(s.uRows));
  const work = { re: new Float64Array(n), im: new Float64Array(n) };
  // one pair of n × n buffers for every frequency's factor (each is used up before the next)
  const lu = { re: new Float64Array(n * n), im: new Float64Array(n * n) };
  const cps = Int32Array.from(stamps, (s) => s.cp), cns = Int32Array.from(stamps, (s) => s.cn);
  for (const f of fHz) {
    const omega = 2 * Math.PI * f;
    let pencil = new PencilAt(Gcut, sys.C, n, omega, lu);
    if (pencil.singular) {
      const Gm = Float64Array.from(Gcut);
      for (let k = 0; k < sys.nodeCount; k++) Gm[k * n + k] += GMIN;
      pencil = new PencilAt(Gm, sys.C, n, omega, lu);
      gminAtHz.push(f);
    }
    const dRe = new Float64Array(N * N);
    const dIm = new Float64Array(N * N);
    for (let i = 0; i < N; i++) {
      const x = pencil.solveSparse(uRows[i], negVals[i], work);
      const xr = x.re, xi = x.im;
      for (let j = 0; j < N; j++) {
        // the control v(cp) − v(cn) (as controlOf)
        let cr = 0, ci = 0;
        const cp = cps[j], cn = cns[j];
        if (cp >= 0) { cr += xr[cp]; ci += xi[cp]; }
        if (cn >= 0) { cr -= xr[cn]; ci -= xi[cn]; }
        const k = i * N + j;
        dRe[k] = cr;
        dIm[k] = ci;
        // |d| only where it may raise the peak or the edge's nodes are still to be noted (a squared
        // magnitude well below the peak's cannot)
        const pk = peak[k];
        if (cr * cr + ci * ci < pk * pk * 0.999999 && outNode[k] >= 0) continue;
        const mag = hypot2(cr, ci);
        if (mag > peak[k]) peak[k] = mag;
        if (outNode[k] < 0 && mag > 0) {
          // a pin shared by i's output and j's control is where the signal passes; else the largest
          const outs = [stamps[i].p, stamps[i].n];
          const ctls = [stamps[j].cp, stamps[j].cn];
          const shared = outs.filter((v) => v >= 0 && ctls.includes(v));
          outNode[i * N + j] = largestOf(shared.length ? shared : outs, x);
          ctlNode[i * N + j] = shared.length ? outNode[i * N + j] : largestOf(ctls, x);
        }
      }
    }
    re.push(dRe);
    im.push(dIm);
  }
  return { stamps, fHz, re, im, peak, outNode, ctlNode, gminAtHz };
}

function largestOf(nodes: number[], x: { re: Float64Array; im: Float64Array }): number {
  let best = -1;
  let bestMag = -1;
  for (const k of nodes) {
    if (k < 0) continue;
    const m = hypot2(x.re[k], x.im[k]);
    if (m > bestMag) { bestMag = m; best = k; }
  }
  return best;
}

/** −∏ d along a cycle (vertex list, closing edge last → first) at frequency index fi. */
export function cycleGain(g: CouplingGraph, cycle: number[], fi: number): { re: number; im: number } {
  const N = g.stamps.length;
  let re = -1;
  let im = 0;
  for (let k = 0; k < cycle.length; k++) {
    const a = cycle[k];
    const b = cycle[(k + 1) % cycle.length];
    const er = g.re[fi][a * N + b];
    const ei = g.im[fi][a * N + b];
    const nr = re * er - im * ei;
    im = re * ei + im * er;
    re = nr;
  }
  return { re, im };
}
