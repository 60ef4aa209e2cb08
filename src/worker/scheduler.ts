// One task at a time, newest wins, with a yield to the event loop between tasks (so a newer
// request can arrive): stage 1 of the newest run, then its complete result, then its stage 2
// (each skipped once a newer run is pending), then the newest stage-2-only request (the loops
// worker's), then the newest loop-detail request. Shared by the workers and the same-thread
// fallback.
// A run asking for it (`holdAfterStage1`) waits after stage 1 until the page says it has shown
// that stage (a 'shown' request) or HOLD_MAX_MS pass: on a 2-core machine the later stages would
// otherwise take a core from the page while it draws the overlay. When idle, the worker may repeat
// stage 1 of the last run a few times (`warmCalls`): the engine's kernels are then compiled
// (JIT) before the next edit instead of during the first dozen edits.
import { knownOf, runOverlayStage, runStage2Known } from './compute';
import type { KnownFigures } from '../engine/feedback/index';
import { computeLoopDetail } from './loopDetail';
import { isFeedbackRequest, isLoopDetailRequest, isShownRequest, type FeedbackRequest, type LoopDetailRequest, type RunRequest, type WorkerMessage, type WorkerRequest } from './protocol';
import type { AnalysisResult } from '../engine/index';

export interface Scheduler {
  push(req: WorkerRequest): void;
  /** Stop: pending work is dropped silently. */
  stop(): void;
}

const errText = (e: unknown) => (e instanceof Error ? e.message : String(e));
const clock = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());
const epoch = () => (typeof performance !== 'undefined' && performance.timeOrigin ? performance.timeOrigin + performance.now() : Date.now());

/** The rest of a run after its stage 1: the complete result is worked out one step per task
 *  (`steps`, its time summed in `ms`), so a newer run's stage 1 waits one step at most. */
type Later = { req: RunRequest; next: 'complete' | 'feedback'; complete: () => AnalysisResult; steps: Generator<void, AnalysisResult>; ms: number; held: boolean };

/** Longest wait for the page's 'shown' before the later stages start anyway (ms). */
export const HOLD_MAX_MS = 60;

export interface SchedulerOptions {
  /** Idle repeats of the last run's stage 1, in all (default 0). */
  warmCalls?: number;
  /** Timer for the hold (tests pass their own). */
  later?: (fn: () => void, ms: number) => unknown;
  cancel?: (t: unknown) => void;
}

export function createScheduler(post: (msg: WorkerMessage) => void, yieldNow: (fn: () => void) => void = (fn) => setTimeout(fn, 0), opts: SchedulerOptions = {}): Scheduler {
  let pending: RunRequest | null = null;
  let pendingAt = 0;
  let later: Later | null = null;
  let detail: LoopDetailRequest | null = null;
  let feedbackAsk: FeedbackRequest | null = null;
  let busy = false;
  let stopped = false;
  let warmLeft = opts.warmCalls ?? 0;
  let lastOk: RunRequest | null = null;
  let holdTimer: unknown = null;
  const setTimer = opts.later ?? ((fn: () => void, ms: number) => setTimeout(fn, ms));
  const clearTimer = opts.cancel ?? ((t: unknown) => clearTimeout(t as ReturnType<typeof setTimeout>));
  const wake = () => { if (!busy && !stopped) { busy = true; yieldNow(step); } };
  const release = (runId?: number) => {
    if (!later || !later.held || (runId !== undefined && later.req.runId !== runId)) return;
    later.held = false;
    if (holdTimer !== null) { clearTimer(holdTimer); holdTimer = null; }
    wake();
  };

  const timed = <T>(fn: () => T): [T, number] => {
    const t0 = clock();
    const v = fn();
    return [v, clock() - t0];
  };

  const stage1 = (req: RunRequest) => {
    try {
      const received = pendingAt;
      const [staged, ms] = timed(() => runOverlayStage(req));
      post({ runId: req.runId, stage: 1, result: staged.first, ms, at: { received, posted: epoch() } });
      later = staged.first.ok ? { req, next: 'complete', complete: staged.complete, steps: staged.steps(), ms: 0, held: !!req.holdAfterStage1 } : null;
      if (staged.first.ok) lastOk = req;
      if (later?.held) {
        const runId = req.runId;
        holdTimer = setTimer(() => { holdTimer = null; release(runId); }, HOLD_MAX_MS);
      }
    } catch (e) {
      post({ runId: req.runId, stage: 'failed', message: `analysis: ${errText(e)}` });
    }
  };

  const continueRun = (l: Later) => {
    const { req } = l;
    if (l.next === 'complete') {
      try {
        const [step, ms] = timed(() => l.steps.next());
        l.ms += ms;
        if (!step.done) return; // the next task takes the next step
        post({ runId: req.runId, stage: 'complete', result: step.value, ms: l.ms });
      } catch (e) {
        post({ runId: req.runId, stage: 'failed', message: `analysis: ${errText(e)}` });
        later = null;
        return;
      }
      later = req.feedback === false ? null : { ...l, next: 'feedback' };
      return;
    }
    later = null;
    // the complete result is already worked out (it was posted before this stage)
    feedbackStage(req, knownOf(l.complete()));
  };

  /** Stage 2 of `run` (in this worker after its complete result, or asked for alone). */
  const feedbackStage = (run: RunRequest, known?: KnownFigures) => {
    try {
      const [{ feedback, blackman }, ms] = timed(() => runStage2Known(run, known));
      post({ runId: run.runId, stage: 2, feedback, blackman, ms });
    } catch (e) {
      post({ runId: run.runId, stage: 'failed', message: `feedback analysis: ${errText(e)}` });
    }
  };

  const step = () => {
    if (stopped) return;
    if (pending) {
      if (later) { post({ runId: later.req.runId, stage: 'dropped' }); later = null; }
      if (holdTimer !== null) { clearTimer(holdTimer); holdTimer = null; }
      const req = pending;
      pending = null;
      stage1(req);
    } else if (later && later.held) {
      busy = false; // the page's 'shown' or the hold timer wakes the scheduler
      return;
    } else if (later) {
      continueRun(later);
    } else if (feedbackAsk) {
      const { run, known } = feedbackAsk;
      feedbackAsk = null;
      feedbackStage(run, known);
    } else if (detail) {
      const req = detail;
      detail = null;
      const [d, ms] = timed(() => computeLoopDetail(req));
      post({ stage: 'loopDetail', detail: d, ms });
    } else if (warmLeft > 0 && lastOk) {
      warmLeft -= 1;
      try { runOverlayStage(lastOk); } catch { /* a warm-up call has no result to give */ }
    } else {
      busy = false;
      return;
    }
    yieldNow(step);
  };

  return {
    push(req) {
      if (stopped) return;
      if (isShownRequest(req)) { release(req.runId); return; }
      if (isLoopDetailRequest(req)) detail = req;
      else if (isFeedbackRequest(req)) feedbackAsk = req;
      else {
        if (pending) post({ runId: pending.runId, stage: 'dropped' });
        pending = req;
        pendingAt = epoch();
      }
      if (!busy) { busy = true; yieldNow(step); }
    },
    stop() {
      stopped = true; pending = null; later = null; detail = null; feedbackAsk = null;
      if (holdTimer !== null) { clearTimer(holdTimer); holdTimer = null; }
    },
  };
}
