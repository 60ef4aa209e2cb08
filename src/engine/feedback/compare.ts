// Loop on/off as an A/B result: switching a loop off sets its key source's dependence to zero
// (scale 0; for an amplifier macro its output is then held at small-signal ground). Any set of
// loops at once. Poles before/after are paired by minimum total log-distance (matching.ts).
import type { MnaSystem } from '../types';
import { runAnalyses, SMALL_SIGNAL_CAUTION } from '../index';
import type { AnalysisResult, AnalyzeOptions } from '../index';
import type { Pole } from '../analyses/poles';
import { scaledG, sourceStamps } from './pencil';
import { matchPoles } from './matching';
import type { Loop } from './loops';

export interface PoleChange {
  before: Pole | null;
  after: Pole | null;
  /** |after| / |before| (natural frequency), null when either side is missing or at the origin. */
  ratio: number | null;
}

export interface NodeChange {
  node: string;
  dcOhmsBefore: number | null;
  dcOhmsAfter: number | null;
  tauBefore: number | null;
  tauAfter: number | null;
}

export interface Change { before: number | null; after: number | null; ratio: number | null }

export interface LoopComparison {
  ok: boolean;
  /** Source ids switched off. */
  off: string[];
  /** Loop ids switched off (when given as loops). */
  loopsOff: string[];
  issues: string[];
  poles: PoleChange[];
  nodes: NodeChange[];
  dcGain: Change;
  bandwidthHz: Change;
  unityGainHz: Change;
  before: AnalysisResult;
  after: AnalysisResult;
  caution: string;
}

const ratioOf = (a: number | null, b: number | null) => (a !== null && b !== null && a !== 0 ? b / a : null);

/** Compare the network as drawn (with `base` scales) against the same with the given sources off. */
export function compareOff(sys: MnaSystem, off: (string | Loop)[], opts: AnalyzeOptions = {}): LoopComparison {
  const stamps = sourceStamps(sys);
  const ids = new Set(stamps.map((s) => s.id));
  const issues: string[] = [];
  const offIds: string[] = [];
  const loopsOff: string[] = [];
  for (const o of off) {
    const id = typeof o === 'string' ? o : o.key;
    if (typeof o !== 'string') loopsOff.push(o.id);
    if (!ids.has(id)) { issues.push(`no controlled source "${id}" to switch off`); continue; }
    if (!offIds.includes(id)) offIds.push(id);
  }
  const baseScale = opts.scale ?? {};
  const conditions = (offList: string[]) => ({
    input: sys.input ?? null, output: sys.output ?? null, off: offList, scaled: { ...baseScale }, frequencyHz: null, sweep: null,
  });
  const Gb = scaledG(sys, stamps, baseScale);
  const offScale: Record<string, number> = { ...baseScale };
  for (const id of offIds) offScale[id] = 0;
  const Ga = scaledG(sys, stamps, offScale);
  const before = runAnalyses({ ...sys, G: Gb }, [], conditions([]), opts);
  const sweep = opts.sweep ?? before.conditions.sweep ?? undefined;
  const after = runAnalyses({ ...sys, G: Ga }, [], conditions(offIds), { ...opts, sweep, frequencyHz: opts.frequencyHz ?? before.conditions.frequencyHz ?? undefined });
  const m = matchPoles(before.poles, after.poles);
  const usedAfter = new Set<number>();
  const poles: PoleChange[] = before.poles.map((p, i) => {
    const j = m[i];
    if (j < 0) return { before: p, after: null, ratio: null };
    usedAfter.add(j);
    const q = after.poles[j];
    return { before: p, after: q, ratio: p.omegaN > 0 && q.omegaN > 0 ? q.omegaN / p.omegaN : null };
  });
  after.poles.forEach((q, j) => { if (!usedAfter.has(j)) poles.push({ before: null, after: q, ratio: null }); });
  const nodes: NodeChange[] = before.nodes.map((nb) => {
    const na = after.nodes.find((x) => x.name === nb.name);
    return { node: nb.name, dcOhmsBefore: nb.dcOhms, dcOhmsAfter: na?.dcOhms ?? null, tauBefore: nb.tau, tauAfter: na?.tau ?? null };
  });
  return {
    ok: before.ok && after.ok && issues.length === 0,
    off: offIds, loopsOff, issues, poles, nodes,
    dcGain: { before: before.dcGain, after: after.dcGain, ratio: ratioOf(before.dcGain, after.dcGain) },
    bandwidthHz: { before: before.bandwidthHz, after: after.bandwidthHz, ratio: ratioOf(before.bandwidthHz, after.bandwidthHz) },
    unityGainHz: { before: before.unityGainHz, after: after.unityGainHz, ratio: ratioOf(before.unityGainHz, after.unityGainHz) },
    before, after,
    caution: SMALL_SIGNAL_CAUTION,
  };
}
