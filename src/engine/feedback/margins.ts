// Stability of one loop from its key source's return ratio T(jω): the crossover |T| = 1 (the loop's
// unity-gain frequency, polished by bisection in log f), phase margin 180° + ∠T there, and gain
// margin −20·log10|T| where ∠T first reaches −180°. The phase is unwrapped from DC along a log grid
// (Bode 1945 conventions; T > 0 at DC means negative feedback). Linear small-signal estimate.
import type { Cx, MnaSystem } from '../types';
import { controlIsGround, scaledG, sourceStamps, logSpace, uVector } from './pencil';
import type { SourceStamp } from './pencil';
import { ReducedPencil } from './reduced';
import { returnRatiosAt, scaleStamp } from './returnRatio';
import type { ReturnRatioPoint, ReturnRatioSweep } from './returnRatio';
import { cabs, carg, hypot2 } from './cx';

export interface LoopMargins {
  key: string;
  status: 'ok' | 'no-crossover' | 'positive-feedback' | 'unknown-source' | 'not-computable';
  message?: string;
  dc: Cx | null;
  unityGainHz: number | null;
  phaseMarginDeg: number | null;
  phaseCrossHz: number | null;
  gainMarginDb: number | null;
}

export interface MarginOptions {
  fMin?: number;
  fMax?: number;
  perDecade?: number;
  scale?: Record<string, number>;
}

const DEG = 180 / Math.PI;

export function loopMargins(sys: MnaSystem, key: string, opts: MarginOptions = {}): LoopMargins {
  return loopMarginsMany(sys, [key], opts)[0];
}

/** Margins of several loops' keys; the frequency grid shares one factor per frequency. */
export function loopMarginsMany(sys: MnaSystem, keys: string[], opts: MarginOptions = {}): LoopMargins[] {
  const stamps = sourceStamps(sys);
  const G = scaledG(sys, stamps, opts.scale ?? {});
  const found = keys.map((key) => stamps.find((s) => s.id === key)).map((raw) => (raw ? scaleStamp(raw, opts.scale?.[raw.id]) : null));
  const live = found.filter((s): s is NonNullable<typeof s> => s !== null);
  const grid = logSpace(opts.fMin ?? 1, opts.fMax ?? 1e12, opts.perDecade ?? 10);
  const dcAll = returnRatiosAt(sys, G, live, 0);
  const gridAll = grid.map((f) => returnRatiosAt(sys, G, live, 2 * Math.PI * f));
  const polish = polishers(sys, G, live, grid[grid.length >> 1]);
  let li = 0;
  return keys.map((key, k) => {
    const s = found[k];
    if (!s) return { ...emptyMargins(key), status: 'unknown-source' as const, message: `no controlled source "${key}" in this network` };
    const i = li++;
    return marginsFrom(key, dcAll[i], grid, gridAll.map((row) => row[i]), polish[i]);
  });
}

/** Margins from return-ratio sweeps already computed (e.g. the loop discovery's, one factor per
 *  frequency for all keys); only the crossings are polished by extra solves. */
/** `reduced`: the Hessenberg form of the same (scaled) network when the caller holds it. */
export function loopMarginsFromSweeps(
  sys: MnaSystem, sweeps: ReturnRatioSweep[], opts: { scale?: Record<string, number>; reduced?: ReducedPencil | null } = {},
): LoopMargins[] {
  const stamps = sourceStamps(sys);
  const G = scaledG(sys, stamps, opts.scale ?? {});
  const found = sweeps.map((sw) => stamps.find((s) => s.id === sw.id)).map((raw) => (raw ? scaleStamp(raw, opts.scale?.[raw.id]) : null));
  const live = found.filter((s): s is NonNullable<typeof s> => s !== null);
  const mid = sweeps.find((sw) => sw.fHz.length)?.fHz;
  const polish = polishers(sys, G, live, mid ? mid[mid.length >> 1] : 1e6, opts.reduced);
  let li = 0;
  return sweeps.map((sw, k) => {
    if (!found[k]) return { ...emptyMargins(sw.id), status: 'unknown-source' as const, message: `no controlled source "${sw.id}" in this network` };
    return marginsFrom(sw.id, sw.dc, sw.fHz, sw.points, polish[li++]);
  });
}

/** T(j2πf) of each source for the crossing searches: on the network's Hessenberg form (reduced.ts,
 *  Laub 1981), one O(n²) solve per point instead of a new factor, when it agrees with the direct
 *  solve at a probe frequency; the direct solve where the fast path refuses a point. */
function polishers(
  sys: MnaSystem, G: Float64Array, stamps: SourceStamp[], probeHz: number, reduced?: ReducedPencil | null,
): ((f: number) => ReturnRatioPoint)[] {
  const direct = stamps.map((s) => (f: number) => returnRatiosAt(sys, G, [s], 2 * Math.PI * f)[0]);
  const rp = !stamps.length ? null : reduced !== undefined ? reduced : ReducedPencil.of(G, sys.C, sys.n);
  if (!rp) return direct;
  const forms = stamps.map((s) => (controlIsGround(s) || s.value === 0 ? null : {
    bt: rp.input(uVector(s, sys.n)),
    ct: rp.output([s.cp, s.cn].filter((v) => v >= 0), [s.cp >= 0 ? 1 : null, s.cn >= 0 ? -1 : null].filter((v): v is number => v !== null)),
  }));
  const fast = stamps.map((s, i) => (f: number): ReturnRatioPoint => {
    const form = forms[i];
    const a = form ? rp.transfer(form.bt, form.ct, 2 * Math.PI * f) : null;
    return a ? fromLoopTransmission(a) : direct[i](f);
  });
  const ref = returnRatiosAt(sys, G, stamps, 2 * Math.PI * probeHz);
  const agrees = ref.every((p, i) => {
    const q = fast[i](probeHz);
    if (!p.value || !q.value) return p.status === q.status;
    return hypot2(p.value.re - q.value.re, p.value.im - q.value.im) <= PROBE_TOL * Math.max(cabs(p.value), 1e-12);
  });
  return agrees ? fast : direct;
}

