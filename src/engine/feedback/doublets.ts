// Pole–zero doublets of the chosen transfer, and the placement rule for a gain-boosted cascode
// (Bult & Geelen, IEEE JSSC 1990): the booster loop's unity-gain frequency should lie above the main
// amplifier's closed-loop bandwidth (else a slow doublet tail degrades settling) and below the main
// amplifier's non-dominant pole (else the booster loop itself rings). Linear small-signal estimates.
import type { Cx, MnaSystem } from '../types';
import { computePoles } from '../analyses/poles';
import type { Pole, PoleResult } from '../analyses/poles';
import { computeZeros } from '../analyses/zeros';
import type { ZeroResult } from '../analyses/zeros';
import { dcTransfer, transferEvaluator } from '../analyses/transfer';
import { findBandwidth, logGrid, sweepTransfer } from '../analyses/frequency';
import type { ShiftedReduction } from '../analyses/hessenberg';
import { matchPoles } from './matching';
import { scaledG, sourceStamps } from './pencil';
import { loopMargins } from './margins';
import type { LoopMargins } from './margins';
import type { Loop } from './loops';
import { fmt } from './regulation';
import { hypot2 } from './cx';

export interface Doublet {
  pole: Cx;
  zero: Cx;
  poleHz: number;
  /** |p − z| / |p|. */
  spacing: number;
  /** 1/|Re p|: the time constant of the tail the doublet leaves in a step response. */
  tailSeconds: number;
  /** The zero sits on the pole (exact cancellation): no tail at all. */
  cancels: boolean;
}

export interface DoubletResult {
  status: 'ok' | 'no-transfer' | 'no-convergence';
  reason?: string;
  doublets: Doublet[];
}

/** `poles`, `zeros`: those of the same (scaled) system when already computed. */
export function findDoublets(sys: MnaSystem, opts: { spacing?: number; scale?: Record<string, number>; poles?: PoleResult; zeros?: ZeroResult } = {}): DoubletResult {
  const limit = opts.spacing ?? 0.1;
  const G = opts.scale ? scaledG(sys, sourceStamps(sys), opts.scale) : sys.G;
  const s = { ...sys, G };
  const pr = opts.poles ?? computePoles(s);
  if (pr.status !== 'ok') return { status: 'no-convergence', reason: pr.reason, doublets: [] };
  const zr = opts.zeros ?? computeZeros(s, pr.poles);
  if (zr.status !== 'ok') return { status: zr.status === 'no-convergence' ? 'no-convergence' : 'no-transfer', reason: zr.reason, doublets: [] };
  const poles = pr.poles.filter((p) => p.kind !== 'origin');
  const m = matchPoles(zr.zeros, poles);
  const doublets: Doublet[] = [];
  zr.zeros.forEach((z, i) => {
    if (m[i] < 0) return;
    const p = poles[m[i]];
    const spacing = hypot2(p.re - z.re, p.im - z.im) / p.omegaN;
    if (spacing >= limit || z.im < 0 || p.im < 0) return; // one entry per conjugate pair
    doublets.push({ pole: { re: p.re, im: p.im }, zero: { re: z.re, im: z.im }, poleHz: p.hz, spacing, tailSeconds: 1 / Math.abs(p.re), cancels: z.cancelsPole });
  });
  return { status: 'ok', doublets: doublets.sort((a, b) => a.poleHz - b.poleHz) };
}

export interface BoosterCheck {
  loopId: string;
  amplifier: string;
  device: string;
  boosterUnityGainHz: number | null;
  mainBandwidthHz: number | null;
  mainNonDominantHz: number | null;
  /** null when a figure is missing. */
  ok: boolean | null;
  verdict: string;
}

/** Loops built around a cascode: an amplifier (the loop's key) drives a device's gate and senses
 *  its source. One check per (amplifier, device) pair, on the loop with the fewest members. */
/** `margins`: the loops' margins by key when already computed (else each booster's are computed). */
/** `reduction`: the shifted Hessenberg form of the network as analysed, when the caller holds it;
 *  `bandwidthHz`: the closed-loop bandwidth of the chosen transfer when already found. */
