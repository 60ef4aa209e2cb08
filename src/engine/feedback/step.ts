// Step response of the chosen transfer y = cᵀx of C·x' + G·x = b·u, u = unit step at t = 0, x(0) = 0,
// by backward Euler with Richardson extrapolation (one step h against two of h/2: the difference
// estimates the local error, and 2·x_half − x_full is second order and still L-stable; Hairer &
// Wanner, Solving ODEs II, IV.9). Steps are powers of two times a base step so each factor of
// (C/h + G) is reused. Works on the MNA pencil directly, singular C included (index-1 DAE).
// Settling time to ε: the last time |y − y∞| exceeds ε·|y∞|, so a slow doublet tail shows.
import type { MnaSystem } from '../types';
import { luReal, solveReal } from '../linalg/lu';
import type { RealLU } from '../linalg/lu';
import { computePoles } from '../analyses/poles';
import type { PoleResult } from '../analyses/poles';

export interface SettlingTime { tolerance: number; seconds: number | null }

export interface StepResponse {
  status: 'ok' | 'no-input' | 'no-output' | 'no-final-value' | 'singular' | 'step-limit';
  message?: string;
  t: number[];
  y: number[];
  finalValue: number | null;
  settling: SettlingTime[];
  /** Largest |y − y∞| / |y∞| after the first crossing of y∞ (overshoot), null without a final value. */
  overshoot: number | null;
}

export interface StepOptions {
  tEnd?: number;
  /** Local error tolerance relative to |y∞|; default 1e-7. */
  relTol?: number;
  tolerances?: number[];
  maxSteps?: number;
  /** Max points returned (the response is thinned evenly in step index); default 4000. */
  maxPoints?: number;
  /** Poles of the same system when already computed. */
  poles?: PoleResult;
}

export function stepResponse(sys: MnaSystem, opts: StepOptions = {}): StepResponse {
  const tolerances = opts.tolerances ?? [1e-2, 1e-3, 1e-4];
  const empty = (status: StepResponse['status'], message: string): StepResponse =>
    ({ status, message, t: [], y: [], finalValue: null, settling: tolerances.map((tolerance) => ({ tolerance, seconds: null })), overshoot: null });
  const { n, G, C, b, c } = sys;
  if (!b.some((v) => v !== 0)) return empty('no-input', 'no input chosen: pick the source that drives the step');
  if (!c.some((v) => v !== 0)) return empty('no-output', 'no output chosen: pick the node or part to observe');
  const dcLu = luReal(G, n);
  if (dcLu.singularAt >= 0) return empty('no-final-value', 'the transfer has no finite final value (a pole at s = 0 or a node with no DC path to ground)');
  const xInf = solveReal(dcLu, b);
  const yInf = dot(c, xInf);
  const scale = Math.max(Math.abs(yInf), 1e-300);
  // time scales from the poles: start well below the fastest, run to many slowest time constants
  const pr = opts.poles ?? computePoles({ n, G, C });
  const rates = pr.poles.filter((p) => p.kind !== 'origin' && p.omegaN > 0);
  if (pr.status !== 'ok' || rates.length === 0) {
    if (!opts.tEnd) return empty('singular', 'no finite poles found: the output follows the input instantly');
  }
  const sigmaMin = rates.length ? Math.min(...rates.map((p) => Math.max(Math.abs(p.re), 1e-300))) : 1 / opts.tEnd!;
  const wMax = rates.length ? Math.max(...rates.map((p) => p.omegaN)) : 1 / opts.tEnd!;
  if (rates.some((p) => p.rhp)) return empty('no-final-value', 'a pole lies in the right half-plane: the step response grows without bound');
  const tEnd = opts.tEnd ?? 30 / sigmaMin;
  const relTol = opts.relTol ?? 1e-7;
  const maxSteps = opts.maxSteps ?? 200000;
  const hBase = Math.min(1e-3 / wMax, tEnd / 1e6);
  const factors = new Map<number, RealLU>();
  const stepper = (m: number) => {
    let f = factors.get(m);
    if (!f) {
      const h = hBase * 2 ** m;
      const M = new Float64Array(n * n);
      for (let i = 0; i < n * n; i++) M[i] = C[i] / h + G[i];
      f = luReal(M, n);
      factors.set(m, f);
    }
    return f;
  };
  const be = (x: Float64Array, m: number) => {
    const h = hBase * 2 ** m;
    const rhs = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let s = b[i];
      for (let j = 0; j < n; j++) s += (C[i * n + j] / h) * x[j];
      rhs[i] = s;
    }
    return solveReal(stepper(m), rhs);
  };
  let x = new Float64Array(n);
  let t = 0;
  let m = 1; // current step = hBase·2^m; the half step uses m − 1
  const ts = [0];
  const ys = [dot(c, x)];
  let steps = 0;
  while (t < tEnd && steps++ < maxSteps) {
    const full = be(x, m);
    const half = be(be(x, m - 1), m - 1);
    const yf = dot(c, full), yh = dot(c, half);
    const err = Math.abs(yh - yf) / scale;
    if (err > relTol && m > 1) { m--; continue; }
    const next = new Float64Array(n);
    for (let i = 0; i < n; i++) next[i] = 2 * half[i] - full[i];
    x = next;
    t += hBase * 2 ** m;
    ts.push(t);
    ys.push(dot(c, x));
    if (err < relTol / 8 && hBase * 2 ** (m + 1) <= tEnd / 20) m++;
  }
  const status = t < tEnd ? 'step-limit' : 'ok';
  const settling = tolerances.map((tolerance) => ({ tolerance, seconds: settlingTime(ts, ys, yInf, tolerance) }));
  let overshoot = 0;
  const firstCross = ys.findIndex((v) => (v - yInf) * Math.sign(yInf || 1) >= 0);
  if (firstCross >= 0) {
    // A plain loop: spreading a long waveform into Math.max overflows the call stack.
    overshoot = 0;
    const sign = Math.sign(yInf || 1);
    for (let i = firstCross; i < ys.length; i++) overshoot = Math.max(overshoot, ((ys[i] - yInf) * sign) / scale);
  }
  const thin = thinOut(ts, ys, opts.maxPoints ?? 4000);
  return {
    status, message: status === 'step-limit' ? `stopped after ${maxSteps} steps at t = ${t.toPrecision(3)} s` : undefined,
    t: thin.t, y: thin.y, finalValue: yInf, settling, overshoot,
  };
}

function dot(a: Float64Array, x: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * x[i];
  return s;
}

/** Last time the error band is left, interpolated linearly between samples. */
export function settlingTime(t: number[], y: number[], yInf: number, eps: number): number | null {
  const band = eps * Math.abs(yInf);
  for (let i = y.length - 1; i >= 0; i--) {
    if (Math.abs(y[i] - yInf) > band) {
      if (i === y.length - 1) return null; // never settles within the simulated time
      const e0 = Math.abs(y[i] - yInf), e1 = Math.abs(y[i + 1] - yInf);
      const f = (e0 - band) / (e0 - e1);
      return t[i] + f * (t[i + 1] - t[i]);
    }
  }
  return 0;
}

function thinOut(t: number[], y: number[], max: number): { t: number[]; y: number[] } {
  if (t.length <= max) return { t, y };
  const stride = Math.ceil(t.length / max);
  const ot: number[] = [], oy: number[] = [];
  for (let i = 0; i < t.length; i += stride) { ot.push(t[i]); oy.push(y[i]); }
  if (ot[ot.length - 1] !== t[t.length - 1]) { ot.push(t[t.length - 1]); oy.push(y[y.length - 1]); }
  return { t: ot, y: oy };
}
