// Bode's return ratio of every controlled source (Bode 1945): replace the source's controlling
// variable by an independent test value, zero every independent source, and read
// T(s) = −(returned control)/(test). Computed from one factor of the full pencil per frequency:
// T = a/(1 − a), a = vᵀ(G + sC)⁻¹u (see pencil.ts); when the full pencil is singular at that
// frequency the source-removed pencil is factored directly instead.
import type { Cx, MnaSystem } from '../types';
import { PencilAt, addRankOne, controlIsGround, controlOf, scaledG, sourceStamps, uVector } from './pencil';
import type { SourceStamp } from './pencil';
import { hypot2 } from './cx';

export type ReturnRatioStatus = 'ok' | 'no-control' | 'infinite' | 'singular';

export interface ReturnRatioPoint {
  value: Cx | null;
  status: ReturnRatioStatus;
}

export interface ReturnRatioSweep {
  id: string;
  part: string;
  role: string;
  kind: 'vccs' | 'vcvs';
  dc: ReturnRatioPoint;
  fHz: number[];
  /** T(j2πf) per frequency (NaN-free: points without a value are null). */
  points: ReturnRatioPoint[];
  /** Plain-words note when a point could not be computed (names the source). */
  message?: string;
}

export interface ReturnRatioOptions {
  /** Frequencies (Hz) for the sweep; DC is always computed. */
  freqsHz?: number[];
  /** Source scales applied before measuring (0 = off); see mna.ts `scale`. */
  scale?: Record<string, number>;
  /** Restrict to these source ids. */
  ids?: string[];
}

/** Return ratios of the chosen sources at one angular frequency, given G (scaled) and C. */
export function returnRatiosAt(
  sys: MnaSystem, G: Float64Array, stamps: SourceStamp[], omega: number,
): ReturnRatioPoint[] {
  const n = sys.n;
  const full = new PencilAt(G, sys.C, n, omega);
  return stamps.map((s) => {
    if (controlIsGround(s) || s.value === 0) return { value: { re: 0, im: 0 }, status: 'no-control' as const };
    if (!full.singular) {
      const x = full.solveSparse(s.uRows, s.uVals);
      const a = controlOf(s, x);
      // T = a/(1 − a)
      const dr = 1 - a.re;
      const di = -a.im;
      const d = dr * dr + di * di;
      const mag = hypot2(a.re, a.im);
      if (d <= 1e-24 * Math.max(1, mag * mag)) return { value: null, status: 'infinite' as const };
      return { value: { re: (a.re * dr + a.im * di) / d, im: (a.im * dr - a.re * di) / d }, status: 'ok' as const };
    }
    return returnRatioDirect(sys, G, s, omega);
  });
}

/** Bode's definition applied literally: remove the source, drive with its unit-control excitation,
 *  read the returned control. Used when the full pencil is singular, and by tests as a cross-check. */
export function returnRatioDirect(sys: MnaSystem, G: Float64Array, s: SourceStamp, omega: number): ReturnRatioPoint {
  const n = sys.n;
  if (controlIsGround(s) || s.value === 0) return { value: { re: 0, im: 0 }, status: 'no-control' };
  const G0 = Float64Array.from(G);
  addRankOne(G0, n, s, -1);
  const cut = new PencilAt(G0, sys.C, n, omega);
  if (cut.singular) return { value: null, status: 'singular' };
  const u = uVector(s, n);
  const excitation = u.map((x) => -x);
  const returned = controlOf(s, cut.solve(excitation));
  return { value: { re: -returned.re + 0, im: -returned.im + 0 }, status: 'ok' };
}

/** Return ratio of every controlled source at DC and over an optional sweep. */
export function returnRatios(sys: MnaSystem, opts: ReturnRatioOptions = {}): ReturnRatioSweep[] {
  let stamps = sourceStamps(sys);
  const G = scaledG(sys, stamps, opts.scale ?? {});
  // A source that is scaled is measured as scaled: rebuild its stamp value.
  stamps = stamps.map((s) => scaleStamp(s, opts.scale?.[s.id]));
  if (opts.ids) stamps = stamps.filter((s) => opts.ids!.includes(s.id));
  const fHz = opts.freqsHz ?? [];
  const dc = returnRatiosAt(sys, G, stamps, 0);
  const perFreq = fHz.map((f) => returnRatiosAt(sys, G, stamps, 2 * Math.PI * f));
  return stamps.map((s, i) => {
    const points = perFreq.map((row) => row[i]);
    const bad = [dc[i], ...points].find((p) => p.status === 'infinite' || p.status === 'singular');
    return {
      id: s.id, part: s.part, role: s.role, kind: s.kind, dc: dc[i], fHz, points,
      message: bad ? describeStatus(s.id, bad.status) : undefined,
    };
  });
}

export function scaleStamp(s: SourceStamp, k: number | undefined): SourceStamp {
  if (k === undefined || k === 1) return s;
  return { ...s, value: s.value * k, uVals: s.uVals.map((v) => v * k) };
}

export function describeStatus(id: string, status: ReturnRatioStatus): string {
  switch (status) {
    case 'infinite':
      return `${id}: return ratio is unbounded (with ${id} removed the network has no finite solution, e.g. an ideal diode-connected device with nothing else at its node)`;
    case 'singular':
      return `${id}: the network is singular at this frequency even with ${id} removed (a node with no path to ground)`;
    case 'no-control':
      return `${id}: its control is tied to ground or its gain is zero, so it closes no loop`;
    default:
      return '';
  }
}
