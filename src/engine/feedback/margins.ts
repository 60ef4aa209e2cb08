// Stability of one loop from its key source's return ratio T(jω): the crossover |T| = 1 (the loop's
// unity-gain frequency, polished by bisection in log f), phase margin 180° + ∠T there, and gain
// margin −20·log10|T| where ∠T first reaches −180°. The phase is unwrapped from DC along a log grid
// (Bode 1945 conventions; T > 0 at DC means negative feedback). Linear small-signal estimate.
import type { Cx, MnaSystem } from '../types';
import { scaledG, sourceStamps, logSpace } from './pencil';
import { returnRatiosAt, scaleStamp } from './returnRatio';
import { cabs, carg } from './cx';

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
  const empty = { key, dc: null, unityGainHz: null, phaseMarginDeg: null, phaseCrossHz: null, gainMarginDb: null };
  const stamps = sourceStamps(sys);
  const raw = stamps.find((s) => s.id === key);
  if (!raw) return { ...empty, status: 'unknown-source', message: `no controlled source "${key}" in this network` };
  const G = scaledG(sys, stamps, opts.scale ?? {});
  const s = scaleStamp(raw, opts.scale?.[key]);
  const at = (f: number) => returnRatiosAt(sys, G, [s], 2 * Math.PI * f)[0];
  const dcPoint = at(0);
  if (!dcPoint.value) return { ...empty, status: 'not-computable', message: `${key}: return ratio at DC could not be computed (${dcPoint.status})` };
  const grid = logSpace(opts.fMin ?? 1, opts.fMax ?? 1e12, opts.perDecade ?? 20);
  const values: Cx[] = [];
  for (const f of grid) {
    const p = at(f);
    if (!p.value) return { ...empty, dc: dcPoint.value, status: 'not-computable', message: `${key}: return ratio not computable at ${f.toPrecision(3)} Hz (${p.status})` };
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
    const fu = bisectLog(grid[cross - 1], grid[cross], (f) => cabs(at(f).value ?? { re: 0, im: 0 }) - 1);
    result.unityGainHz = fu;
    const ph = unwrapNear(carg(at(fu).value!), phase[cross - 1]);
    result.phaseMarginDeg = 180 + ph * DEG;
  }
  const pc = phase.findIndex((p, i) => i > 0 && phase[i - 1] > -Math.PI && p <= -Math.PI);
  if (pc > 0) {
    const ref = phase[pc - 1];
    const fp = bisectLog(grid[pc - 1], grid[pc], (f) => unwrapNear(carg(at(f).value!), ref) + Math.PI);
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

/** Root of g between f1 and f2 (g(f1) ≥ 0 > g(f2) or the reverse), bisection on log f. */
export function bisectLog(f1: number, f2: number, g: (f: number) => number, iterations = 60): number {
  let lo = Math.log(f1), hi = Math.log(f2);
  const gLo = g(f1);
  for (let k = 0; k < iterations; k++) {
    const mid = 0.5 * (lo + hi);
    const gm = g(Math.exp(mid));
    if ((gm >= 0) === (gLo >= 0)) lo = mid; else hi = mid;
    if (hi - lo < 1e-12) break;
  }
  return Math.exp(0.5 * (lo + hi));
}
