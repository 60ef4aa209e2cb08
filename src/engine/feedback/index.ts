// Public API of the feedback engine: loops, their return ratios, what each regulates, stability,
// boosters, doublets and the slowest pole's sensitivities in one JSON-safe result; plus loop on/off
// (A/B) and root locus. Every figure is a linear small-signal estimate about the entered bias point.
import type { EngineIssue, MnaSystem, Netlist } from '../types';
import type { AnalysisResult } from '../index';
import { buildMna } from '../mna';
import { computePoles } from '../analyses/poles';
import type { PoleResult } from '../analyses/poles';
import type { ZeroResult } from '../analyses/zeros';
import { discoverLoops } from './loops';
import type { Loop, LoopOptions } from './loops';
import { loopRegulation } from './regulation';
import type { Regulation } from './regulation';
import { loopMarginsFromSweeps, loopMarginsMany } from './margins';
import type { LoopMargins } from './margins';
import { boosterChecks, findDoublets } from './doublets';
import type { BoosterCheck, DoubletResult } from './doublets';
import type { BlackmanResult, FullPencil } from './blackman';
import type { SplitNetwork } from './portInto';
import { poleSensitivity } from './sensitivity';
import { stepResponse } from './step';
import type { StepResponse } from './step';
import type { PoleSensitivity } from './sensitivity';
import { scaledG, sourceStamps } from './pencil';
import { ReducedPencil } from './reduced';

export { discoverLoops } from './loops';
export type { Loop, LoopDiscovery, LoopMember, LoopBand } from './loops';
export { returnRatios } from './returnRatio';
export type { ReturnRatioSweep, ReturnRatioPoint } from './returnRatio';
export { blackmanAt } from './blackman';
export type { BlackmanNode, BlackmanResult } from './blackman';
export { loopRegulation, regulationOf } from './regulation';
export type { Regulation, HeldQuantity } from './regulation';
export { compareOff } from './compare';
export type { LoopComparison, PoleChange, NodeChange } from './compare';
export { rootLocus } from './locus';
export type { RootLocus, LocusBranch, LocusEvent } from './locus';
export { loopMargins, loopMarginsMany } from './margins';
export type { LoopMargins } from './margins';
export { findDoublets, boosterChecks } from './doublets';
export type { Doublet, DoubletResult, BoosterCheck } from './doublets';
export { stepResponse } from './step';
export type { StepResponse, SettlingTime } from './step';
export { poleSensitivity } from './sensitivity';
export type { PoleSensitivity, ElementSensitivity } from './sensitivity';

export const FEEDBACK_CAUTION =
  'Loop gains, impedance factors and margins are linear small-signal estimates about the entered bias point.';

export interface LoopReport {
  loop: Omit<Loop, 'returnRatio'>;
  regulation: Regulation;
  margins: LoopMargins;
}

export interface FeedbackResult {
  ok: boolean;
  caution: string;
  issues: EngineIssue[];
  /** Source ids switched off for this result. */
  off: string[];
  loops: LoopReport[];
  truncated: boolean;
  threshold: number;
  groups: string[][];
  notes: string[];
  boosters: BoosterCheck[];
  doublets: DoubletResult | null;
  slowestPole: PoleSensitivity | null;
  /** Step response of the chosen transfer (thinned waveform) with settling times. */
  step: StepResponse | null;
}

export interface FeedbackOptions extends LoopOptions {
  /** Loop ids, source ids ("M1.gm") or part names to switch off (their key source's gain → 0). */
  off?: string[];
  /** Figures of the same network already worked out by the small-signal analysis (the live view
   *  runs it first): used only when they were computed with the same sources off. */
  known?: KnownFigures;
}

export interface KnownFigures {
  /** Source ids that were off (gain 0) when these figures were computed. */
  off: string[];
  poles?: PoleResult;
  zeros?: ZeroResult;
  /** Closed-loop bandwidth of the chosen transfer (Hz), null when it has none. */
  bandwidthHz?: number | null;
}

