// Loop discovery: elementary cycles (Johnson 1975) of the solved coupling graph (coupling.ts),
// counted when the cycle's gain exceeds a threshold at DC or anywhere in the sweep.
//
// Which gain is reported: the cycle product −∏d is that one loop's transmission in the signal-flow
// graph of direct couplings (Mason 1953), exact for the loop alone but not measurable on a bench when
// loops share parts. The key source's Bode return ratio T (all other sources present) is what a
// designer measures by breaking the loop at the key, and it is what sets stability and the Blackman
// impedance factors; it is the headline figure. The cycle product is kept as the secondary figure and
// is what decides whether the cycle counts and over which band it is active, since it is specific
// to the cycle even when several cycles share the key.
import type { Cx, MnaSystem } from '../types';
import { couplingGraph, cycleGain } from './coupling';
import type { CouplingGraph } from './coupling';
import { elementaryCycles, stronglyConnected } from './cycles';
import { logSpace, nodeLabel } from './pencil';
import { returnRatios } from './returnRatio';
import type { ReturnRatioPoint, ReturnRatioSweep } from './returnRatio';

export interface LoopMember { id: string; part: string; role: string }

export interface LoopBand {
  /** Lower edge (Hz); 0 when the loop is active from DC. */
  fromHz: number;
  /** Upper edge (Hz); null when still active at the top of the sweep. */
  toHz: number | null;
}

export interface Loop {
  /** Stable key: member ids from the key source, joined by '>'. */
  id: string;
  /** Short human label, e.g. "A1 → M2". */
  label: string;
  kind: 'local' | 'global';
  members: LoopMember[];
  /** Nets the loop passes through, in order (closing back to the first). */
  nets: string[];
  /** Source at which the loop is broken by default (switching the loop off zeroes it). */
  key: string;
  /** Bode return ratio of the key source at DC, all other sources present (headline figure). */
  returnRatioDc: ReturnRatioPoint;
  /** Key source's return ratio over the sweep (fHz of the discovery). */
  returnRatio: ReturnRatioSweep;
  /** Cycle product −∏d at DC (secondary figure). */
  cycleGainDc: Cx;
  /** Largest |cycle product| over DC and the sweep, and where. */
  peakCycleGain: number;
  peakAtHz: number;
  /** Band where |cycle product| exceeds the threshold; null if never. */
  band: LoopBand | null;
}

export interface LoopDiscovery {
  loops: Loop[];
  /** True when the cycle enumeration or the cap cut the list (largest loops kept). */
  truncated: boolean;
  threshold: number;
  cap: number;
  /** Frequencies used (Hz), DC first. */
  fHz: number[];
  /** Groups of sources that are strongly connected (Tarjan 1972), as id lists, size ≥ 2 or self-coupled. */
  groups: string[][];
  graph: CouplingGraph;
  notes: string[];
}

export interface LoopOptions {
  threshold?: number;
  cap?: number;
  freqsHz?: number[];
  scale?: Record<string, number>;
}

const EDGE_FLOOR = 1e-9;
const ROLE_PREFERENCE = ['A0', 'gain', 'gm', 'gmb'];
/** Roles of the chain inside an amplifier macro (stamps/amplifier.ts). */
const MACRO_ROLES = ['A0', 'stage2', 'out'];

