// Loop discovery at part level: the controlled sources of one part are one vertex (partGraph.ts),
// loops are a part's local loop or elementary cycles (Johnson 1975) of the part graph, counted when
// the loop's gain exceeds a threshold at DC or anywhere in the sweep (partCycles.ts). The
// source-level coupling graph stays available as `graph` for experts.
//
// Which gain is reported: the part-cycle gain (partGraph.ts) is that one loop's transmission in the
// signal-flow graph of direct couplings (Mason 1953), exact for the loop alone but not measurable on
// a bench when loops share parts. The key source's Bode return ratio T (all other sources present)
// is what a designer measures by breaking the loop at the key, and it is what sets stability and the
// Blackman impedance factors; it is the headline figure. The cycle gain is kept as the secondary
// figure and decides whether the loop counts and over which band it is active.
import type { Cx, MnaSystem } from '../types';
import { couplingGraph } from './coupling';
import type { CouplingGraph } from './coupling';
import { stronglyConnected } from './cycles';
import { EDGE_FLOOR, findPartCycles } from './partCycles';
import type { PartCycle } from './partCycles';
import { logSpace, nodeLabel } from './pencil';
import { returnRatiosFromGraph } from './graphReturnRatio';
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
  /** Short human label: the parts in order, e.g. "A1 → M2". */
  label: string;
  kind: 'local' | 'global';
  /** One source per part, in loop order from the key's part: the one that stands for the part
   *  (amplifier gain first, then gm). */
  members: LoopMember[];
  /** The parts in loop order, from the key's part. */
  parts: string[];
  /** Every source of those parts the loop runs through, part by part (e.g. M2.gm and M2.gmb). */
  sources: LoopMember[];
  /** Part paths folded into this loop as parallel paths or detours of it ("A1>M2>M3"). */
  variants: string[];
  /** Nets the loop passes through, in order (closing back to the first). */
  nets: string[];
  /** Source at which the loop is broken by default (switching the loop off zeroes it). */
  key: string;
  /** Bode return ratio of the key source at DC, all other sources present (headline figure). */
  returnRatioDc: ReturnRatioPoint;
  /** Key source's return ratio over the sweep (fHz of the discovery). */
  returnRatio: ReturnRatioSweep;
  /** Part-cycle gain at DC (secondary figure; −∏d for single-source parts). */
  cycleGainDc: Cx;
  /** Largest |cycle gain| over DC and the sweep, and where. */
  peakCycleGain: number;
  peakAtHz: number;
  /** Band where |cycle gain| exceeds the threshold; null if never. */
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
  /** Source-level coupling graph (per controlled source), for experts. */
  graph: CouplingGraph;
  /** Part names, the vertices of the part-level graph. */
  parts: string[];
  notes: string[];
}

export interface LoopOptions {
  threshold?: number;
  cap?: number;
  freqsHz?: number[];
  scale?: Record<string, number>;
}

const ROLE_PREFERENCE = ['A0', 'gain', 'gm', 'gmb'];

export function discoverLoops(sys: MnaSystem, opts: LoopOptions = {}): LoopDiscovery {
  const threshold = opts.threshold ?? 0.01;
  const cap = opts.cap ?? 64;
  const sweep = opts.freqsHz ?? logSpace(1, 1e12, 4);
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
    adj.push(row);
  }
  const { components } = stronglyConnected(N, adj);
  const groups = components
    .filter((c) => c.length > 1 || adj[c[0]].includes(c[0]))
    .map((c) => c.map((k) => graph.stamps[k].id));
  const found = findPartCycles(graph, threshold, Math.max(256, cap * 4), (v) => !nodeLabel(sys, v).includes('#'), (v) => rolePreference(graph.stamps[v].role));
  const pg = found.partGraph;
  let truncated = found.truncated;
  const fz = graph.fHz;
  const counted = [...found.cycles].sort((a, b) => b.mags[b.peakIdx] - a.mags[a.peakIdx]);
  const kept = counted.slice(0, cap);
  if (counted.length > cap) {
    truncated = true;
    notes.push(`more loops than listed: the ${kept.length} largest are kept (cap ${cap})`);
  } else if (found.truncated) {
    notes.push('the search for long loops (more than three parts) stopped early: long loops may be missing');
  }

  // how many kept loops each source runs through: the key is preferably one that breaks few others
  const uses = new Int32Array(N);
  for (const c of kept) for (const list of c.sources) for (const v of list) uses[v]++;
  const byPreference = (a: number, b: number) => {
    const ra = rolePreference(graph.stamps[a].role);
    const rb = rolePreference(graph.stamps[b].role);
    if (ra !== rb) return ra - rb;
    if (uses[a] !== uses[b]) return uses[a] - uses[b];
    return a - b;
  };
  // one source stands for each part: the preferred one among those the loop runs through
  const reps = new Map<PartCycle, number[]>();
  const repsOf = (c: PartCycle) => reps.get(c) ?? reps.set(c, c.sources.map((list) => [...list].sort(byPreference)[0])).get(c)!;
  const keyPos = (c: PartCycle) => { const r = repsOf(c); return r.indexOf([...r].sort(byPreference)[0]); };
  const keys = [...new Set(kept.map((c) => graph.stamps[repsOf(c)[keyPos(c)]].id))];
  const rr = new Map(returnRatiosFromGraph(sys, graph, keys, opts.scale).map((r) => [r.id, r]));
  const member = (v: number): LoopMember => ({ id: graph.stamps[v].id, part: graph.stamps[v].part, role: graph.stamps[v].role });
  const rotate = <T>(xs: T[], k: number) => [...xs.slice(k), ...xs.slice(0, k)];
  const idOf = (c: PartCycle) => { const r = repsOf(c); return rotate(r, keyPos(c)).map((v) => graph.stamps[v].id).join('>'); };
  const loops: Loop[] = kept.map((c) => {
    const start = keyPos(c);
    const reps = rotate(repsOf(c), start);
    const members = reps.map(member);
    const parts = rotate(c.parts, start).map((p) => pg.parts[p]);
    const key = members[0].id;
    const sweepRR = rr.get(key)!;
    const pairs = c.parts.length === 1 ? c.pairs : rotate(c.pairs, start);
    return {
      id: idOf(c),
      label: parts.join(' → '),
      // local: confined to one device's own sources (degeneration, diode connection, follower,
      // Miller capacitance around one stage); a loop around an amplifier macro closes outside it
      kind: c.parts.length === 1 && !pg.macro[c.parts[0]] ? 'local' as const : 'global' as const,
      members,
      parts,
      sources: rotate(c.sources, start).flat().map(member),
      variants: c.folded.map((ps) => ps.map((p) => pg.parts[p]).join('>')),
      nets: loopNets(sys, graph, pairs),
      key,
      returnRatioDc: sweepRR.dc,
      returnRatio: sweepRR,
      cycleGainDc: c.dc,
      peakCycleGain: c.mags[c.peakIdx],
      peakAtHz: fz[c.peakIdx],
      band: bandOf(fz, c.mags, threshold),
    };
  });
  return { loops, truncated, threshold, cap, fHz: fz, groups, graph, parts: pg.parts, notes };
}

function rolePreference(role: string): number {
  const i = ROLE_PREFERENCE.indexOf(role);
  return i < 0 ? ROLE_PREFERENCE.length : i;
}

function loopNets(sys: MnaSystem, g: CouplingGraph, pairs: [number, number][]): string[] {
  const N = g.stamps.length;
  const seq: number[] = [];
  for (const [a, b] of pairs) {
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
