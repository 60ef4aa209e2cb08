// The analysis Web Worker: receives RunRequest messages, answers RunMessage (stage 1, stage 2).
import { createScheduler } from './scheduler';
import type { RunMessage, RunRequest } from './protocol';

const scope = self as unknown as { postMessage(m: RunMessage): void; onmessage: ((e: MessageEvent<RunRequest>) => void) | null };
const scheduler = createScheduler((m) => scope.postMessage(m));
scope.onmessage = (e) => scheduler.push(e.data);
