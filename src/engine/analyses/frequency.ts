// Frequency response of the chosen transfer on a log grid: magnitude (dB), unwrapped phase,
// −3 dB bandwidth and unity-gain frequency (grid crossing, log-interpolated, then bisection on |H|).

import type { Cx } from '../types';
import type { TransferEvaluator } from './transfer';

/** Log-spaced frequencies from fMin to fMax (both included), `perDecade` points per decade. */
export function logGrid(fMin: number, fMax: number, perDecade: number): Float64Array {
  if (!(fMin > 0) || !(fMax > fMin) || !(perDecade >= 1)) return new Float64Array(fMin > 0 ? [fMin] : []);
  const decades = Math.log10(fMax / fMin);
  const steps = Math.max(1, Math.ceil(decades * perDecade - 1e-9));
  const out = new Float64Array(steps + 1);
  for (let i = 0; i <= steps; i++) out[i] = fMin * Math.pow(10, (decades * i) / steps);
  out[steps] = fMax;
  return out;
}

export interface Sweep {
  hz: number[];
  /** 20·log10|H|; null where H is undefined (an undamped pole exactly on the grid). */
  magDb: (number | null)[];
  /** Phase in degrees, unwrapped along the grid (starts in (−180, 180]). */
  phaseDeg: (number | null)[];
}

const deg = (z: Cx) => (Math.atan2(z.im, z.re) * 180) / Math.PI;
const db = (z: Cx) => 20 * Math.log10(Math.hypot(z.re, z.im));

/** Shift `p` by a multiple of 360 so it lies within 180° of `ref`. */
export function nearestBranch(p: number, ref: number): number {
  return p - 360 * Math.round((p - ref) / 360);
}

export function sweepTransfer(ev: TransferEvaluator, grid: ArrayLike<number>): Sweep {
  const hz: number[] = [];
  const magDb: (number | null)[] = [];
  const phaseDeg: (number | null)[] = [];
  let last: number | null = null;
  for (let i = 0; i < grid.length; i++) {
    const f = grid[i];
    const h = ev.atHz(f);
    hz.push(f);
    if (!h || (h.re === 0 && h.im === 0)) { magDb.push(h ? -Infinity : null); phaseDeg.push(null); continue; }
    const m = db(h);
    let p = deg(h);
    if (last !== null) p = nearestBranch(p, last);
    last = p;
    magDb.push(Number.isFinite(m) ? m : null);
    phaseDeg.push(p);
  }
  // −Infinity (exact zero of H on the grid) is not JSON-safe: report it as null.
  for (let i = 0; i < magDb.length; i++) if (magDb[i] === -Infinity) magDb[i] = null;
  return { hz, magDb, phaseDeg };
}

export interface Crossing {
  hz: number | null;
  phaseDeg: number | null;
  reason?: string;
}

/** Root of ln|H(f)| = ln(level) in log f between fLo (above level) and fHi (below): regula falsi
 *  with the Illinois modification (Dowell & Jarratt 1971), superlinear and always bracketed. */
function polish(ev: TransferEvaluator, fLo: number, fHi: number, level: number, guess: number): number {
  let a = Math.log(fLo);
  let b = Math.log(fHi);
  const g = (lf: number) => { const h = ev.atHz(Math.exp(lf)); return h ? Math.log(Math.hypot(h.re, h.im) / level) : NaN; };
  let ga = g(a), gb = g(b);
  // The grid said the pair brackets the level; rounding can put an end point exactly on it.
  if (!(ga >= 0)) return fLo;
  if (!(gb < 0)) return fHi;
  if (guess > fLo && guess < fHi) {
    const lg = Math.log(guess), gg = g(lg);
    if (gg >= 0) { a = lg; ga = gg; } else if (gg < 0) { b = lg; gb = gg; }
  }
  let kept = 0; // +1: a kept on the last step, −1: b kept
  for (let it = 0; it < 100 && b - a > 1e-13; it++) {
    let c = (a * gb - b * ga) / (gb - ga);
    // Bisect when the secant point is not strictly inside (flat or rounding-level bracket).
    if (!(c > a && c < b) || it % 8 === 7) c = 0.5 * (a + b);
    const gc = g(c);
    if (!Number.isFinite(gc)) break;
    if (gc === 0) return Math.exp(c);
    if (gc < 0) { b = c; gb = gc; if (kept === 1) ga *= 0.5; kept = 1; }
    else { a = c; ga = gc; if (kept === -1) gb *= 0.5; kept = -1; }
  }
  return Math.exp(0.5 * (a + b));
}

/** First frequency on the sweep where |H| falls from ≥ level to < level, polished. */
export function findCrossing(ev: TransferEvaluator, sw: Sweep, levelDb: number): Crossing {
  const { hz, magDb, phaseDeg } = sw;
  let anyAbove = false;
  for (let i = 0; i + 1 < hz.length; i++) {
    const a = magDb[i];
    const b = magDb[i + 1];
    if (a === null || b === null) continue;
    if (a >= levelDb) anyAbove = true;
    if (a >= levelDb && b < levelDb) {
      // Log-interpolated first guess, then bisection on |H| (the grid pair brackets the root).
      const t = (a - levelDb) / (a - b);
      const guess = hz[i] * Math.pow(hz[i + 1] / hz[i], t);
      const f = polish(ev, hz[i], hz[i + 1], Math.pow(10, levelDb / 20), guess);
      const h = ev.atHz(f);
      const pa = phaseDeg[i];
      const pb = phaseDeg[i + 1];
      let p: number | null = null;
      if (h && pa !== null) {
        const ref = pb !== null ? pa + (pb - pa) * (Math.log(f / hz[i]) / Math.log(hz[i + 1] / hz[i])) : pa;
        p = nearestBranch(deg(h), ref);
      }
      return { hz: f, phaseDeg: p };
    }
  }
  const first = magDb.find((m) => m !== null);
  if (first === undefined) return { hz: null, phaseDeg: null, reason: 'no usable points in the sweep' };
  const what = levelDb === 0 ? '0 dB (|H| = 1)' : `${levelDb.toFixed(2)} dB`;
  const top = hz[hz.length - 1];
  if (!anyAbove) return { hz: null, phaseDeg: null, reason: `|H| stays below ${what} over the whole sweep` };
  const last = magDb[magDb.length - 1];
  if (last !== null && last >= levelDb) return { hz: null, phaseDeg: null, reason: `|H| is still above ${what} at the top of the sweep (${top.toPrecision(3)} Hz)` };
  return { hz: null, phaseDeg: null, reason: `|H| does not fall through ${what} within the sweep` };
}

/** −3 dB bandwidth relative to the DC gain magnitude. */
export function findBandwidth(ev: TransferEvaluator, sw: Sweep, dcGain: number | null): Crossing {
  if (dcGain === null) return { hz: null, phaseDeg: null, reason: 'no finite DC gain to refer the −3 dB point to' };
  if (dcGain === 0) return { hz: null, phaseDeg: null, reason: 'the DC gain is zero' };
  const levelDb = 20 * Math.log10(Math.abs(dcGain)) - 10 * Math.log10(2);
  return findCrossing(ev, sw, levelDb);
}

/** Unity-gain frequency (|H| = 1) and the phase there. */
export function findUnityGain(ev: TransferEvaluator, sw: Sweep): Crossing {
  return findCrossing(ev, sw, 0);
}
