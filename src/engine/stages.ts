// The analyses behind analyze(), in two stages on one assembled system. The overlay stage is what
// a live canvas paints (poles, DC node impedances, node capacitance, τ, node poles, and the
// impedance at a frequency the user chose); the complete stage adds the rest on the same DC factor
// and poles: zeros, the transfer sweep with bandwidth and unity gain, the impedance column at the
// default frequency, OCTC, participation and the optional node-impedance sweep.

import type { EngineIssue, MnaSystem } from './types';
import type { AnalysisResult, AnalyzeOptions } from './index';
import { factorDc, type DcFactor } from './analyses/dc';
import { computePoles, type PoleResult } from './analyses/poles';
import { computeZeros } from './analyses/zeros';
import { dcTransfer, transferEvaluator, type DcTransfer } from './analyses/transfer';
import { shiftedReduction } from './analyses/hessenberg';
import { findBandwidth, findUnityGain, logGrid, sweepTransfer } from './analyses/frequency';
import { dcImpedances, impedancesAtHz, type DcImpedance } from './analyses/impedance';
import { nodeTimeConstants, openCircuitTimeConstants, type NodeTimeConstant } from './analyses/octc';
import { poleParticipation } from './analyses/participation';
import { poleVectors } from './analyses/modal';
import { impedanceSweep } from './analyses/impedance-sweep';
import { poleConditions, unreliablePoles } from './analyses/conditioning';
import { formatSi } from './units';
import { chooseSweep, nodeRows, sanitize, degenerateDcIssue, gainUnitOf } from './analyses/report';

export interface OverlayStage {
  sys: MnaSystem;
  opts: AnalyzeOptions;
  result: AnalysisResult;
  dc: DcFactor;
  poles: PoleResult;
  dcT: DcTransfer;
  zDc: DcImpedance[];
  tc: NodeTimeConstant[];
  /** The frequency the caller asked for, validated; undefined for the default. */
  asked: number | undefined;
}

export const structuredCopy = <T>(x: T): T => structuredClone(x);

export const hasError = (issues: EngineIssue[]) => issues.some((i) => i.severity === 'error');

export function overlayStage(sys: MnaSystem, res: AnalysisResult, opts: AnalyzeOptions): OverlayStage {
  res.unknowns = { nodes: sys.nodeCount, branches: sys.n - sys.nodeCount };
  res.stage = 'overlay';
  const reasons = res.reasons;
  const dc = factorDc(sys);
  if (dc.status === 'degenerate') res.issues.push(degenerateDcIssue(sys, dc));
  const poles = computePoles(sys, dc, { refine: opts.refine });
  res.poles = poles.poles;
  res.poleInfo = { infiniteCount: poles.infiniteCount, originCount: poles.originCount, status: poles.status };
  if (poles.reason) reasons.poles = poles.reason;
  const dcT = dcTransfer(sys, dc);
  res.dcGain = dcT.value;
  res.gainUnit = gainUnitOf(sys);
  if (dcT.reason) reasons.dcGain = dcT.reason;

  let asked = opts.frequencyHz;
  if (asked !== undefined && !(typeof asked === 'number' && Number.isFinite(asked) && asked >= 0)) {
    res.issues.push({ severity: 'warning', code: 'bad-value', field: 'frequencyHz',
      message: `frequencyHz: ${String(asked)} is not a frequency ≥ 0 in Hz; the default frequency is used` });
    asked = undefined;
  }
  const zDc = dcImpedances(sys, dc);
  const tc = nodeTimeConstants(sys, zDc);
  let zAt = new Array(sys.nodeCount).fill(null);
  if (asked !== undefined) {
    res.conditions.frequencyHz = asked;
    const z = impedancesAtHz(sys, asked, dc);
    if (z.reason) reasons.nodeImpedance = z.reason;
    zAt = z.values;
  }
  res.nodes = nodeRows(sys, zDc, zAt, tc);
  res.ok = !hasError(res.issues);
  return { sys, opts, result: res, dc, poles, dcT, zDc, tc, asked };
}

export function completeStage(st: OverlayStage): AnalysisResult {
  return runSteps(completeSteps(st));
}

/** Drives a stepwise computation to its end. */
export function runSteps<T>(steps: Generator<void, T>): T {
  let r = steps.next();
  while (!r.done) r = steps.next();
  return r.value;
}

/** completeStage in steps of at most about a fifth of the whole (zeros, transfer sweep, pole
 *  vectors and participation, impedance sweep), so a caller that runs them one task at a time
 *  can take a newer request in between. */
