// Loops at part level: local loops (a part's own return difference) and elementary cycles (Johnson
// 1975) of the part graph (partGraph.ts), each with its gain over the sweep, the sources it runs
// through and the source pairs that carry it from part to part (for drawing its path).
//
// Near-duplicates a designer would read as one loop are folded into it (listed as its variants):
//  - a part's own loop that closes through the same nets as a larger loop through that part, when the
//    part is an amplifier macro, or both loops run through the same nets and break at the same source
//    (e.g. a booster's output
//    coupling back to its input through the cascode's gate–source capacitance: the booster loop
//    itself, by a parallel path; a first stage's output reaching its own input through a Miller
//    capacitor in unity feedback). A device's own degeneration or Miller loop is kept: it breaks at
//    that device;
//  - a cycle that only adds a detour through parts which already form a listed loop among
//    themselves (a chain through a gain-boosted cascode may pass the device directly or through its
//    booster: the global loop is one loop, the booster loop another).
import type { CouplingGraph } from './coupling';
import { elementaryCycles, shortCycles } from './cycles';
import { CycleEvaluator, buildPartGraph, localGain, partClosures } from './partGraph';
import type { PartGraph } from './partGraph';
import { hypot2 } from './cx';

export const EDGE_FLOOR = 1e-9;
/** Cycles of up to this many parts are all enumerated. */
const SHORT_LEN = 3;
const SHORT_BUDGET = 20000;

export interface PartCycle {
  /** Part indices in order (closing last → first); one part for a local loop. */
  parts: number[];
  /** Per part: the source vertices of that part the loop runs through. */
  sources: number[][];
  /** Source pairs (from, to) carrying the loop, in order; nets are read from these. */
  pairs: [number, number][];
  /** |gain| per sweep frequency (index 0 = DC), and the complex gain at DC. */
  mags: number[];
  dc: { re: number; im: number };
  peakIdx: number;
  /** Part cycles folded into this one (as part index lists). */
  folded: number[][];
}

export interface PartCycleResult {
  partGraph: PartGraph;
  cycles: PartCycle[];
  truncated: boolean;
}

/** `visible(node)`: the node can be drawn (not private to a part macro); only those nets are compared
 *  when folding a macro's own loop into a larger one. */
