// Drawings for the live-store tests: the common-source stage of tests/schematic/build.ts with the
// transistor given directly by its small-signal values (gm, gds, capacitances).
import { commonSource } from '../schematic/build';
import type { DrawingDocument, PartId } from '../../src/schematic/document';
import type { AnalysisRunner, RunRequest, WorkerMessage } from '../../src/worker/protocol';

export const GDS = 20e-6;
export const GM = 1e-3;

export function csStage(r1 = '4.7k', cl = ''): DrawingDocument {
  const doc = commonSource();
  const m1 = doc.parts['part:m1' as PartId];
  m1.mode = 'direct';
  m1.params = { ...m1.params, gm: '1m', gmb: '0', gds: '20u', cgs: '100f', cgd: '10f', cdb: cl || '50f', csb: '' };
  doc.parts['part:r1' as PartId].params.value = r1;
  return doc;
}

export function withR1(doc: DrawingDocument, value: string): DrawingDocument {
  const next = structuredClone(doc);
  next.parts['part:r1' as PartId].params.value = value;
  return next;
}

/** Parallel combination (ohms). */
export const par = (a: number, b: number) => (a * b) / (a + b);

/** A runner of the worker kind whose answers the test delivers by hand. */
export function handRunner() {
  const requests: RunRequest[] = [];
  let deliver: (m: WorkerMessage) => void = () => {};
  const runner: AnalysisRunner = { kind: 'worker', run: (r) => { requests.push(r); }, onMessage: (fn) => { deliver = fn; }, dispose: () => {} };
  return { runner, requests, deliver: (m: WorkerMessage) => deliver(m) };
}
