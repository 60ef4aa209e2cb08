// Web Worker for the selected loop's T(jω) and root locus (loopDetail.ts).
import { computeLoopDetail, type LoopDetail, type LoopDetailRequest } from './loopDetail';

const scope = self as unknown as { postMessage(m: LoopDetail): void; onmessage: ((e: MessageEvent<LoopDetailRequest>) => void) | null };
scope.onmessage = (e) => scope.postMessage(computeLoopDetail(e.data));
