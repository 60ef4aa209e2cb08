// Messages between the live store and the analysis worker. A run answers in two stages: the basic
// analysis first (poles, node table), then the feedback analysis (several times slower). Every
// message carries the run id of its request, so the receiver can drop answers of stale runs.
import type { AnalysisResult, Netlist } from '../engine/index';
import type { BlackmanResult, FeedbackResult } from '../engine/feedback/index';

export interface RunRequest {
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
}

export type RunMessage =
  | { runId: number; stage: 1; result: AnalysisResult }
  | { runId: number; stage: 2; feedback: FeedbackResult; blackman: Record<string, BlackmanResult> }
  /** The run was superseded before it finished (no more messages for it). */
  | { runId: number; stage: 'dropped' }
  /** The worker itself failed (not a circuit error: those come as result issues). */
  | { runId: number; stage: 'failed'; message: string };

/** Runs analysis requests somewhere (a Web Worker, or the same thread as a fallback). */
export interface AnalysisRunner {
  /** Start a run; a newer run supersedes older ones (their later stages may be skipped). */
  run(req: RunRequest): void;
  /** Receive every message of every run (the store filters by run id). */
  onMessage(fn: (msg: RunMessage) => void): void;
  dispose(): void;
  /** 'worker' or 'same-thread' (a worker runner that fell back reports 'same-thread'). */
  readonly kind: 'worker' | 'same-thread';
}
