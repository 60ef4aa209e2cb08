// Where runs execute: Web Workers when the platform has them (the canvas never waits for the
// engine), else on the same thread in small steps (jsdom, tests, the CLI). Both take the same
// request kinds (protocol.ts): runs and loop-detail requests.
import { createScheduler } from './scheduler';
import { knownOf } from './compute';
import type { AnalysisRunner, FeedbackRequest, LoopDetailRequest, RunRequest, WorkerMessage } from './protocol';

export function createSameThreadRunner(): AnalysisRunner {
  const listeners: ((m: WorkerMessage) => void)[] = [];
  const scheduler = createScheduler((m) => { for (const fn of listeners) fn(m); });
  return {
    kind: 'same-thread',
    run: (req) => scheduler.push(req),
    loopDetail: (req) => scheduler.push(req),
    onMessage: (fn) => { listeners.push(fn); },
    dispose: () => scheduler.stop(),
  };
}

/** Two workers, each with its own heap: the overlay worker runs stage 1 and the complete result,
 *  the loops worker the feedback stage (asked by the page once the complete result is in, with
 *  its poles, zeros and bandwidth) and the loop details. A new edit's stage 1 then never queues
 *  behind a feedback analysis, and it does not pay for that analysis's garbage: in one worker, a
 *  stage 1 started within 20 ms of a feedback analysis took 45–67 ms instead of 6–8 ms (Chromium,
 *  60-unknown bench chain; tests/bench/RESULTS.md). */
export function createWorkerRunner(): AnalysisRunner {
  const listeners: ((m: WorkerMessage) => void)[] = [];
  const emit = (m: WorkerMessage) => { for (const fn of listeners) fn(m); };
  let fallback: AnalysisRunner | null = null;
  let lastRun: RunRequest | null = null;
  let lastDetail: LoopDetailRequest | null = null;
  const start = () => new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module' });
  const overlay = start();
  const loops = start();
  overlay.onmessage = (e: MessageEvent<WorkerMessage>) => {
    const m = e.data;
    emit(m);
    // The listeners have taken stage 1 in; once the frame that shows it is done, the worker may
    // go on with the complete result (it holds it meanwhile, see scheduler.ts).
    if (m.stage === 1 && !fallback) afterNextFrame(() => { if (!fallback) overlay.postMessage({ kind: 'shown', runId: m.runId }); });
    if (m.stage === 'complete' && !fallback && lastRun && m.runId === lastRun.runId && lastRun.feedback !== false) {
      const req: FeedbackRequest = { kind: 'feedback', run: lastRun, known: knownOf(m.result) };
      loops.postMessage(req);
    }
  };
  loops.onmessage = (e: MessageEvent<WorkerMessage>) => emit(e.data);
  // A worker that cannot start (blocked, failed to load) hands over to the same-thread runner.
  const fail = (e: ErrorEvent) => {
    e.preventDefault?.();
    if (fallback) return;
    overlay.terminate();
    loops.terminate();
    fallback = createSameThreadRunner();
    fallback.onMessage(emit);
    if (lastRun) fallback.run(lastRun);
    if (lastDetail) fallback.loopDetail!(lastDetail);
  };
  overlay.onerror = fail;
  loops.onerror = fail;
  return {
    get kind() { return fallback ? 'same-thread' as const : 'worker' as const; },
    run(req) {
      lastRun = req;
      if (fallback) fallback.run(req);
      else overlay.postMessage({ ...req, holdAfterStage1: true, feedback: false } satisfies RunRequest);
    },
    loopDetail(req) {
      lastDetail = req;
      if (fallback) fallback.loopDetail!(req);
      else loops.postMessage(req);
    },
    onMessage: (fn) => { listeners.push(fn); },
    dispose() { overlay.terminate(); loops.terminate(); fallback?.dispose(); },
  };
}

/** fn once the next frame has been drawn (a task after the frame's animation callbacks), or at
 *  once where there are no frames. */
function afterNextFrame(fn: () => void): void {
  if (typeof requestAnimationFrame !== 'function') { fn(); return; }
  requestAnimationFrame(() => setTimeout(fn, 0));
}

/** A worker runner where Worker exists, else the same-thread fallback. */
export function createAnalysisRunner(): AnalysisRunner {
  if (typeof Worker === 'undefined') return createSameThreadRunner();
  try {
    return createWorkerRunner();
  } catch {
    return createSameThreadRunner();
  }
}
