// The chosen transfer H(s) = cᵀ(G + sC)⁻¹b (y = cᵀx, (G + sC)x = b·u): at DC and at any s.

import type { Cx, MnaSystem } from '../types';
import { factorPencilAt, solveScaledComplex } from './scaling';
import { dcBilinear, factorDc, type DcFactor } from './dc';
import { evalHessenberg, hessenbergForm, shiftedReduction, type ShiftedReduction } from './hessenberg';

export type TransferSys = Pick<MnaSystem, 'n' | 'G' | 'C' | 'b' | 'c'>;

export function isZeroVector(v: Float64Array): boolean {
  for (let i = 0; i < v.length; i++) if (v[i] !== 0) return false;
  return true;
}

export interface DcTransfer {
  /** cᵀG⁻¹b (or its limit as s → 0); null when undefined or unbounded. */
  value: number | null;
  status: 'ok' | 'unbounded' | 'no-input' | 'no-output' | 'singular';
  reason?: string;
}

export function dcTransfer(sys: TransferSys, dc: DcFactor = factorDc(sys)): DcTransfer {
  if (isZeroVector(sys.b)) return { value: null, status: 'no-input', reason: 'no input source chosen' };
  if (isZeroVector(sys.c)) return { value: null, status: 'no-output', reason: 'no output chosen' };
  const r = dcBilinear(dc, sys.c, sys.b);
  if (r.unbounded) return { value: null, status: 'unbounded', reason: 'a pole at s = 0 (ideal integrator) makes the DC gain unbounded' };
  if (r.value === null) return { value: null, status: 'singular', reason: 'undefined at DC: a repeated pole at s = 0 (e.g. cascaded integrators) or degenerate DC equations' };
  return { value: r.value, status: 'ok' };
}

/** Direct evaluation with one complex LU (reference path; O(n³) per point). */
export function transferDirect(sys: TransferSys, s: Cx): Cx | null {
  const { n, G, C, b, c } = sys;
  const f = factorPencilAt(G, C, n, s);
  if (f.singular) return null;
  const [xr, xi] = solveScaledComplex(f, b);
  let re = 0, im = 0;
  for (let i = 0; i < n; i++) { re += c[i] * xr[i]; im += c[i] * xi[i]; }
  return Number.isFinite(re) && Number.isFinite(im) ? { re, im } : null;
}

export interface TransferEvaluator {
  /** H(s); null when s is (numerically) a pole. */
  at(s: Cx): Cx | null;
  /** H(j·2π·f). */
  atHz(f: number): Cx | null;
  method: 'hessenberg' | 'direct';
}

const MAX_SPREAD = 1e5;
const PROBE_TOL = 1e-6;

function frobenius(A: Float64Array): number {
  let s = 0;
  for (let i = 0; i < A.length; i++) s += A[i] * A[i];
  return Math.sqrt(s);
}

function relErr(a: Cx | null, b: Cx | null): number {
  if (!a || !b) return Infinity;
  const d = Math.hypot(a.re - b.re, a.im - b.im);
  const m = Math.max(Math.hypot(b.re, b.im), 1e-300);
  return d / m;
}

/** An evaluator for many s: Hessenberg form when a usable shift is found and it agrees with the
 *  direct solve at the probe frequencies; the direct solve otherwise. `probeHz` is a typical
 *  frequency or the band [fMin, fMax] to be used (probed at both ends and the middle);
 *  `reduction` may be shared with other users of the same system (see modal.ts). */
export function transferEvaluator(sys: TransferSys, probeHz?: number | [number, number], reduction?: ShiftedReduction | null): TransferEvaluator {
  const { n, G, C, b, c } = sys;
  const direct: TransferEvaluator = {
    at: (s) => transferDirect(sys, s),
    atHz: (f) => transferDirect(sys, { re: 0, im: 2 * Math.PI * f }),
    method: 'direct',
  };
  const red = reduction === undefined ? shiftedReduction(G, C, n) : reduction;
  const form = red ? hessenbergForm(red, b, c) : null;
  if (!form) return direct;
  const h = form;
  const work = { re: new Float64Array(n * n), im: new Float64Array(n * n) };
  // Where the fast path's final sum cancels by more than MAX_SPREAD (|H| far below the size of
  // the internal terms, e.g. deep in a stop band) the point is recomputed directly.
  const at = (s: Cx): Cx | null => {
    const v = evalHessenberg(h, s, work);
    if (v && v.spread <= MAX_SPREAD) return { re: v.re, im: v.im };
    return transferDirect(sys, s);
  };
  const fast: TransferEvaluator = { at, atHz: (f) => at({ re: 0, im: 2 * Math.PI * f }), method: 'hessenberg' };
  const w0 = frobenius(G) / frobenius(C);
  const probes = Array.isArray(probeHz)
    ? [probeHz[0], Math.sqrt(probeHz[0] * probeHz[1]), probeHz[1]].map((f) => 2 * Math.PI * f)
    : [probeHz !== undefined && probeHz > 0 ? 2 * Math.PI * probeHz : w0];
  for (const w of probes) {
    if (!(w > 0) || !Number.isFinite(w)) continue;
    const probe = { re: 0, im: w };
    const ref = transferDirect(sys, probe);
    // A broken reduction shows as a gross mismatch; roundoff deep in a stop band (≈1e-8) is fine.
    if (ref && Math.hypot(ref.re, ref.im) > 0 && relErr(fast.at(probe), ref) > PROBE_TOL) return direct;
  }
  return fast;
}
