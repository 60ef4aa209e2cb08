// Benchmark of the full live analysis (what the live store runs on every edit: stage 1 =
// analyze() with the node-impedance sweep, stage 2 = the feedback analysis with Blackman
// factors; src/worker/compute.ts) against the number of unknowns, n = 10 … 200, on the invented
// amplifier chains of analysis-bench.ts. The growth exponent k of t ≈ c·n^k is fitted by least
// squares on log t vs log n. Prints times, ratios and exponents; asserts nothing (no test may
// assert wall-clock time).
import { buildMna } from '../../src/engine/index';
import { runStage1, runStage2 } from '../../src/worker/compute';
import type { RunRequest } from '../../src/worker/protocol';
import { chainNetlist } from './analysis-bench';

export interface PowerFit {
  /** Exponent k of t ≈ c·n^k. */
  exponent: number;
  /** Prefactor c (time units of the input). */
  prefactor: number;
  /** Coefficient of determination of the fit in log–log space. */
  r2: number;
}

/** Ordinary least squares of log t = log c + k·log n (common practice for growth exponents). */
export function fitPowerLaw(ns: number[], ts: number[]): PowerFit | null {
  const pts = ns.map((n, i) => [Math.log(n), Math.log(ts[i])]).filter(([x, y]) => Number.isFinite(x) && Number.isFinite(y));
  if (pts.length < 2) return null;
  const mx = pts.reduce((s, [x]) => s + x, 0) / pts.length;
  const my = pts.reduce((s, [, y]) => s + y, 0) / pts.length;
  let sxx = 0, sxy = 0, syy = 0;
  for (const [x, y] of pts) { sxx += (x - mx) ** 2; sxy += (x - mx) * (y - my); syy += (y - my) ** 2; }
  if (sxx === 0) return null;
  const k = sxy / sxx;
  const r2 = syy === 0 ? 1 : (sxy * sxy) / (sxx * syy);
  return { exponent: k, prefactor: Math.exp(my - k * mx), r2 };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Median of at least `minRuns` timed calls and at least `minMs` in all, after one warm-up call. */
function time(fn: () => unknown, minRuns = 3, minMs = 300, maxRuns = 25): number {
  fn();
  const ts: number[] = [];
  const t0 = performance.now();
  while (ts.length < minRuns || (performance.now() - t0 < minMs && ts.length < maxRuns)) {
    const a = performance.now();
    fn();
    ts.push(performance.now() - a);
  }
  return median(ts);
}

export interface ScalingRow { unknowns: number; stage1: number; stage2: number; total: number; loops: number }

export function runScalingBench(sizes = [10, 20, 40, 60, 100, 150, 200], print: (s: string) => void = console.log): { rows: ScalingRow[]; fits: Record<string, PowerFit | null> } {
  const rows: ScalingRow[] = [];
  print('full live analysis per edit (stage 1 + stage 2, src/worker/compute.ts) on invented amplifier chains — median ms');
  print('unknowns   stage 1   stage 2     total   ×total of first   loops');
  for (const n of sizes) {
    // chainNetlist(s) has s + 3 unknowns (s + 2 nodes and the source branch)
    const netlist = chainNetlist(n - 3);
    const unknowns = buildMna(netlist).system!.n;
    const req: RunRequest = { runId: 1, netlist, frequencyHz: 0, offSources: [], offLoops: [] };
    const stage1 = time(() => runStage1(req));
    let loops = 0;
    const stage2 = time(() => { loops = runStage2(req).feedback.loops.length; });
    const total = stage1 + stage2;
    rows.push({ unknowns, stage1, stage2, total, loops });
    const ratio = total / rows[0].total;
    print(`${String(unknowns).padStart(8)} ${stage1.toFixed(1).padStart(9)} ${stage2.toFixed(1).padStart(9)} ${total.toFixed(1).padStart(9)} ${ratio.toFixed(1).padStart(17)} ${String(loops).padStart(7)}`);
  }
  const ns = rows.map((r) => r.unknowns);
  const fits = {
    stage1: fitPowerLaw(ns, rows.map((r) => r.stage1)),
    stage2: fitPowerLaw(ns, rows.map((r) => r.stage2)),
    total: fitPowerLaw(ns, rows.map((r) => r.total)),
  };
  for (const [name, f] of Object.entries(fits)) {
    print(f ? `growth exponent (least squares on log t vs log n), ${name}: k = ${f.exponent.toFixed(2)} (R² = ${f.r2.toFixed(3)})` : `${name}: too few points to fit`);
  }
  print('stage 2 lists at most the loops its search keeps (truncated search on these chains), so its growth is not that of all loops.');
  return { rows, fits };
}

const invokedDirectly = typeof process !== 'undefined' && /scaling-bench\.[cm]?[tj]s$/.test(process.argv[1] ?? '');
if (invokedDirectly) runScalingBench();
