// The worker scheduler: its hold after stage 1 (the later stages wait for the page's 'shown', or a
// time limit), its idle warm-up calls and the stage-2-only request of the loops worker. These
// check the scheduler's own contract (message order, what runs when); the figures themselves are
// checked in store.test.ts.
import { describe, expect, test } from 'vitest';
import { createScheduler, HOLD_MAX_MS } from '../../src/worker/scheduler';
import type { RunRequest, WorkerMessage } from '../../src/worker/protocol';
import { knownOf } from '../../src/worker/compute';
import { analyzeStaged } from '../../src/engine/index';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { csStage, withR1 } from './fixtures';

const netlistOf = (r1: string) => documentToNetlist(withR1(csStage(), r1)).netlist!;
const req = (runId: number, r1: string, hold = true): RunRequest => ({ runId, netlist: netlistOf(r1), frequencyHz: 0, offSources: [], offLoops: [], holdAfterStage1: hold });
const summary = (posted: WorkerMessage[]) => posted.map((p) => (p.stage === 'loopDetail' ? 'detail' : `${p.runId}:${p.stage}`));

/** A scheduler with hand-driven steps and hold timer. */
function driven(warmCalls = 0) {
  const posted: WorkerMessage[] = [];
  const steps: (() => void)[] = [];
  const timers: { fn: () => void; ms: number; cleared: boolean }[] = [];
  const sch = createScheduler((m) => posted.push(m), (fn) => steps.push(fn), {
    warmCalls,
    later: (fn, ms) => { const t = { fn, ms, cleared: false }; timers.push(t); return t; },
    cancel: (t) => { (t as { cleared: boolean }).cleared = true; },
  });
  const drain = () => { let n = 0; while (steps.length) { steps.shift()!(); n += 1; } return n; };
  return { sch, posted, steps, timers, drain };
}

describe('worker scheduler: hold after stage 1', () => {
  test('the later stages wait for the page to have shown stage 1', () => {
    const d = driven();
    d.sch.push(req(1, '4.7k'));
    d.drain();
    expect(summary(d.posted)).toEqual(['1:1']);
    expect(d.timers).toHaveLength(1);
    expect(d.timers[0].ms).toBe(HOLD_MAX_MS);
    d.sch.push({ kind: 'shown', runId: 2 }); // another run's: ignored
    d.drain();
    expect(summary(d.posted)).toEqual(['1:1']);
    d.sch.push({ kind: 'shown', runId: 1 });
    d.drain();
    expect(summary(d.posted)).toEqual(['1:1', '1:complete', '1:2']);
    expect(d.timers[0].cleared).toBe(true);
  });

  test('without word from the page they start when the hold time is up', () => {
    const d = driven();
    d.sch.push(req(1, '4.7k'));
    d.drain();
    expect(summary(d.posted)).toEqual(['1:1']);
    d.timers[0].fn();
    d.drain();
    expect(summary(d.posted)).toEqual(['1:1', '1:complete', '1:2']);
  });

  test('a new run during the hold drops the held one; a run that does not ask is not held', () => {
    const d = driven();
    d.sch.push(req(1, '4.7k'));
    d.drain();
    d.sch.push(req(2, '10k', false));
    d.drain();
    expect(summary(d.posted)).toEqual(['1:1', '1:dropped', '2:1', '2:complete', '2:2']);
    expect(d.timers[0].cleared).toBe(true);
    d.timers[0].fn(); // a stale timer wakes nothing
    expect(d.drain()).toBe(0);
  });
});

/** Tasks the complete result takes (completeSteps: zeros; sweep; vectors and participation;
 *  impedance sweep). */
const COMPLETE_STEPS = 4;

describe('worker scheduler: the complete result in steps', () => {
  test('a run arriving while the complete result is worked out is taken after one step', () => {
    const d = driven();
    d.sch.push(req(1, '4.7k', false));
    d.steps.shift()!(); // stage 1
    d.steps.shift()!(); // first step of the complete result
    d.sch.push(req(2, '10k', false));
    d.steps.shift()!();
    expect(summary(d.posted)).toEqual(['1:1', '1:dropped', '2:1']);
  });

  test('stepwise, the complete result is the one analyzeStaged gives at once', () => {
    const d = driven();
    d.sch.push({ ...req(1, '4.7k', false), feedback: false });
    expect(d.drain()).toBe(1 + COMPLETE_STEPS + 1);
    const posted = d.posted[1] as Extract<WorkerMessage, { stage: 'complete' }>;
    const direct = analyzeStaged(req(1, '4.7k').netlist, { frequencyHz: 0, impedanceSweep: true }).complete();
    expect(JSON.stringify(posted.result)).toBe(JSON.stringify(direct)); // common practice: same bytes
  });
});

describe('worker scheduler: idle warm-up', () => {
  test('after a run, the idle scheduler repeats its stage 1 warmCalls times without posting', () => {
    const d = driven(3);
    d.sch.push(req(1, '4.7k', false));
    const steps = d.drain();
    // stage 1, complete (COMPLETE_STEPS tasks), stage 2, three warm-up calls, then the step that
    // finds nothing to do
    expect(steps).toBe(1 + COMPLETE_STEPS + 1 + 3 + 1);
    expect(summary(d.posted)).toEqual(['1:1', '1:complete', '1:2']);
    d.sch.push(req(2, '10k', false));
    expect(d.drain()).toBe(1 + COMPLETE_STEPS + 1 + 1); // no warm-up calls left
  });

  test('a request that arrives during the warm-up is served at the next step', () => {
    const d = driven(5);
    d.sch.push(req(1, '4.7k', false));
    for (let i = 0; i < COMPLETE_STEPS + 3; i++) d.steps.shift()!(); // stage 1, complete, stage 2, one warm-up call
    d.sch.push(req(2, '10k', false));
    d.steps.shift()!();
    expect(summary(d.posted)).toEqual(['1:1', '1:complete', '1:2', '2:1']);
  });
});

describe('worker scheduler: the two-worker split', () => {
  test('a run without feedback ends at its complete result; a feedback request gives the same stage 2 as one worker', () => {
    const one = driven();
    one.sch.push(req(1, '4.7k', false));
    one.drain();
    const split = driven();
    split.sch.push({ ...req(1, '4.7k', false), feedback: false });
    split.drain();
    expect(summary(split.posted)).toEqual(['1:1', '1:complete']);
    const complete = split.posted[1] as Extract<WorkerMessage, { stage: 'complete' }>;
    const loops = driven();
    loops.sch.push({ kind: 'feedback', run: req(1, '4.7k', false), known: knownOf(complete.result) });
    loops.drain();
    expect(summary(loops.posted)).toEqual(['1:2']);
    const strip = (m: WorkerMessage) => JSON.stringify({ ...m, ms: undefined });
    expect(strip(loops.posted[0])).toBe(strip(one.posted[2])); // byte for byte (common practice)
  });

  test('a newer feedback request supersedes one not yet started', () => {
    const d = driven();
    d.sch.push({ kind: 'feedback', run: req(1, '4.7k', false) });
    d.sch.push({ kind: 'feedback', run: req(2, '10k', false) });
    d.drain();
    expect(summary(d.posted)).toEqual(['2:2']);
  });
});