/** The figures a complete small-signal result (analyze(), computed with the sources `off`)
 *  holds for the feedback analysis of the same network; undefined before its complete stage. */
export function knownFigures(r: AnalysisResult, off: string[]): KnownFigures | undefined {
  if (r.stage !== 'complete' || !r.ok) return undefined;
  const known: KnownFigures = { off };
  if (r.poleInfo.status === 'ok') known.poles = { poles: r.poles, infiniteCount: r.poleInfo.infiniteCount, originCount: r.poleInfo.originCount, status: 'ok' };
  const zs = r.zeroInfo.status;
  if (known.poles && (zs === 'ok' || zs === 'no-input' || zs === 'no-output' || zs === 'identically-zero')) {
    known.zeros = { zeros: r.zeros, infiniteCount: r.zeroInfo.infiniteCount, status: zs, reason: r.reasons.zeros };
  }
  // a bandwidth the result could not find is looked for again over the feedback's own range
  if (r.bandwidthHz !== null) known.bandwidthHz = r.bandwidthHz;
  return known;
}

/** Map loop ids / source ids / part names to source ids; unknown names become named issues. */
export function resolveOff(sys: MnaSystem, names: string[], loops: Loop[] = []): { ids: string[]; issues: EngineIssue[] } {
  const stamps = sourceStamps(sys);
  const ids: string[] = [];
  const issues: EngineIssue[] = [];
  for (const name of names) {
    const loop = loops.find((l) => l.id === name || l.label === name);
    // a loop id starts with its key ("A1.A0>M2.gm"), a label with the key's part ("A1 → M2"), so
    // either resolves without discovering the loops again
    const head = name.includes('>') ? name.split('>')[0] : name.includes(' → ') ? name.split(' → ')[0] : name;
    const direct = stamps.find((s) => s.id === head);
    const ofPart = stamps.filter((s) => s.part === head);
    const pref = ['A0', 'gain', 'gm'].map((r) => ofPart.find((s) => s.role === r)).find(Boolean) ?? ofPart[0];
    const id = loop?.key ?? direct?.id ?? pref?.id;
    if (!id) {
      issues.push({ severity: 'error', code: 'unknown-part', field: 'off', part: name, message: `off: "${name}" is neither a loop nor a controlled source of this netlist (e.g. "A1", "M1.gm")` });
      continue;
    }
    if (!ids.includes(id)) ids.push(id);
  }
  return { ids, issues };
}

export function analyzeFeedbackSystem(sys: MnaSystem, opts: FeedbackOptions = {}): FeedbackResult {
  const scale: Record<string, number> = { ...(opts.scale ?? {}) };
  const issues: EngineIssue[] = [];
  let off: string[] = [];
  if (opts.off?.length) {
    const r = resolveOff(sys, opts.off);
    issues.push(...r.issues);
    off = r.ids;
    for (const id of off) scale[id] = 0;
  }
  const known = opts.known && sameIds(opts.known.off, off) && !Object.keys(opts.scale ?? {}).length ? opts.known : undefined;
  const d = discoverLoops(sys, { ...opts, scale });
  // the discovery's sweep of each key's return ratio serves the margins (one factor per frequency)
  // (a caller's own discovery grid may be too sparse for that: then the margins' own grid)
  const sweeps = [...new Map(d.loops.map((l) => [l.key, l.returnRatio])).values()];
  // one Hessenberg form of the network as analysed serves the margins' crossing searches and the
  // boosters' closed-loop bandwidth
  const stamps = sourceStamps(sys);
  const G = scaledG(sys, stamps, scale);
  const reduced = ReducedPencil.of(G, sys.C, sys.n);
  const marginList = opts.freqsHz ? loopMarginsMany(sys, sweeps.map((x) => x.id), { scale }) : loopMarginsFromSweeps(sys, sweeps, { scale, reduced });
  const margins = new Map(marginList.map((m) => [m.key, m]));
  const cache = new Map<string, BlackmanResult>();
  const pencils = new Map<number, FullPencil>();
  const splits = new Map<string, SplitNetwork | null>();
  const loops: LoopReport[] = d.loops.map((loop) => {
    const { returnRatio: _sweep, ...rest } = loop;
    void _sweep;
    return { loop: rest, regulation: loopRegulation(sys, loop, { scale, cache, pencils, splits, G, stamps }), margins: margins.get(loop.key)! };
  });
  const hasTransfer = sys.b.some((v) => v !== 0) && sys.c.some((v) => v !== 0);
  // one pole computation of the system as analysed serves doublets, sensitivity and step response
  const scaled = scaleSystem(sys, scale);
  const poles = known?.poles ?? computePoles(scaled);
  const result: FeedbackResult = {
    ok: !issues.some((i) => i.severity === 'error'),
    caution: FEEDBACK_CAUTION,
    issues,
    off,
    loops,
    truncated: d.truncated,
    threshold: d.threshold,
    groups: d.groups,
    notes: d.notes,
    boosters: hasTransfer ? boosterChecks(sys, d.loops, { scale, margins, reduction: reduced?.reduction, bandwidthHz: known?.bandwidthHz }) : [],
    doublets: hasTransfer ? findDoublets(sys, { scale, poles, zeros: known?.zeros }) : null,
    slowestPole: poleSensitivity(scaled, { poles }),
    step: hasTransfer ? stepResponse(scaled, { maxPoints: 400, poles }) : null,
  };
  return jsonSafe(result);
}

