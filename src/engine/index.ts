// The public engine API: analyze(netlist) runs validation, the structure check and every
// small-signal analysis, and returns plain JSON-safe data (no NaN: null with a reason instead).
// All figures are linear small-signal estimates about the entered bias point.

import type { EngineIssue, MnaSystem, Netlist, OutputSpec } from './types';
import { validateNetlist } from './netlist';
import { assembleMna, expandNetlist } from './mna';
import { checkStructure } from './structure';
import { factorDc } from './analyses/dc';
import { computePoles, type Pole } from './analyses/poles';
import { computeZeros, type Zero } from './analyses/zeros';
import { dcTransfer, transferEvaluator } from './analyses/transfer';
import { shiftedReduction } from './analyses/hessenberg';
import { findBandwidth, findUnityGain, logGrid, sweepTransfer, type Sweep } from './analyses/frequency';
import { dcImpedances, impedancesAtHz } from './analyses/impedance';
export type { TransferEvaluator } from './analyses/transfer';
import { nodeTimeConstants, openCircuitTimeConstants, type OctcResult } from './analyses/octc';
import { poleParticipation, type PoleParticipation } from './analyses/participation';
import { poleVectors } from './analyses/modal';
import { impedanceSweep, type ImpedanceSweep } from './analyses/impedance-sweep';
import { chooseSweep, nodeRows, resolveSwitches, sanitize, degenerateDcIssue, gainUnitOf, type GainUnit, type NodeRow, type SweepRange } from './analyses/report';

export type * from './types';
export type { Pole, PoleResult } from './analyses/poles';
export type { Zero, ZeroResult } from './analyses/zeros';
export type { Sweep, Crossing } from './analyses/frequency';
export type { OctcResult, CapTimeConstant, NodeTimeConstant } from './analyses/octc';
export type { PoleParticipation, NodeShare } from './analyses/participation';
export type { GainUnit, NodeRow, SweepRange } from './analyses/report';
export type { ImpedanceSweep } from './analyses/impedance-sweep';
export { parseSi, parseGain, formatSi } from './units';
export { validateNetlist, canonicalNode, isGroundName } from './netlist';
export { BUILTIN_PROCESSES, DEFAULT_PROCESS_NAME } from './process';
export { logGrid } from './analyses/frequency';
export { buildMna } from './mna';
// Lower-level analyses on an assembled system (buildMna), for panels that re-evaluate one piece.
export { computePoles, computeZeros, transferEvaluator, impedancesAtHz, impedanceSweep };

export const SMALL_SIGNAL_CAUTION =
  'Linear small-signal estimates about the entered bias point; confirm with full circuit simulation.';

export interface AnalyzeOptions {
  /** Element id ("<part>.<role>") or part name → factor on its gm / gain. */
  scale?: Record<string, number>;
  /** Element ids or part names whose controlled sources are switched off (factor 0). */
  off?: string[];
  input?: string;
  output?: OutputSpec;
  sweep?: { fMin?: number; fMax?: number; perDecade?: number };
  /** Frequency (Hz) of the node-impedance column; default: bandwidth, else unity gain, else slowest pole. */
  frequencyHz?: number;
  /** Polish every pole and zero on the original equations (default: only for small systems). */
  refine?: boolean;
  /** Also give every node's impedance over the sweep grid (result.impedanceSweep). */
  impedanceSweep?: boolean;
}

export interface AnalysisConditions {
  input: string | null;
  output: OutputSpec | null;
  /** Element ids switched off. */
  off: string[];
  /** Element id → applied factor (other than 0). */
  scaled: Record<string, number>;
  frequencyHz: number | null;
  sweep: SweepRange | null;
}

export interface AnalysisResult {
  /** True when the numbers were computed (no error issues). */
  ok: boolean;
  caution: string;
  conditions: AnalysisConditions;
  issues: EngineIssue[];
  unknowns: { nodes: number; branches: number };
  poles: Pole[];
  poleInfo: { infiniteCount: number; originCount: number; status: string };
  zeros: Zero[];
  zeroInfo: { infiniteCount: number; status: string };
  dcGain: number | null;
  /** Unit of dcGain and of the transfer (V/V, Ω, S or A/A); null without an input and output. */
  gainUnit: GainUnit | null;
  bandwidthHz: number | null;
  unityGainHz: number | null;
  phaseAtUnityDeg: number | null;
  sweep: Sweep | null;
  nodes: NodeRow[];
  octc: OctcResult | null;
  participation: PoleParticipation[];
  /** Node impedances over the sweep grid, when asked for (AnalyzeOptions.impedanceSweep). */
  impedanceSweep: ImpedanceSweep | null;
  /** Why a figure is null, keyed by the result field ("dcGain", "bandwidthHz", "zeros", ...). */
  reasons: Record<string, string>;
}

