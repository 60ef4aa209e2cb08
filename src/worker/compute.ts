// The stages of a run, as pure functions (used inside the worker and by the same-thread
// fallback alike). Engine failures come back as result issues; nothing here throws.
import { analyze, buildMna, impedanceSweep, logGrid } from '../engine/index';
import { analyzeFeedback, blackmanAt, type BlackmanResult, type FeedbackResult } from '../engine/feedback/index';
import type { AnalysisResult, Cx, ImpedanceSweep } from '../engine/index';
import type { RunRequest } from './protocol';

/** The whole of stage 1 and the sweep at once: analyze() with the node-impedance sweep. */
export function runStage1(req: RunRequest): AnalysisResult {
  return analyze(req.netlist, { frequencyHz: req.frequencyHz, off: req.offSources, impedanceSweep: true });
}

/** What the canvas overlay draws: analyze() without the node-impedance sweep. */
export function runOverlayStage(req: RunRequest): AnalysisResult {
  return analyze(req.netlist, { frequencyHz: req.frequencyHz, off: req.offSources });
}

const finiteCx = (z: Cx | null): Cx | null => (z && Number.isFinite(z.re) && Number.isFinite(z.im) ? z : null);

/** Every node's impedance over the sweep grid of a stage-1 result, with the same switches and
 *  its poles (for the modal form); null when the result has no numbers. */
export function runSweepStage(req: RunRequest, result: AnalysisResult): ImpedanceSweep | null {
  const range = result.conditions.sweep;
  if (!result.ok || !range) return null;
  const scale: Record<string, number> = { ...result.conditions.scaled };
  for (const id of result.conditions.off) scale[id] = 0;
  const built = buildMna(req.netlist, { scale });
  if (!built.system) return null;
  const sweep = impedanceSweep(built.system, logGrid(range.fMin, range.fMax, range.perDecade), { poles: result.poles });
  return { ...sweep, values: sweep.values.map((row) => row.map(finiteCx)) };
}

export function runStage2(req: RunRequest): { feedback: FeedbackResult; blackman: Record<string, BlackmanResult> } {
  const feedback = analyzeFeedback(req.netlist, { off: req.offLoops });
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
