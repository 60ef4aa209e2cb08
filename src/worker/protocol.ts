// Messages between the live store and the analysis worker. A run answers in stages: stage 1 is
// what the canvas overlay draws (the first part of the engine's analyzeStaged: poles, node
// table, DC gain), then the complete result (zeros, transfer sweep, OCTC, participation, every
// node's impedance over frequency), then stage 2, the feedback analysis (several times slower;
// the page's worker runner asks a second worker for it, FeedbackRequest). Every run message
// carries the run id of its request, so the receiver can drop answers of stale runs. A loop-detail request (the selected loop's T(jω) or
// root locus, loopDetail.ts) is the other request kind; it is answered after the stages of the
// current run, newest request only.
import type { AnalysisResult, Netlist } from '../engine/index';
import type { BlackmanResult, FeedbackResult, KnownFigures } from '../engine/feedback/index';
import type { LoopDetail, LoopDetailRequest } from './loopDetail';

export type { LoopDetail, LoopDetailRequest };

export interface RunRequest {
  kind?: 'run';
  runId: number;
  netlist: Netlist;
  /** Frequency of the node impedance column (Hz); 0 = DC. */
  frequencyHz: number;
  /** Controlled-source ids ("M1.gm") or part names switched off for analyze(). */
  offSources: string[];
  /** Loop ids or source ids switched off for the feedback analysis. */
  offLoops: string[];
  /** Also run stage 2 (feedback); default true. */
  feedback?: boolean;
  /** Wait after stage 1 for a 'shown' request of this run (or a short time) before the rest. */
  holdAfterStage1?: boolean;
}

/** The page has drawn stage 1 of run `runId`: the worker may go on with the later stages. */
export interface ShownRequest { kind: 'shown'; runId: number }

/** Stage 2 alone, for a worker of its own (the loops worker): the run, and the poles, zeros and
 *  bandwidth of its complete result, sent by the page when that result has arrived. Answered with
 *  the run's stage-2 message; a newer request supersedes one not yet started. */
export interface FeedbackRequest { kind: 'feedback'; run: RunRequest; known?: KnownFigures }

export type WorkerRequest = RunRequest | LoopDetailRequest | ShownRequest | FeedbackRequest;

/** `ms`: compute time of the stage inside the worker; `at`: when the worker got the request and
 *  when it posted this answer (performance.timeOrigin + now(), ms: comparable across threads).
 *  Both only feed the performance marks. */
export interface StageTimes { received: number; posted: number }

export type RunMessage =
  | { runId: number; stage: 1; result: AnalysisResult; ms?: number; at?: StageTimes }
  /** The whole analyze() result of the run (stage 1's figures unchanged, the rest added). */
  | { runId: number; stage: 'complete'; result: AnalysisResult; ms?: number }
  | { runId: number; stage: 2; feedback: FeedbackResult; blackman: Record<string, BlackmanResult>; ms?: number }
  /** The run was superseded before it finished (no more messages for it). */
  | { runId: number; stage: 'dropped' }
  /** The worker itself failed (not a circuit error: those come as result issues). */
  | { runId: number; stage: 'failed'; message: string };

export interface LoopDetailMessage { stage: 'loopDetail'; detail: LoopDetail; ms?: number }

export type WorkerMessage = RunMessage | LoopDetailMessage;

export const isLoopDetailRequest = (r: WorkerRequest): r is LoopDetailRequest => r.kind === 'loopDetail';
export const isShownRequest = (r: WorkerRequest): r is ShownRequest => r.kind === 'shown';
export const isFeedbackRequest = (r: WorkerRequest): r is FeedbackRequest => r.kind === 'feedback';

/** Runs analysis requests somewhere (a Web Worker, or the same thread as a fallback). */
export interface AnalysisRunner {
  /** Start a run; a newer run supersedes older ones (their later stages may be skipped). */
  run(req: RunRequest): void;
  /** Ask for a loop's detail; a newer ask supersedes an older one not yet started. Runners
   *  without it (test doubles) make the store compute the detail on the same thread. */
  loopDetail?(req: LoopDetailRequest): void;
  /** Receive every message of every run and every loop detail (the store filters by run id). */
  onMessage(fn: (msg: WorkerMessage) => void): void;
  dispose(): void;
  /** 'worker' or 'same-thread' (a worker runner that fell back reports 'same-thread'). */
  readonly kind: 'worker' | 'same-thread';
}