export function discoverLoops(sys: MnaSystem, opts: LoopOptions = {}): LoopDiscovery {
  const threshold = opts.threshold ?? 0.01;
  const cap = opts.cap ?? 64;
  const sweep = opts.freqsHz ?? logSpace(1, 1e11, 5);
  const graph = couplingGraph(sys, { freqsHz: sweep, scale: opts.scale });
  const N = graph.stamps.length;
  const notes: string[] = [];
  if (graph.gminAtHz.length) {
    notes.push(`a node is held only by controlled sources or capacitors; 1e-12 S to ground was added at every node to map couplings at ${graph.gminAtHz.length} frequencies`);
  }
  const adj: number[][] = [];
  for (let i = 0; i < N; i++) {
    const row: number[] = [];
    for (let j = 0; j < N; j++) if (graph.peak[i * N + j] > EDGE_FLOOR) row.push(j);
    row.sort((a, b) => graph.peak[i * N + b] - graph.peak[i * N + a]);
    adj.push(row);
  }
  const { components } = stronglyConnected(N, adj);
  const groups = components
    .filter((c) => c.length > 1 || adj[c[0]].includes(c[0]))
    .map((c) => c.map((k) => graph.stamps[k].id));
  const budget = Math.max(2000, cap * 40);
  const found = elementaryCycles(N, adj, budget);
  let truncated = found.truncated;
  const fz = graph.fHz;
  const counted = found.cycles
    .map((cycle) => {
      const mags = fz.map((_, fi) => { const g = cycleGain(graph, cycle, fi); return Math.hypot(g.re, g.im); });
      let peakIdx = 0;
      for (let k = 1; k < mags.length; k++) if (mags[k] > mags[peakIdx]) peakIdx = k;
      return { cycle, mags, peakIdx };
    })
    .filter((c) => c.mags[c.peakIdx] > threshold)
    .sort((a, b) => b.mags[b.peakIdx] - a.mags[a.peakIdx]);
  if (counted.length > cap) truncated = true;
  const kept = counted.slice(0, cap);
  if (truncated) notes.push(`more loops than listed: the ${kept.length} largest are kept (cap ${cap})`);

  // how many kept cycles each source belongs to: the key is preferably one that breaks few others
  const uses = new Int32Array(N);
  for (const c of kept) for (const v of c.cycle) uses[v]++;
  const keyOf = (cycle: number[]) => [...cycle].sort((a, b) => {
    const ra = rolePreference(graph.stamps[a].role);
    const rb = rolePreference(graph.stamps[b].role);
    if (ra !== rb) return ra - rb;
    if (uses[a] !== uses[b]) return uses[a] - uses[b];
    return a - b;
  })[0];

  const keys = [...new Set(kept.map((c) => graph.stamps[keyOf(c.cycle)].id))];
  const rr = new Map(returnRatios(sys, { freqsHz: fz.slice(1), scale: opts.scale, ids: keys }).map((r) => [r.id, r]));
  const loops: Loop[] = kept.map(({ cycle, mags, peakIdx }) => {
    const k = keyOf(cycle);
    const start = cycle.indexOf(k);
    const ordered = [...cycle.slice(start), ...cycle.slice(0, start)];
    const members = ordered.map((v) => ({ id: graph.stamps[v].id, part: graph.stamps[v].part, role: graph.stamps[v].role }));
    const parts = [...new Set(members.map((m) => m.part))];
    const key = graph.stamps[k].id;
    const sweepRR = rr.get(key)!;
    return {
      id: members.map((m) => m.id).join('>'),
      label: parts.join(' → '),
      // local: confined to one device's own sources (degeneration, diode connection, follower);
      // a loop around an amplifier macro always closes outside it, so it is global
      kind: parts.length === 1 && !members.some((m) => MACRO_ROLES.includes(m.role)) ? 'local' as const : 'global' as const,
      members,
      nets: loopNets(sys, graph, ordered),
      key,
      returnRatioDc: sweepRR.dc,
      returnRatio: sweepRR,
      cycleGainDc: cycleGain(graph, cycle, 0),
      peakCycleGain: mags[peakIdx],
      peakAtHz: fz[peakIdx],
      band: bandOf(fz, mags, threshold),
    };
  });
  return { loops, truncated, threshold, cap, fHz: fz, groups, graph, notes };
}

function rolePreference(role: string): number {
  const i = ROLE_PREFERENCE.indexOf(role);
  return i < 0 ? ROLE_PREFERENCE.length : i;
}

function loopNets(sys: MnaSystem, g: CouplingGraph, ordered: number[]): string[] {
  const N = g.stamps.length;
  const seq: number[] = [];
  for (let k = 0; k < ordered.length; k++) {
    const a = ordered[k];
    const b = ordered[(k + 1) % ordered.length];
    for (const v of [g.outNode[a * N + b], g.ctlNode[a * N + b]]) {
      if (v >= 0 && seq[seq.length - 1] !== v) seq.push(v);
    }
  }
  if (seq.length > 1 && seq[0] === seq[seq.length - 1]) seq.pop();
  const names = seq.map((v) => nodeLabel(sys, v));
  // nodes private to a part macro ("<part>#<label>") cannot be drawn; keep them only if nothing else
  const visible = names.filter((x) => !x.includes('#'));
  return visible.length ? visible : names;
}

/** Envelope of the frequencies where mags > threshold, edges interpolated in log f / log |g|. */
export function bandOf(fHz: number[], mags: number[], threshold: number): LoopBand | null {
  const above = mags.map((m) => m > threshold);
  const first = above.indexOf(true);
  if (first < 0) return null;
  const last = above.lastIndexOf(true);
  const edge = (i: number, j: number) => {
    // crossing between grid points i (below) and j (above) or vice versa
    const fi = fHz[i], fj = fHz[j];
    if (fi <= 0 || fj <= 0) return Math.max(fi, fj) === fj ? fj : fi;
    const li = Math.log(Math.max(mags[i], 1e-300)), lj = Math.log(Math.max(mags[j], 1e-300));
    const t = (Math.log(threshold) - li) / (lj - li);
    return Math.exp(Math.log(fi) + t * (Math.log(fj) - Math.log(fi)));
  };
  const fromHz = first === 0 ? 0 : edge(first - 1, first);
  const toHz = last === fHz.length - 1 ? null : edge(last, last + 1);
  return { fromHz, toHz };
}
