// Benchmark of the generalized eigen solver on random circuit pencils, and the seeded generator of
// those pencils (shared with the tests). Compares our finiteEigenvalues against LAPACK dggev
// (emlapack), mathjs eigs and ml-matrix EigenvalueDecomposition on the same matrices.
import { eigs, matrix } from 'mathjs';
import { Matrix, EigenvalueDecomposition, inverse } from 'ml-matrix';
import { finiteEigenvalues } from '../../src/engine/linalg/qz';
import { dggev } from './emlapack';
import { rng } from '../seeded';

export { rng } from '../seeded';

export interface NetworkPencil {
  n: number;
  /** A = −G and B = C of the MNA system (G + sC)x = 0, row-major. */
  A: Float64Array;
  B: Float64Array;
  G: Float64Array;
  C: Float64Array;
  nodeCount: number;
  /** Nodes that carry no capacitor (zero rows/columns of C). */
  bareNodes: number[];
}

export interface NetworkOptions {
  /** Give every node a capacitor and add no voltage sources, so C is invertible. */
  invertibleC?: boolean;
  /** Decades spanned by the capacitor values (default 3) — more makes a stiffer pencil. */
  capDecades?: number;
}

/** A random small-signal network of n unknowns: conductances to ground and between nearby and
 *  far nodes, grounded and coupling capacitors, transconductances with random control pins, and
 *  (unless invertibleC) voltage sources to ground, each on a node without capacitors so the
 *  pencil stays of index one. Unknowns: node voltages, then one branch current per source. */
export function randomNetworkPencil(n: number, seed: number, opts: NetworkOptions = {}): NetworkPencil {
  const r = rng(seed);
  const sources = opts.invertibleC ? 0 : Math.max(1, Math.round(n / 12));
  const nodes = n - sources;
  const G = new Float64Array(n * n), C = new Float64Array(n * n);
  const logU = (lo: number, hi: number) => 10 ** (lo + (hi - lo) * r());
  const pick = () => Math.floor(r() * nodes);
  const stamp = (M: Float64Array, a: number, b: number, v: number) => {
    M[a * n + a] += v; M[b * n + b] += v; M[a * n + b] -= v; M[b * n + a] -= v;
  };
  const sourceNodes = new Set<number>();
  while (sourceNodes.size < sources) sourceNodes.add(pick());
  const capDecades = opts.capDecades ?? 3;
  for (let i = 0; i < nodes; i++) {
    G[i * n + i] += logU(-5, -3);
    if (i + 1 < nodes) stamp(G, i, i + 1, logU(-5, -3));
    const near = Math.min(nodes - 1, i + 2 + Math.floor(r() * 4));
    if (near !== i && r() < 0.5) stamp(G, i, near, logU(-5, -3));
  }
  for (let k = 0; k < Math.floor(nodes / 10); k++) {
    const a = pick(), b = pick();
    if (a !== b) stamp(G, a, b, logU(-5, -3));
  }
  const capable = (i: number) => !sourceNodes.has(i);
  const bare = new Set<number>();
  for (let i = 0; i < nodes; i++) {
    if (!capable(i)) { bare.add(i); continue; }
    if (opts.invertibleC || r() < 0.75) C[i * n + i] += logU(-14, -14 + capDecades);
    else bare.add(i);
  }
  for (let k = 0; k < Math.floor(nodes / 4); k++) {
    const a = pick(), b = pick();
    if (a !== b && !bare.has(a) && !bare.has(b)) stamp(C, a, b, logU(-14, -14 + capDecades));
  }
  // Transconductance gm·(v(cp) − v(cn)) out of node p into node q (src/engine/types.ts).
  for (let k = 0; k < Math.floor(nodes / 4); k++) {
    const p = pick(), q = r() < 0.5 ? -1 : pick(), cp = pick(), cn = r() < 0.5 ? -1 : pick();
    const gm = logU(-4, -2.5) * (r() < 0.8 ? 1 : -1);
    const add = (row: number, col: number, v: number) => { if (row >= 0 && col >= 0) G[row * n + col] += v; };
    add(p, cp, gm); add(p, cn, -gm); add(q, cp, -gm); add(q, cn, gm);
  }
  let branch = nodes;
  for (const p of sourceNodes) {
    G[p * n + branch] += 1; G[branch * n + p] += 1;
    branch++;
  }
  const A = G.map((v) => -v);
  return { n, A, B: C, G, C, nodeCount: nodes, bareNodes: [...bare].sort((a, b) => a - b) };
}