export function findPartCycles(
  g: CouplingGraph, threshold: number, budget: number,
  visible: (node: number) => boolean = () => true, rank: (source: number) => number = () => 0,
): PartCycleResult {
  const pg = buildPartGraph(g);
  const cl = partClosures(g, pg);
  const P = pg.parts.length;
  const N = g.stamps.length;
  const fz = g.fHz;
  const peakOf = (mags: number[]) => mags.reduce((best, m, k) => (m > mags[best] ? k : best), 0);

  const locals: PartCycle[] = [];
  for (let p = 0; p < P; p++) {
    const gains = fz.map((_, fi) => localGain(cl, p, fi));
    const mags = gains.map((x) => hypot2(x.re, x.im));
    const peakIdx = peakOf(mags);
    if (!(mags[peakIdx] > threshold)) continue;
    const inner = internalCycle(g, pg.sourcesOf[p]);
    if (!inner) continue;
    locals.push({ parts: [p], sources: [inner.on], pairs: inner.pairs, mags, dc: gains[0], peakIdx, folded: [] });
  }

  const adj: number[][] = [];
  for (let a = 0; a < P; a++) {
    const row: number[] = [];
    for (let b = 0; b < P; b++) if (a !== b && pg.peak[a * P + b] > EDGE_FLOOR) row.push(b);
    row.sort((x, y) => pg.peak[a * P + y] - pg.peak[a * P + x]);
    adj.push(row);
  }
  // an upper bound per frequency spares evaluating hopeless cycles: ‖L‖ ≤ ∏ ‖D_PQ‖·‖H_Q‖ (Frobenius),
  // and |det(I − L) − 1| ≤ (1 + ‖L‖)^m − 1 for m × m L (m: the smallest part, as L may start anywhere)
  const F = fz.length;
  // (its largest value over frequency per edge gives a coarser bound first: the largest product over
  // frequency is at most the product of the edges' largest values)
  // edge norms in one flat array, frequency-major per edge: norms[slot[a*P + b]*F + fi]
  const slot = new Int32Array(P * P).fill(-1);
  let edgeCount = 0;
  for (let a = 0; a < P; a++) for (const b of adj[a]) slot[a * P + b] = edgeCount++;
  const norms = new Float64Array(edgeCount * F);
  const edgeMax = new Float64Array(P * P);
  const hNorm = cl.h.map((row) => row.map(frobenius));
  const blockSq = new Float64Array(P * P);
  for (let fi = 0; fi < F; fi++) {
    blockNormsSquared(g, pg, fi, blockSq);
    const hn = hNorm[fi];
    for (let a = 0; a < P; a++) {
      for (const b of adj[a]) {
        const v = Math.sqrt(blockSq[a * P + b]) * hn[b];
        norms[slot[a * P + b] * F + fi] = v;
        if (v > edgeMax[a * P + b]) edgeMax[a * P + b] = v;
      }
    }
  }
  const size = pg.sourcesOf.map((list) => list.length);
  const bases = new Int32Array(P + 1);
  const smallest = (cyc: number[]) => {
    let m = Infinity;
    for (const p of cyc) if (size[p] < m) m = size[p];
    return m;
  };
  const coarseOk = (cyc: number[]) => {
    let coarse = 1;
    for (let k = 0; k < cyc.length; k++) coarse *= edgeMax[cyc[k] * P + cyc[(k + 1) % cyc.length]];
    return Math.pow(1 + coarse, smallest(cyc)) - 1 > threshold;
  };
  // the cycle may pass the threshold: its bound exceeds it at some frequency (the first one found
  // decides; the per-frequency product runs along the cycle's edges in cycle order)
  const mayPass = (cyc: number[]) => {
    const m = smallest(cyc);
    if (!coarseOk(cyc)) return false;
    for (let k = 0; k < cyc.length; k++) bases[k] = slot[cyc[k] * P + cyc[(k + 1) % cyc.length]] * F;
    for (let fi = 0; fi < F; fi++) {
      let prod = 1;
      for (let k = 0; k < cyc.length; k++) prod *= norms[bases[k] + fi];
      if (Math.pow(1 + prod, m) - 1 > threshold) return true;
    }
    return false;
  };
  // short cycles exhaustively, then Johnson's enumeration for longer ones within the budget
  // (short cycles the coarse bound rules out are not even listed)
  const short = shortCycles(P, adj, SHORT_LEN, SHORT_BUDGET, coarseOk);
  const long = elementaryCycles(P, adj, budget);
  const all = short.truncated ? [...short.cycles, ...long.cycles.filter((c) => !short.cycles.some((x) => sameCycle(x, c)))]
    : [...short.cycles, ...long.cycles.filter((c) => c.length > SHORT_LEN)];
  const found = { cycles: all, truncated: short.truncated || long.truncated };
  const evaluator = new CycleEvaluator(g, pg, cl);
  const evaluate = (cyc: number[]): PartCycle | null => {
    if (!mayPass(cyc)) return null;
    const gains = evaluator.gains(cyc);
    if (!gains) return null;
    const mags: number[] = new Array(F);
    for (let fi = 0; fi < F; fi++) mags[fi] = hypot2(gains[2 * fi], gains[2 * fi + 1]);
    const peakIdx = peakOf(mags);
    if (!(mags[peakIdx] > threshold)) return null;
    // the path (sources, pairs) is read for few of the evaluated cycles: worked out when first asked
    let path: { sources: number[][]; pairs: [number, number][] } | null = null;
    const pathOf = () => (path ??= cyclePath(g, pg, cyc));
    return { parts: cyc, get sources() { return pathOf().sources; }, get pairs() { return pathOf().pairs; }, mags, dc: { re: gains[0], im: gains[1] }, peakIdx, folded: [] };
  };
  const multi: PartCycle[] = [];
  for (const cyc of found.cycles) {
    const c = evaluate(cyc);
    if (c) multi.push(c);
  }

  // detours: shortest first, so the loops a longer cycle is made of are decided before it. A cycle
  // whose detours (short runs of parts off a direct part edge, each part of the run closing a listed
  // loop with the run's ends) are taken out is the loop it varies; that loop is listed (evaluated
  // here when the enumeration did not reach it) and the cycle is folded into it.
  multi.sort((a, b) => a.parts.length - b.parts.length || b.mags[b.peakIdx] - a.mags[a.peakIdx]);
  const keptMulti: PartCycle[] = [];
  // per part, the listed loops through it that are short enough to lie within a detour and its two
  // ends (withoutDetours asks for no others)
  const loopsOf: PartCycle[][] = Array.from({ length: P }, () => []);
  const keep = (c: PartCycle) => {
    keptMulti.push(c);
    if (c.parts.length <= DETOUR_LEN + 2) for (const p of c.parts) loopsOf[p].push(c);
  };
  for (const c of multi) {
    const core = withoutDetours(c.parts, loopsOf, pg.peak, P);
    if (core.length === c.parts.length) { keep(c); continue; }
    let base = keptMulti.find((k) => sameCycle(k.parts, core)) ?? null;
    if (!base) {
      base = evaluate(core);
      if (base) keep(base);
    }
    if (base) base.folded.push(c.parts);
    else keep(c);
  }
  // a macro's own loop through the same nets as a larger loop through it
  const netMemo = new Map<PartCycle, Set<number>>();
  const netsOf = (c: PartCycle) => netMemo.get(c) ?? netMemo.set(c, netsOfCycle(c)).get(c)!;
  const netsOfCycle = (c: PartCycle) => new Set(c.pairs.flatMap(([i, j]) => [g.outNode[i * N + j], g.ctlNode[i * N + j]]).filter((v) => v >= 0 && visible(v)));
  const keptLocal: PartCycle[] = [];
  for (const c of locals) {
    const p = c.parts[0];
    const mine = netsOf(c);
    const host = keptMulti.find((k) => {
      if (!k.parts.includes(p)) return false;
      const theirs = netsOf(k);
      if (![...mine].every((v) => theirs.has(v))) return false;
      return pg.macro[p] || (theirs.size === mine.size && keySource(k, rank) === keySource(c, rank));
    });
    if (host) {
      host.folded.push(c.parts);
      host.mags = host.mags.map((m, k) => Math.max(m, c.mags[k]));
      host.peakIdx = peakOf(host.mags);
    } else keptLocal.push(c);
  }
  return { partGraph: pg, cycles: [...keptMulti, ...keptLocal], truncated: found.truncated };
}

