// One run at a time, newest wins: stage 1, then a yield to the event loop (so a newer request can
// arrive), then stage 2 unless superseded. Shared by the worker and the same-thread fallback.
import { runStage1, runStage2 } from './compute';
import type { RunMessage, RunRequest } from './protocol';

export interface Scheduler {
  push(req: RunRequest): void;
  /** Stop: pending work is dropped silently. */
  stop(): void;
}

const errText = (e: unknown) => (e instanceof Error ? e.message : String(e));

export function createScheduler(post: (msg: RunMessage) => void, yieldNow: (fn: () => void) => void = (fn) => setTimeout(fn, 0)): Scheduler {
  let pending: RunRequest | null = null;
  let busy = false;
  let stopped = false;

  const supersede = (req: RunRequest) => {
    if (pending && pending !== req) post({ runId: req.runId, stage: 'dropped' });
    return pending !== null && pending !== req;
  };

  const step = () => {
    if (stopped) return;
    const req = pending;
    pending = null;
    if (!req) { busy = false; return; }
    busy = true;
    try {
      post({ runId: req.runId, stage: 1, result: runStage1(req) });
    } catch (e) {
      post({ runId: req.runId, stage: 'failed', message: `analysis: ${errText(e)}` });
      yieldNow(step);
      return;
    }
    if (req.feedback === false) { yieldNow(step); return; }
    yieldNow(() => {
      if (stopped) return;
      if (supersede(req)) { step(); return; }
      try {
        const { feedback, blackman } = runStage2(req);
        post({ runId: req.runId, stage: 2, feedback, blackman });
      } catch (e) {
        post({ runId: req.runId, stage: 'failed', message: `feedback analysis: ${errText(e)}` });
      }
      yieldNow(step);
    });
  };

  return {
    push(req) {
      if (stopped) return;
      if (pending) post({ runId: pending.runId, stage: 'dropped' });
      pending = req;
      if (!busy) { busy = true; yieldNow(step); }
    },
    stop() { stopped = true; pending = null; },
  };
}