function emptyResult(issues: EngineIssue[], conditions: AnalysisConditions): AnalysisResult {
  return {
    ok: false, caution: SMALL_SIGNAL_CAUTION, conditions, issues: [...issues], unknowns: { nodes: 0, branches: 0 },
    poles: [], poleInfo: { infiniteCount: 0, originCount: 0, status: 'not-run' }, zeros: [], zeroInfo: { infiniteCount: 0, status: 'not-run' },
    dcGain: null, gainUnit: null, bandwidthHz: null, unityGainHz: null, phaseAtUnityDeg: null, sweep: null, nodes: [], octc: null, participation: [], impedanceSweep: null, reasons: {},
  };
}

const hasError = (issues: EngineIssue[]) => issues.some((i) => i.severity === 'error');

export function analyze(netlist: Netlist, opts: AnalyzeOptions = {}): AnalysisResult {
  const effective = { ...netlist, input: opts.input ?? netlist?.input, output: opts.output ?? netlist?.output } as Netlist;
  const conditions: AnalysisConditions = {
    input: effective.input ?? null, output: effective.output ?? null, off: [], scaled: {}, frequencyHz: null, sweep: null,
  };
  const v = validateNetlist(effective);
  if (!v.netlist || hasError(v.issues)) return emptyResult(v.issues, conditions);
  let x;
  try {
    x = expandNetlist(v.netlist);
  } catch (e) {
    return emptyResult([...v.issues, internal('expanding the netlist', e)], conditions);
  }
  const issues = [...x.issues];
  const sw = resolveSwitches(x.elements, opts.scale ?? {}, opts.off ?? []);
  issues.push(...sw.issues);
  conditions.off = sw.off;
  conditions.scaled = sw.scaled;
  if (!hasError(issues)) issues.push(...checkStructure(x));
  if (hasError(issues)) return emptyResult(issues, conditions);
  const sys = assembleMna(x, { scale: sw.scale });
  try {
    return runAnalyses(sys, issues, conditions, opts);
  } catch (e) {
    return emptyResult([...issues, internal('the analyses', e)], conditions);
  }
}

function internal(stage: string, e: unknown): EngineIssue {
  const msg = e instanceof Error ? e.message : String(e);
  return { severity: 'error', code: 'singular', message: `internal problem while running ${stage}: ${msg}` };
}

/** All analyses on an assembled system (exported for callers that assemble themselves). */
export function runAnalyses(sys: MnaSystem, issues: EngineIssue[], conditions: AnalysisConditions, opts: AnalyzeOptions = {}): AnalysisResult {
  const res = emptyResult(issues, conditions);
  res.unknowns = { nodes: sys.nodeCount, branches: sys.n - sys.nodeCount };
  const reasons = res.reasons;
  const dc = factorDc(sys);
  if (dc.status === 'degenerate') res.issues.push(degenerateDcIssue(sys, dc));
  const poles = computePoles(sys, dc, { refine: opts.refine });
  res.poles = poles.poles;
  res.poleInfo = { infiniteCount: poles.infiniteCount, originCount: poles.originCount, status: poles.status };
  if (poles.reason) reasons.poles = poles.reason;

  const zeros = computeZeros(sys, poles.poles, { refine: opts.refine });
  res.zeros = zeros.zeros;
  res.zeroInfo = { infiniteCount: zeros.infiniteCount, status: zeros.status };
  if (zeros.reason) reasons.zeros = zeros.reason;

  const dcT = dcTransfer(sys, dc);
  res.dcGain = dcT.value;
  res.gainUnit = gainUnitOf(sys);
  if (dcT.reason) reasons.dcGain = dcT.reason;

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

  const slowestPole = poles.poles.find((p) => p.kind !== 'origin');
  let asked = opts.frequencyHz;
  if (asked !== undefined && !(typeof asked === 'number' && Number.isFinite(asked) && asked >= 0)) {
    res.issues.push({ severity: 'warning', code: 'bad-value', field: 'frequencyHz',
      message: `frequencyHz: ${String(asked)} is not a frequency ≥ 0 in Hz; the default frequency is used` });
    asked = undefined;
  }
  const fz = asked ?? res.bandwidthHz ?? res.unityGainHz ?? slowestPole?.hz ?? 1e6;
  conditions.frequencyHz = fz;
  const zDc = dcImpedances(sys, dc);
  const zAt = impedancesAtHz(sys, fz, dc);
  if (zAt.reason) reasons.nodeImpedance = zAt.reason;
  res.nodes = nodeRows(sys, zDc, zAt.values, nodeTimeConstants(sys, zDc));
  res.octc = openCircuitTimeConstants(sys, dc);
  const vectors = poleVectors(sys, poles.poles, reduction);
  res.participation = poleParticipation(sys, poles.poles, { vectors });
  if (opts.impedanceSweep) {
    res.impedanceSweep = impedanceSweep(sys, logGrid(range.fMin, range.fMax, range.perDecade), { poles: poles.poles, reduction, vectors });
  }
  res.ok = !hasError(res.issues);
  return sanitize(res);
}