/** The source a loop would be broken at by role alone (lowest rank, then lowest index). */
function keySource(c: PartCycle, rank: (source: number) => number): number {
  return c.sources.flat().reduce((a, b) => (rank(b) < rank(a) || (rank(b) === rank(a) && b < a) ? b : a));
}

/** Sources of a part that lie on a cycle among themselves (Tarjan-free: tiny graphs, by reachability)
 *  and the strongest such source cycle, as pairs. */
function internalCycle(g: CouplingGraph, list: number[]): { on: number[]; pairs: [number, number][] } | null {
  const N = g.stamps.length;
  const adj = list.map((i) => list.map((j, b) => (g.peak[i * N + j] > EDGE_FLOOR ? b : -1)).filter((b) => b >= 0));
  const cycles = elementaryCycles(list.length, adj, 200).cycles;
  if (!cycles.length) return null;
  const strength = (c: number[]) => c.reduce((s, v, k) => s * g.peak[list[v] * N + list[c[(k + 1) % c.length]]], 1);
  const best = cycles.reduce((a, b) => (strength(b) > strength(a) ? b : a));
  const on = [...new Set(cycles.flat())].sort((a, b) => a - b).map((b) => list[b]);
  return { on, pairs: best.map((v, k) => [list[v], list[best[(k + 1) % best.length]]] as [number, number]) };
}

/** For each part edge of the cycle, the strongest source pair; and each part's sources on the path. */
function cyclePath(g: CouplingGraph, pg: PartGraph, cyc: number[]): { sources: number[][]; pairs: [number, number][] } {
  const N = g.stamps.length;
  const pairs: [number, number][] = [];
  const into: Set<number>[] = cyc.map(() => new Set<number>());
  const outOf: Set<number>[] = cyc.map(() => new Set<number>());
  for (let k = 0; k < cyc.length; k++) {
    const kn = (k + 1) % cyc.length;
    let best: [number, number] = [pg.sourcesOf[cyc[k]][0], pg.sourcesOf[cyc[kn]][0]];
    let bestPeak = -1;
    for (const i of pg.sourcesOf[cyc[k]]) {
      for (const j of pg.sourcesOf[cyc[kn]]) {
        const v = g.peak[i * N + j];
        if (v <= EDGE_FLOOR) continue;
        outOf[k].add(i);
        into[kn].add(j);
        if (v > bestPeak) { bestPeak = v; best = [i, j]; }
      }
    }
    pairs.push(best);
  }
  const sources = cyc.map((_, k) => [...new Set([...into[k], ...outOf[k]])].sort((a, b) => a - b));
  return { sources, pairs };
}