export function* completeSteps(st: OverlayStage): Generator<void, AnalysisResult> {
  const { sys, opts, result: res, dc, poles, dcT, zDc, tc, asked } = st;
  const reasons = res.reasons;
  const conditions = res.conditions;
  res.stage = 'complete';
  const zeros = computeZeros(sys, poles.poles, { refine: opts.refine });
  res.zeros = zeros.zeros;
  res.zeroInfo = { infiniteCount: zeros.infiniteCount, status: zeros.status };
  if (zeros.reason) reasons.zeros = zeros.reason;

  const range = chooseSweep(opts.sweep, poles.poles, zeros.zeros);
  conditions.sweep = range;
  // H ≡ 0 (found by the zeros' probes): what the sweep would show is roundoff, not a response.
  const identicallyZero = zeros.status === 'identically-zero';
  if (identicallyZero) {
    res.dcGain = 0;
    delete reasons.dcGain;
    reasons.sweep = reasons.bandwidthHz = reasons.unityGainHz = 'the output does not respond to the input (H(s) ≡ 0)';
  }
  const transferDefined = dcT.status !== 'no-input' && dcT.status !== 'no-output' && !identicallyZero;
  yield;
  // One shifted Hessenberg reduction serves the sweep and the pole vectors.
  const reduction = shiftedReduction(sys.G, sys.C, sys.n);
  if (transferDefined) {
    const ev = transferEvaluator(sys, [range.fMin, range.fMax], reduction);
    const sweep = sweepTransfer(ev, logGrid(range.fMin, range.fMax, range.perDecade));
    res.sweep = sweep;
    const bw = findBandwidth(ev, sweep, dcT.value);
    res.bandwidthHz = bw.hz;
    if (bw.reason) reasons.bandwidthHz = bw.reason;
    const ug = findUnityGain(ev, sweep);
    res.unityGainHz = ug.hz;
    res.phaseAtUnityDeg = ug.phaseDeg;
    if (ug.reason) reasons.unityGainHz = ug.reason;
  } else if (!identicallyZero) {
    reasons.sweep = dcT.reason ?? 'no transfer chosen';
  }
  yield;

  if (asked === undefined) {
    const slowestPole = poles.poles.find((p) => p.kind !== 'origin');
    const fz = res.bandwidthHz ?? res.unityGainHz ?? slowestPole?.hz ?? 1e6;
    conditions.frequencyHz = fz;
    const zAt = impedancesAtHz(sys, fz, dc);
    if (zAt.reason) reasons.nodeImpedance = zAt.reason;
    res.nodes = nodeRows(sys, zDc, zAt.values, tc);
  }
  res.octc = openCircuitTimeConstants(sys, dc);
  const vectors = poleVectors(sys, poles.poles, reduction);
  res.participation = poleParticipation(sys, poles.poles, { vectors });
  const shaky = unreliablePoles(poleConditions(sys, poles.poles, vectors));
  if (shaky.length > 0) res.issues.push(undeterminedPolesIssue(res, shaky));
  yield;
  if (opts.impedanceSweep) {
    res.impedanceSweep = impedanceSweep(sys, logGrid(range.fMin, range.fMax, range.perDecade), { poles: poles.poles, reduction, vectors });
  }
  res.ok = !hasError(res.issues);
  return sanitize(res);
}

/** Warning for poles that double precision cannot place (conditioning.ts), naming where they live. */
function undeterminedPolesIssue(res: AnalysisResult, which: number[]): EngineIssue {
  const nodes = new Set<string>();
  for (const i of which) { const top = res.participation[i]?.nodes[0]?.node; if (top) nodes.add(top); }
  const at = [...nodes];
  const where = at.length ? ` at ${at.slice(0, 3).map((n) => `"${n}"`).join(', ')}${at.length > 3 ? ' …' : ''}` : '';
  const heads = which.filter((i) => res.poles[i].im >= 0); // one member of each conjugate pair
  const some = heads.slice(0, 2).map((i) => formatSi(res.poles[i].hz, 'Hz')).join(', ');
  return {
    severity: 'warning', code: 'ill-conditioned', ...(at[0] ? { node: at[0] } : {}),
    message: `${which.length} pole${which.length > 1 ? 's' : ''} (e.g. ${some}${where}) cannot be placed in double precision: ` +
      'condition number above 1/ulp, as in a very-high-gain cascade. Treat their values, right-half-plane ones included, ' +
      'as unknown; node impedances and the DC gain are direct solves and not affected.',
  };
}
