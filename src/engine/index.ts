// The public engine API: analyze(netlist) runs validation, the structure check and every
// small-signal analysis, and returns plain JSON-safe data (no NaN: null with a reason instead).
// All figures are linear small-signal estimates about the entered bias point.

import type { EngineIssue, MnaSystem, Netlist, OutputSpec } from './types';
import { validateNetlist } from './netlist';
import { assembleMna, expandNetlist } from './mna';
import { checkStructure } from './structure';
import type { Pole } from './analyses/poles';
import { computePoles } from './analyses/poles';
import { computeZeros, type Zero } from './analyses/zeros';
import { transferEvaluator } from './analyses/transfer';
import { impedancesAtHz } from './analyses/impedance';
import { impedanceSweep, type ImpedanceSweep } from './analyses/impedance-sweep';
import type { Sweep } from './analyses/frequency';
import type { OctcResult } from './analyses/octc';
import type { PoleParticipation } from './analyses/participation';
import { resolveSwitches, sanitize, type GainUnit, type NodeRow, type SweepRange } from './analyses/report';
import { completeStage, completeSteps, hasError, overlayStage, runSteps, structuredCopy, type OverlayStage } from './stages';
export type { TransferEvaluator } from './analyses/transfer';

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
  /** 'overlay': the first part of analyzeStaged (zeros, sweep, OCTC, participation still to come). */
  stage: 'overlay' | 'complete';
}

export function emptyResult(issues: EngineIssue[], conditions: AnalysisConditions): AnalysisResult {
  return {
    ok: false, caution: SMALL_SIGNAL_CAUTION, conditions, issues: [...issues], unknowns: { nodes: 0, branches: 0 },
    poles: [], poleInfo: { infiniteCount: 0, originCount: 0, status: 'not-run' }, zeros: [], zeroInfo: { infiniteCount: 0, status: 'not-run' },
    dcGain: null, gainUnit: null, bandwidthHz: null, unityGainHz: null, phaseAtUnityDeg: null, sweep: null, nodes: [], octc: null, participation: [], impedanceSweep: null, reasons: {}, stage: 'complete',
  };
}


export function analyze(netlist: Netlist, opts: AnalyzeOptions = {}): AnalysisResult {
  const prepared = prepare(netlist, opts);
  if ('result' in prepared) return prepared.result;
  try {
    return runAnalyses(prepared.sys, prepared.issues, prepared.conditions, opts);
  } catch (e) {
    return emptyResult([...prepared.issues, internal('the analyses', e)], prepared.conditions);
  }
}

/** Validation, expansion, switches and the structure check; the assembled system or the result
 *  that reports why there is none. */
function prepare(netlist: Netlist, opts: AnalyzeOptions):
  { result: AnalysisResult } | { sys: MnaSystem; issues: EngineIssue[]; conditions: AnalysisConditions } {
  const effective = { ...netlist, input: opts.input ?? netlist?.input, output: opts.output ?? netlist?.output } as Netlist;
  const conditions: AnalysisConditions = {
    input: effective.input ?? null, output: effective.output ?? null, off: [], scaled: {}, frequencyHz: null, sweep: null,
  };
  const v = validateNetlist(effective);
  if (!v.netlist || hasError(v.issues)) return { result: emptyResult(v.issues, conditions) };
  let x;
  try {
    x = expandNetlist(v.netlist);
  } catch (e) {
    return { result: emptyResult([...v.issues, internal('expanding the netlist', e)], conditions) };
  }
  const issues = [...x.issues];
  const sw = resolveSwitches(x.elements, opts.scale ?? {}, opts.off ?? []);
  issues.push(...sw.issues);
  conditions.off = sw.off;
  conditions.scaled = sw.scaled;
  if (!hasError(issues)) issues.push(...checkStructure(x));
  if (hasError(issues)) return { result: emptyResult(issues, conditions) };
  return { sys: assembleMna(x, { scale: sw.scale }), issues, conditions };
}

function internal(stage: string, e: unknown): EngineIssue {
  const msg = e instanceof Error ? e.message : String(e);
  return { severity: 'error', code: 'singular', message: `internal problem while running ${stage}: ${msg}` };
}

/** All analyses on an assembled system (exported for callers that assemble themselves). */
export function runAnalyses(sys: MnaSystem, issues: EngineIssue[], conditions: AnalysisConditions, opts: AnalyzeOptions = {}): AnalysisResult {
  return completeStage(overlayStage(sys, emptyResult(issues, conditions), opts));
}

/** analyze() in two steps, for a live view: `first` holds what the canvas paints (poles, DC node
 *  impedances, node capacitance, τ and node poles, and the node impedance at `frequencyHz` when one
 *  is given); `complete()` adds zeros, the transfer sweep, bandwidth, unity gain, the node
 *  impedance column at the default frequency, OCTC, participation (and the impedance sweep) on
 *  the same factorisations, and returns the same result analyze() would. */
export interface StagedAnalysis {
  first: AnalysisResult;
  complete(): AnalysisResult;
  /** The same complete result, worked out one step per next() (completeSteps); complete()
   *  afterwards, or in between, gives the same object. */
  steps(): Generator<void, AnalysisResult>;
}

export function analyzeStaged(netlist: Netlist, opts: AnalyzeOptions = {}): StagedAnalysis {
  const prepared = prepare(netlist, opts);
  if ('result' in prepared) return done(prepared.result);
  let stage: OverlayStage;
  try {
    stage = overlayStage(prepared.sys, emptyResult(prepared.issues, prepared.conditions), opts);
  } catch (e) {
    return done(emptyResult([...prepared.issues, internal('the analyses', e)], prepared.conditions));
  }
  const first = sanitize(structuredCopy(stage.result));
  const { issues, conditions } = prepared;
  const overlay = stage;
  let full: AnalysisResult | null = null;
  let active: Generator<void, AnalysisResult> | null = null;
  function* steps(): Generator<void, AnalysisResult> {
    if (full) return full;
    active ??= completeSteps(overlay);
    try {
      for (let r = active.next(); ; r = active.next()) {
        if (r.done) { full = r.value; break; }
        yield;
      }
    } catch (e) {
      full = emptyResult([...issues, internal('the analyses', e)], conditions);
    }
    active = null;
    return full;
  }
  return { first, steps, complete: () => full ?? runSteps(steps()) };
}

/** A staged analysis that ended at its first part (an error before or in the overlay stage). */
function done(r: AnalysisResult): StagedAnalysis {
  return { first: r, complete: () => r, steps: function* () { return r; } };
}