function frobenius(m: { re: Float64Array; im: Float64Array } | null): number {
  if (!m) return Infinity;
  let s = 0;
  for (let i = 0; i < m.re.length; i++) s += m.re[i] * m.re[i] + m.im[i] * m.im[i];
  return Math.sqrt(s);
}

/** At frequency index fi, the squared Frobenius norm of every part-to-part block of D into `out`
 *  ([a*P + b]): each block's entries summed in the order of its sources (row by row). */
function blockNormsSquared(g: CouplingGraph, pg: PartGraph, fi: number, out: Float64Array): void {
  const N = g.stamps.length;
  const P = pg.parts.length;
  const partOf = pg.partOf;
  const re = g.re[fi], im = g.im[fi];
  out.fill(0);
  for (let i = 0; i < N; i++) {
    const row = i * N, base = partOf[i] * P;
    for (let j = 0; j < N; j++) { const r = re[row + j], m = im[row + j]; out[base + partOf[j]] += r * r + m * m; }
  }
}

/** Longest run of parts taken out as one detour. */
const DETOUR_LEN = SHORT_LEN;

/** A direct edge p → q stands for the path p → S → q when its peak coupling is at least this part of
 *  the path's (product of the peaks): a parallel path, not the way the signal really goes. */
const PARALLEL_RATIO = 0.1;

/** The cycle with its detours taken out, rotated to start at its smallest part (as the cycle
 *  enumerations give them). A run S between parts p and q is a detour when p → q is itself a
 *  coupling about as strong as the path through S (PARALLEL_RATIO), and every part of S closes a
 *  listed loop within S ∪ {p, q} that passes p or q (a booster between a cascode's input device and
 *  the cascode: the booster loop is listed on its own). `peak[a*P + b]`: peak coupling part a → b. */
function withoutDetours(parts: number[], loopsOf: PartCycle[][], peak: Float64Array, P: number): number[] {
  let cur = parts.slice();
  for (let changed = true; changed && cur.length > 2;) {
    changed = false;
    const L = cur.length;
    for (let i = 0; i < L && !changed; i++) {
      for (let len = 1; len <= Math.min(DETOUR_LEN, L - 2) && !changed; len++) {
        const p = cur[i], q = cur[(i + len + 1) % L];
        const direct = peak[p * P + q];
        if (!(direct > EDGE_FLOOR)) continue;
        let path = 1;
        for (let k = 0, from = p; k <= len; k++) { const to = cur[(i + 1 + k) % L]; path *= peak[from * P + to]; from = to; }
        if (!(direct >= PARALLEL_RATIO * path)) continue;
        // every part of the run closes a listed loop within the run and its ends that passes p or q
        let detour = true;
        for (let k = 0; k < len && detour; k++) {
          const list = loopsOf[cur[(i + 1 + k) % L]];
          let found = false;
          for (let t = 0; t < list.length && !found; t++) found = withinRun(list[t].parts, p, q, cur, i + 1, len);
          detour = found;
        }
        if (!detour) continue;
        const from = cur;
        cur = cur.filter((x) => !inRun(x, from, i + 1, len));
        changed = true;
      }
    }
  }
  const start = cur.indexOf(Math.min(...cur));
  return [...cur.slice(start), ...cur.slice(0, start)];
}

/** x is one of the `len` parts of `cur` from position `at` on (cyclically). */
function inRun(x: number, cur: number[], at: number, len: number): boolean {
  for (let k = 0; k < len; k++) if (cur[(at + k) % cur.length] === x) return true;
  return false;
}

/** The loop `parts` passes p or q and lies within {p, q} and the run. */
function withinRun(parts: number[], p: number, q: number, cur: number[], at: number, len: number): boolean {
  if (!parts.includes(p) && !parts.includes(q)) return false;
  for (const x of parts) if (x !== p && x !== q && !inRun(x, cur, at, len)) return false;
  return true;
}

function sameCycle(a: number[], b: number[]): boolean {
  return a.length === b.length && a.every((v, k) => v === b[k]);
}
