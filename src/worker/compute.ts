// The stages of a run, as pure functions (used inside the worker and by the same-thread
// fallback alike). Engine failures come back as result issues; nothing here throws.
import { analyze, analyzeStaged, buildMna } from '../engine/index';
import { analyzeFeedback, blackmanAt, knownFigures, type BlackmanResult, type FeedbackResult, type KnownFigures } from '../engine/feedback/index';
import type { AnalysisResult, StagedAnalysis } from '../engine/index';
import type { RunRequest } from './protocol';

/** Stage 1 and its completion at once: analyze() with the node-impedance sweep. */
export function runStage1(req: RunRequest): AnalysisResult {
  return analyze(req.netlist, { frequencyHz: req.frequencyHz, off: req.offSources, impedanceSweep: true });
}

/** What the canvas overlay draws first (poles, node table at the asked frequency, DC gain:
 *  analyzeStaged's first part), and the rest on the same factors when asked for (zeros, transfer
 *  sweep, OCTC, participation, node-impedance sweep). */
export function runOverlayStage(req: RunRequest): StagedAnalysis {
  return analyzeStaged(req.netlist, { frequencyHz: req.frequencyHz, off: req.offSources, impedanceSweep: true });
}

/** `complete`: the run's complete small-signal result, whose poles, zeros and bandwidth the
 *  feedback analysis takes when they were computed with the same sources off. */
export function runStage2(req: RunRequest, complete?: AnalysisResult): { feedback: FeedbackResult; blackman: Record<string, BlackmanResult> } {
  return runStage2Known(req, complete ? knownOf(complete) : undefined);
}

/** What a complete result hands the feedback stage (its poles, zeros, bandwidth). */
export const knownOf = (complete: AnalysisResult): KnownFigures | undefined => knownFigures(complete, complete.conditions.off);

/** Stage 2 with the complete result's figures given directly (the loops worker gets them so). */
export function runStage2Known(req: RunRequest, known?: KnownFigures): { feedback: FeedbackResult; blackman: Record<string, BlackmanResult> } {
  const feedback = analyzeFeedback(req.netlist, { off: req.offLoops, known });
  const blackman: Record<string, BlackmanResult> = {};
  if (!feedback.ok || feedback.loops.length === 0) return { feedback, blackman };
  const built = buildMna(req.netlist);
  if (!built.system) return { feedback, blackman };
  const scale: Record<string, number> = {};
  for (const id of feedback.off) scale[id] = 0;
  for (const l of feedback.loops) {
    const key = l.loop.key;
    if (blackman[key]) continue;
    // at DC the regulation already holds these factors
    if (req.frequencyHz === 0 && l.regulation.atHz === 0 && l.regulation.status === 'ok') {
      blackman[key] = { key, fHz: 0, status: 'ok', tOc: null, nodes: l.regulation.nodes };
      continue;
    }
    blackman[key] = blackmanAt(built.system, key, { fHz: req.frequencyHz, scale });
  }
  return { feedback, blackman };
}
