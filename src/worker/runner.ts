// Where runs execute: a Web Worker when the platform has one (the canvas never waits for the
// engine), else on the same thread in small steps (jsdom, tests, the CLI).
import { createScheduler } from './scheduler';
import type { AnalysisRunner, RunMessage, RunRequest } from './protocol';

export function createSameThreadRunner(): AnalysisRunner {
  const listeners: ((m: RunMessage) => void)[] = [];
  const scheduler = createScheduler((m) => { for (const fn of listeners) fn(m); });
  return {
    kind: 'same-thread',
    run: (req) => scheduler.push(req),
    onMessage: (fn) => { listeners.push(fn); },
    dispose: () => scheduler.stop(),
  };
}

export function createWorkerRunner(): AnalysisRunner {
  const listeners: ((m: RunMessage) => void)[] = [];
  const emit = (m: RunMessage) => { for (const fn of listeners) fn(m); };
  let fallback: AnalysisRunner | null = null;
  let last: RunRequest | null = null;
  const worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module' });
  worker.onmessage = (e: MessageEvent<RunMessage>) => emit(e.data);
  // A worker that cannot start (blocked, failed to load) hands over to the same-thread runner.
  worker.onerror = (e) => {
    e.preventDefault?.();
    if (fallback) return;
    worker.terminate();
    fallback = createSameThreadRunner();
    fallback.onMessage(emit);
    if (last) fallback.run(last);
  };
  return {
    get kind() { return fallback ? 'same-thread' as const : 'worker' as const; },
    run(req) {
      last = req;
      if (fallback) fallback.run(req);
      else worker.postMessage(req);
    },
    onMessage: (fn) => { listeners.push(fn); },
    dispose() { worker.terminate(); fallback?.dispose(); },
  };
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
