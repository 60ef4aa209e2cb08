// Where runs execute: a Web Worker when the platform has one (the canvas never waits for the
// engine), else on the same thread in small steps (jsdom, tests, the CLI). Both take the same two
// request kinds (protocol.ts): runs and loop-detail requests.
import { createScheduler } from './scheduler';
import type { AnalysisRunner, LoopDetailRequest, RunRequest, WorkerMessage, WorkerRequest } from './protocol';

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

export function createWorkerRunner(): AnalysisRunner {
  const listeners: ((m: WorkerMessage) => void)[] = [];
  const emit = (m: WorkerMessage) => { for (const fn of listeners) fn(m); };
  let fallback: AnalysisRunner | null = null;
  let lastRun: RunRequest | null = null;
  let lastDetail: LoopDetailRequest | null = null;
  const worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module' });
  const send = (req: WorkerRequest) => worker.postMessage(req);
  worker.onmessage = (e: MessageEvent<WorkerMessage>) => {
    const m = e.data;
    emit(m);
    // The listeners have taken stage 1 in; once the frame that shows it is done, the worker may
    // go on with the later stages (it holds them meanwhile, see scheduler.ts).
    if (m.stage === 1 && !fallback) afterNextFrame(() => { if (!fallback) send({ kind: 'shown', runId: m.runId }); });
  };
  // A worker that cannot start (blocked, failed to load) hands over to the same-thread runner.
  worker.onerror = (e) => {
    e.preventDefault?.();
    if (fallback) return;
    worker.terminate();
    fallback = createSameThreadRunner();
    fallback.onMessage(emit);
    if (lastRun) fallback.run(lastRun);
    if (lastDetail) fallback.loopDetail!(lastDetail);
  };
  return {
    get kind() { return fallback ? 'same-thread' as const : 'worker' as const; },
    run(req) {
      lastRun = req;
      if (fallback) fallback.run(req);
      else send({ ...req, holdAfterStage1: true });
    },
    loopDetail(req) {
      lastDetail = req;
      if (fallback) fallback.loopDetail!(req);
      else send(req);
    },
    onMessage: (fn) => { listeners.push(fn); },
    dispose() { worker.terminate(); fallback?.dispose(); },
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