const PROBE_TOL = 1e-6;

/** T = a/(1 − a) from a = vᵀ(G + sC)⁻¹u, as returnRatio.ts returnRatiosAt. */
function fromLoopTransmission(a: Cx): ReturnRatioPoint {
  const dr = 1 - a.re;
  const di = -a.im;
  const d = dr * dr + di * di;
  const mag = hypot2(a.re, a.im);
  if (d <= 1e-24 * Math.max(1, mag * mag)) return { value: null, status: 'infinite' };
  return { value: { re: (a.re * dr + a.im * di) / d, im: (a.im * dr - a.re * di) / d }, status: 'ok' };
}

function emptyMargins(key: string) {
  return { key, dc: null, unityGainHz: null, phaseMarginDeg: null, phaseCrossHz: null, gainMarginDb: null };
}

function marginsFrom(
  key: string, dcPoint: ReturnRatioPoint, grid: number[], points: ReturnRatioPoint[], at: (f: number) => ReturnRatioPoint,
): LoopMargins {
  const empty = emptyMargins(key);
  if (!dcPoint.value) return { ...empty, status: 'not-computable', message: `${key}: return ratio at DC could not be computed (${dcPoint.status})` };
  const values: Cx[] = [];
  for (const [gi, p] of points.entries()) {
    if (!p.value) return { ...empty, dc: dcPoint.value, status: 'not-computable', message: `${key}: return ratio not computable at ${grid[gi].toPrecision(3)} Hz (${p.status})` };
    values.push(p.value);
  }
  // unwrapped phase, starting from the DC phase (0 for negative feedback)
  const phase: number[] = [];
  let prev = carg(dcPoint.value);
  for (const v of values) {
    let a = carg(v);
    while (a - prev > Math.PI) a -= 2 * Math.PI;
    while (a - prev < -Math.PI) a += 2 * Math.PI;
    phase.push(a);
    prev = a;
  }
  const result: LoopMargins = { ...empty, dc: dcPoint.value, status: 'ok' };
  if (dcPoint.value.re < 0 && Math.abs(dcPoint.value.im) < Math.abs(dcPoint.value.re)) {
    result.status = 'positive-feedback';
    result.message = `${key}: T at DC is negative (${dcPoint.value.re.toPrecision(3)}): positive feedback; margins are not defined`;
    return result;
  }
  const mags = values.map(cabs);
  const cross = mags.findIndex((m, i) => i > 0 && mags[i - 1] >= 1 && m < 1);
  if (cross < 0) {
    result.status = 'no-crossover';
    result.message = mags[0] < 1 ? `${key}: |T| stays below 1 over the sweep, no crossover` : `${key}: |T| stays above 1 up to ${grid[grid.length - 1].toPrecision(3)} Hz`;
  } else {
    // to 1e-7 in |T| − 1 and in phase (rad): far below what a margin is read to, and few factors
    const fu = bisectLog(grid[cross - 1], grid[cross], (f) => cabs(at(f).value ?? { re: 0, im: 0 }) - 1, 20, 1e-7, 1e-7);
    result.unityGainHz = fu;
    const ph = unwrapNear(carg(at(fu).value!), phase[cross - 1]);
    // reported in (−180°, 180°]: whole turns picked up by the grid unwrap carry no meaning here
    const pm = 180 + ph * DEG;
    result.phaseMarginDeg = pm - 360 * Math.ceil((pm - 180) / 360);
  }
  const pc = phase.findIndex((p, i) => i > 0 && phase[i - 1] > -Math.PI && p <= -Math.PI);
  if (pc > 0) {
    const ref = phase[pc - 1];
    const fp = bisectLog(grid[pc - 1], grid[pc], (f) => unwrapNear(carg(at(f).value!), ref) + Math.PI, 20, 1e-7, 1e-7);
    result.phaseCrossHz = fp;
    result.gainMarginDb = -20 * Math.log10(cabs(at(fp).value!));
  }
  return result;
}

function unwrapNear(a: number, ref: number): number {
  while (a - ref > Math.PI) a -= 2 * Math.PI;
  while (a - ref < -Math.PI) a += 2 * Math.PI;
  return a;
}

/** Root of g between f1 and f2 (opposite signs at the ends), on log f: false position with the
 *  Illinois modification (Dowell & Jarratt 1971), which keeps bracketing and converges superlinearly. */
export function bisectLog(f1: number, f2: number, g: (f: number) => number, iterations = 60, logTol = 1e-12, gTol = 1e-13): number {
  let a = Math.log(f1), b = Math.log(f2);
  let ga = g(f1), gb = g(f2);
  if (ga === 0) return f1;
  if (gb === 0) return f2;
  let side = 0;
  for (let k = 0; k < iterations && Math.abs(b - a) > logTol; k++) {
    const c = (a * gb - b * ga) / (gb - ga);
    const gc = g(Math.exp(c));
    if (gc === 0 || !Number.isFinite(gc)) return Math.exp(c);
    if ((gc > 0) === (gb > 0)) {
      b = c; gb = gc;
      if (side === -1) ga /= 2;
      side = -1;
    } else {
      a = c; ga = gc;
      if (side === 1) gb /= 2;
      side = 1;
    }
    if (Math.abs(gc) < gTol) break;
  }
  return Math.exp((a * gb - b * ga) / (gb - ga));
}
