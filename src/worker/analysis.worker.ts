// The analysis Web Worker: receives WorkerRequest messages (runs and loop-detail requests) and
// answers WorkerMessage (stage 1, sweep, stage 2; loop detail).
import { createScheduler } from './scheduler';
import type { WorkerMessage, WorkerRequest } from './protocol';

const scope = self as unknown as { postMessage(m: WorkerMessage): void; onmessage: ((e: MessageEvent<WorkerRequest>) => void) | null };
const scheduler = createScheduler((m) => scope.postMessage(m));
scope.onmessage = (e) => scheduler.push(e.data);