export function boosterChecks(
  sys: MnaSystem, loops: Loop[],
  opts: { scale?: Record<string, number>; margins?: Map<string, LoopMargins>; reduction?: ShiftedReduction; bandwidthHz?: number | null } = {},
): BoosterCheck[] {
  const found = new Map<string, { loop: Loop; device: string }>();
  for (const loop of loops) {
    const key = sys.elements.find((e) => (e.type === 'vccs' || e.type === 'vcvs') && e.id === loop.key);
    if (!key || (key.type !== 'vccs' && key.type !== 'vcvs')) continue;
    const ampOut = sys.elements
      .filter((e) => e.part === key.part && (e.type === 'vccs' || e.type === 'vcvs') && e.role === 'out')
      .map((e) => (e.type === 'vcvs' ? e.p : (e as { n: number }).n));
    const outs = ampOut.length ? ampOut : [key.p, key.n].filter((v) => v >= 0);
    const sensed = [key.cp, key.cn].filter((v) => v >= 0);
    for (const mb of loop.members) {
      const dev = sys.elements.find((e) => e.type === 'vccs' && e.id === mb.id && e.role === 'gm');
      if (!dev || dev.type !== 'vccs' || dev.part === key.part) continue;
      if (!outs.includes(dev.cp) || !sensed.includes(dev.cn)) continue;
      const pair = `${key.part}|${dev.part}`;
      const prev = found.get(pair);
      if (!prev || loop.members.length < prev.loop.members.length) found.set(pair, { loop, device: dev.part });
    }
  }
  if (!found.size) return [];
  const stamps = sourceStamps(sys);
  const base = opts.scale ?? {};
  const allOff: Record<string, number> = { ...base };
  for (const { loop } of found.values()) allOff[loop.key] = 0;
  // main amplifier: the chosen transfer as drawn (closed-loop bandwidth), and with boosters off (its poles)
  const sysNow = { ...sys, G: scaledG(sys, stamps, base) };
  const bw = opts.bandwidthHz !== undefined ? opts.bandwidthHz : closedLoopBandwidth(sysNow, opts.reduction);
  const plainSys = { ...sys, G: scaledG(sys, stamps, allOff) };
  const plain = computePoles(plainSys);
  // poles the transfer cannot see (the switched-off booster's own internal modes) are cancelled by
  // zeros; they are not the main amplifier's poles
  const zs = plain.status === 'ok' ? computeZeros(plainSys, plain.poles).zeros : [];
  const seen = (p: Pole) => !zs.some((z) => hypot2(z.re - p.re, z.im - p.im) <= 1e-6 * p.omegaN);
  const sorted: Pole[] = plain.status === 'ok' ? plain.poles.filter((p) => p.kind !== 'origin' && seen(p)).sort((a, b) => a.omegaN - b.omegaN) : [];
  const p2 = sorted.length >= 2 ? sorted[1].hz : null;
  return [...found.values()].map(({ loop, device }) => {
    const amp = loop.members[0].part;
    const ugf = (opts.margins?.get(loop.key) ?? loopMargins(sys, loop.key, { scale: base })).unityGainHz;
    const ok = ugf !== null && bw !== null && p2 !== null ? ugf > bw && ugf < p2 : null;
    let verdict: string;
    if (ok === null) verdict = `${amp} around ${device}: placement not checked (${ugf === null ? 'booster loop has no crossover' : bw === null ? 'no closed-loop bandwidth for the chosen transfer' : 'no non-dominant pole'})`;
    else if (ok) verdict = `${amp} around ${device}: booster unity gain ${fmt(ugf!)} Hz lies between the closed-loop bandwidth ${fmt(bw!)} Hz and the non-dominant pole ${fmt(p2!)} Hz`;
    else if (ugf! <= bw!) verdict = `${amp} around ${device}: booster unity gain ${fmt(ugf!)} Hz is below the closed-loop bandwidth ${fmt(bw!)} Hz — expect a slow settling tail`;
    else verdict = `${amp} around ${device}: booster unity gain ${fmt(ugf!)} Hz is above the non-dominant pole ${fmt(p2!)} Hz — the booster loop may ring`;
    return { loopId: loop.id, amplifier: amp, device, boosterUnityGainHz: ugf, mainBandwidthHz: bw, mainNonDominantHz: p2, ok, verdict: `${verdict} (linear small-signal estimate)` };
  });
}

function closedLoopBandwidth(sys: MnaSystem, reduction?: ShiftedReduction): number | null {
  const dc = dcTransfer(sys);
  if (dc.value === null) return null;
  const ev = transferEvaluator(sys, undefined, reduction);
  const sw = sweepTransfer(ev, logGrid(1, 1e12, 5)); // the band edge is refined by findBandwidth
  return findBandwidth(ev, sw, dc.value).hz;
}