/** Build the netlist (validation, structure check) and analyse its feedback. */
export function analyzeFeedback(netlist: Netlist, opts: FeedbackOptions = {}): FeedbackResult {
  const built = buildMna(netlist);
  if (!built.system) {
    return { ok: false, caution: FEEDBACK_CAUTION, issues: built.issues, off: [], loops: [], truncated: false, threshold: opts.threshold ?? 0.01, groups: [], notes: [], boosters: [], doublets: null, slowestPole: null, step: null };
  }
  const r = analyzeFeedbackSystem(built.system, opts);
  return { ...r, issues: [...built.issues.filter((i) => i.severity !== 'error'), ...r.issues] };
}

function sameIds(a: string[], b: string[]): boolean {
  return a.length === b.length && a.every((x) => b.includes(x));
}

function scaleSystem(sys: MnaSystem, scale: Record<string, number>): MnaSystem {
  if (!Object.keys(scale).length) return sys;
  const elements = sys.elements.map((e) => {
    const k = (e.type === 'vccs' || e.type === 'vcvs') ? scale[e.id] : undefined;
    if (k === undefined) return e;
    return e.type === 'vccs' ? { ...e, gm: e.gm * k } : e.type === 'vcvs' ? { ...e, gain: e.gain * k } : e;
  });
  const G = scaledG(sys, sourceStamps(sys), scale);
  return { ...sys, G, elements };
}

/** Replace non-finite numbers by null (typed arrays by plain arrays) so the result is JSON-safe (no
 *  NaN / Infinity). In place: every object of the result is this call's own (an object reached
 *  twice is only looked at twice). */
function jsonSafe<T>(v: T): T {
  return fix(v) as T;
}

function fix(x: unknown): unknown {
  if (typeof x === 'number') return Number.isFinite(x) ? x : null;
  if (x instanceof Float64Array || x instanceof Int32Array) return Array.from(x as ArrayLike<number>, (y) => (Number.isFinite(y) ? y : null));
  if (!x || typeof x !== 'object') return x;
  if (Array.isArray(x)) {
    for (let i = 0; i < x.length; i++) {
      const y = x[i];
      if (typeof y === 'number' ? !Number.isFinite(y) : typeof y === 'object' && y !== null) x[i] = fix(y);
    }
    return x;
  }
  const o = x as Record<string, unknown>;
  // for…in over the result's plain objects (own keys only: none inherits enumerable ones), without
  // the key array Object.keys would allocate for each of its tens of thousands of objects
  for (const k in o) {
    const y = o[k];
    if (typeof y === 'number' ? !Number.isFinite(y) : typeof y === 'object' && y !== null) o[k] = fix(y);
  }
  return x;
}