/** −C⁻¹G as an ml-matrix Matrix (its eigenvalues are the finite λ of (−G, C)). */
export function standardForm(p: NetworkPencil): Matrix {
  const rows = (M: Float64Array) => Array.from({ length: p.n }, (_, i) => Array.from(M.subarray(i * p.n, (i + 1) * p.n)));
  return inverse(new Matrix(rows(p.C))).mmul(new Matrix(rows(p.A)));
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function time(fn: () => void, repeats: number, warmUp = true): number {
  if (warmUp) fn();
  const ts: number[] = [];
  for (let k = 0; k < repeats; k++) {
    const t0 = performance.now();
    fn();
    ts.push(performance.now() - t0);
  }
  return median(ts);
}

export interface EigBenchRow {
  n: number;
  /** Pencil with singular C (sources, bare nodes). */
  ours: number; oursNoRefine: number; dggev: number;
  /** Pencil with invertible C, same generator: all four solvers on the same network. */
  oursInvC: number; dggevInvC: number; mathjs: number | null | undefined; mlMatrix: number;
}

/** Median time of fn, or null when it throws (e.g. mathjs not converging). */
function timeOrNull(fn: () => void, repeats: number, warmUp: boolean): number | null {
  try { return time(fn, repeats, warmUp); } catch { return null; }
}

/** Time the solvers and print a table of medians (ms) and ratios. */
export function runEigBench(sizes = [10, 30, 60, 120, 200], log: (s: string) => void = console.log): EigBenchRow[] {
  const rows: EigBenchRow[] = [];
  const f = (x: number | null | undefined, w: number) =>
    (x === null ? 'failed' : x === undefined ? 'skipped' : x.toFixed(x < 10 ? 2 : 1)).padStart(w);
  log('generalized eigenvalues of random network pencils, ms (best of 3 medians; mathjs: one run from n = 60)');
  log('singular C (sources, bare nodes):          | invertible C, same generator:');
  log('   n    ours  no-refine   dggev  ours/dggev |    ours   dggev  mathjs  ml-matrix  ours/dggev  ours/mathjs  ours/ml-matrix');
  for (const n of sizes) {
    const repeats = n <= 60 ? 15 : n <= 120 ? 7 : 5;
    const p = randomNetworkPencil(n, 1000 + n);
    const q = randomNetworkPencil(n, 2000 + n, { invertibleC: true });
    // mathjs' eigs tests convergence with an absolute tolerance, so it gets −C⁻¹G scaled to
    // unit max entry (eigenvalues scale with it; the work is the same).
    const M = standardForm(q);
    const M2 = M.to2DArray();
    const big = Math.max(...M2.flat().map(Math.abs));
    const Mscaled = matrix(M2.map((r) => r.map((v) => v / big)));
    // Ours and dggev alternate so that load from other processes hits both alike.
    let ours = 0, plain = 0, lap = 0, oursQ = 0, lapQ = 0;
    const ts: number[][] = [[], [], [], [], []];
    for (let rep = 0; rep < 3; rep++) {
      ts[0].push(time(() => finiteEigenvalues(p.A, p.B, n), repeats));
      ts[1].push(time(() => finiteEigenvalues(p.A, p.B, n, { refine: false }), repeats));
      ts[2].push(time(() => dggev(p.A, p.B, n), repeats));
      ts[3].push(time(() => finiteEigenvalues(q.A, q.B, n), repeats));
      ts[4].push(time(() => dggev(q.A, q.B, n), repeats));
    }
    [ours, plain, lap, oursQ, lapQ] = ts.map((t) => Math.min(...t));
    // mathjs takes ~20 s at n = 60 and minutes beyond (O(n³) at a large constant): one run at
    // n = 60, skipped above unless EIG_BENCH_MATHJS=all.
    const mjAll = process.env.EIG_BENCH_MATHJS === 'all';
    const mj = n > 60 && !mjAll ? undefined
      : timeOrNull(() => eigs(Mscaled, { eigenvectors: false }), n >= 60 ? 1 : repeats, n < 60);
    const ml = time(() => new EigenvalueDecomposition(M, { assumeSymmetric: false }), repeats);
    rows.push({ n, ours, oursNoRefine: plain, dggev: lap, oursInvC: oursQ, dggevInvC: lapQ, mathjs: mj, mlMatrix: ml });
    log(`${String(n).padStart(4)} ${f(ours, 7)} ${f(plain, 10)} ${f(lap, 7)} ${f(ours / lap, 11)} | ${f(oursQ, 7)} ${f(lapQ, 7)} ${f(mj, 7)} ${f(ml, 10)} ${f(oursQ / lapQ, 11)} ${f(mj == null ? mj : oursQ / mj, 12)} ${f(oursQ / ml, 15)}`);
  }
  log('ours = finiteEigenvalues (default: permute, gated refinement); dggev = LAPACK via emlapack (wasm);');
  log('mathjs eigs and ml-matrix EigenvalueDecomposition run on −C⁻¹G (forming it is not timed);');
  log("'failed' = mathjs threw (no convergence), 'skipped' = not run (see EIG_BENCH_MATHJS).");
  return rows;
}
