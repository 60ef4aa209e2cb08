// The analysis Web Worker: receives WorkerRequest messages (runs, stage-2-only requests and
// loop-detail requests) and answers WorkerMessage (stage 1, complete, stage 2; loop detail). The
// page starts two of it (runner.ts): one for the overlay's stages, one for the loops.
import { createScheduler } from './scheduler';
import type { WorkerMessage, WorkerRequest } from './protocol';

const scope = self as unknown as { postMessage(m: WorkerMessage): void; onmessage: ((e: MessageEvent<WorkerRequest>) => void) | null };
/** Idle repeats of stage 1 after the first runs: about what the engine's kernels need to be
 *  compiled by the JIT (in node, stage 1 of the 60-unknown bench drawing takes 10–40 ms over its
 *  first 15–30 calls and about 4 ms after). */
const WARM_CALLS = 24;
const scheduler = createScheduler((m) => scope.postMessage(m), undefined, { warmCalls: WARM_CALLS });
scope.onmessage = (e) => scheduler.push(e.data);
