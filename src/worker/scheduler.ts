// One task at a time, newest wins, with a yield to the event loop between tasks (so a newer
// request can arrive): stage 1 of the newest run, then its complete result, then its stage 2
// (each skipped once a newer run is pending), then the newest loop-detail request. Shared by the
// worker and the same-thread fallback.
import { runOverlayStage, runStage2 } from './compute';
import { computeLoopDetail } from './loopDetail';
import { isLoopDetailRequest, type LoopDetailRequest, type RunRequest, type WorkerMessage, type WorkerRequest } from './protocol';
import type { AnalysisResult } from '../engine/index';

export interface Scheduler {
  push(req: WorkerRequest): void;
  /** Stop: pending work is dropped silently. */
  stop(): void;
}

const errText = (e: unknown) => (e instanceof Error ? e.message : String(e));
const clock = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());
const epoch = () => (typeof performance !== 'undefined' && performance.timeOrigin ? performance.timeOrigin + performance.now() : Date.now());

type Later = { req: RunRequest; next: 'complete' | 'feedback'; complete: () => AnalysisResult };

export function createScheduler(post: (msg: WorkerMessage) => void, yieldNow: (fn: () => void) => void = (fn) => setTimeout(fn, 0)): Scheduler {
  let pending: RunRequest | null = null;
  let pendingAt = 0;
  let later: Later | null = null;
  let detail: LoopDetailRequest | null = null;
  let busy = false;
  let stopped = false;

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
      later = staged.first.ok ? { req, next: 'complete', complete: staged.complete } : null;
    } catch (e) {
      post({ runId: req.runId, stage: 'failed', message: `analysis: ${errText(e)}` });
    }
  };

  const continueRun = (l: Later) => {
    const { req } = l;
    if (l.next === 'complete') {
      try {
        const [result, ms] = timed(l.complete);
        post({ runId: req.runId, stage: 'complete', result, ms });
      } catch (e) {
        post({ runId: req.runId, stage: 'failed', message: `analysis: ${errText(e)}` });
        later = null;
        return;
      }
      later = req.feedback === false ? null : { ...l, next: 'feedback' };
      return;
    }
    later = null;
    try {
      const [{ feedback, blackman }, ms] = timed(() => runStage2(req));
      post({ runId: req.runId, stage: 2, feedback, blackman, ms });
    } catch (e) {
      post({ runId: req.runId, stage: 'failed', message: `feedback analysis: ${errText(e)}` });
    }
  };

  const step = () => {
    if (stopped) return;
    if (pending) {
      if (later) { post({ runId: later.req.runId, stage: 'dropped' }); later = null; }
      const req = pending;
      pending = null;
      stage1(req);
    } else if (later) {
      continueRun(later);
    } else if (detail) {
      const req = detail;
      detail = null;
      const [d, ms] = timed(() => computeLoopDetail(req));
      post({ stage: 'loopDetail', detail: d, ms });
    } else {
      busy = false;
      return;
    }
    yieldNow(step);
  };

  return {
    push(req) {
      if (stopped) return;
      if (isLoopDetailRequest(req)) detail = req;
      else {
        if (pending) post({ runId: pending.runId, stage: 'dropped' });
        pending = req;
        pendingAt = epoch();
      }
      if (!busy) { busy = true; yieldNow(step); }
    },
    stop() { stopped = true; pending = null; later = null; detail = null; },
  };
}
