// The live analysis store: two-stage results, stale-run dropping, throttled drags, placed errors.
import { afterEach, describe, expect, test, vi } from 'vitest';
import { createLiveStore } from '../../src/live/store';
import { createSameThreadRunner } from '../../src/worker/runner';
import { createScheduler } from '../../src/worker/scheduler';
import type { AnalysisRunner, RunMessage, RunRequest, WorkerMessage } from '../../src/worker/protocol';
import { runStage1 } from '../../src/worker/compute';
import type { LiveState } from '../../src/live/types';
import type { PartId } from '../../src/schematic/document';
import { csStage, GDS, par, withR1 } from './fixtures';

/** A runner the test drives by hand: it records requests and delivers chosen messages. */
function manualRunner() {
  const requests: RunRequest[] = [];
  let listener: (m: RunMessage) => void = () => {};
  const runner: AnalysisRunner = {
    kind: 'same-thread',
    run: (r) => { requests.push(r); },
    onMessage: (fn) => { listener = fn; },
    dispose: () => {},
  };
  return { runner, requests, deliver: (m: RunMessage) => listener(m) };
}

function until(store: ReturnType<typeof createLiveStore>, ok: (s: LiveState) => boolean, ms = 20000): Promise<LiveState> {
  return new Promise((resolve, reject) => {
    if (ok(store.getState())) return resolve(store.getState());
    const t = setTimeout(() => { off(); reject(new Error('timed out waiting for the store')); }, ms);
    const off = store.subscribe(() => {
      if (ok(store.getState())) { clearTimeout(t); off(); resolve(store.getState()); }
    });
  });
}

const zOut = (s: LiveState) => s.result?.nodes.find((n) => n.name === 'out')?.dcOhms ?? null;

afterEach(() => { vi.useRealTimers(); });

describe('live store with the same-thread runner', () => {
  test('stage 1 then stage 2; the output impedance is R1 ∥ 1/gds', async () => {
    const store = createLiveStore({ runner: createSameThreadRunner() });
    store.actions.submit(csStage('4.7k'));
    expect(store.getState().status).toBe('busy');
    const s1 = await until(store, (s) => s.stage >= 1);
    expect(s1.result?.ok).toBe(true);
    const s2 = await until(store, (s) => s.stage === 2);
    expect(s2.status).toBe('idle');
    expect(s2.feedback).not.toBeNull();
    // Gray & Meyer, common-source output resistance: R_D ∥ r_o with r_o = 1/gds
    expect(zOut(s2)).toBeCloseTo(par(4700, 1 / GDS), 6);
    store.actions.dispose();
  });

  test('a changed value gives the new impedance, and the earlier run is dropped', async () => {
    const store = createLiveStore({ runner: createSameThreadRunner() });
    const seen: (number | null)[] = [];
    store.subscribe(() => seen.push(zOut(store.getState())));
    store.actions.submit(csStage('4.7k'));
    store.actions.submit(withR1(csStage('4.7k'), '10k')); // before the first run could start
    const s = await until(store, (x) => x.stage === 2);
    // Gray & Meyer, R_D ∥ r_o
    expect(zOut(s)).toBeCloseTo(par(10000, 1 / GDS), 6);
    // the 4.7 kΩ run never reached the state
    expect(seen.some((z) => z !== null && Math.abs(z - par(4700, 1 / GDS)) < 1)).toBe(false);
    store.actions.dispose();
  });

  test('a drawing error sets status error with the message at its place and no result', () => {
    const store = createLiveStore({ runner: manualRunner().runner });
    const doc = csStage();
    delete doc.parts['part:gnd1' as PartId]; // M1's source pin left unconnected
    store.actions.submit(doc);
    const s = store.getState();
    expect(s.status).toBe('error');
    expect(s.result).toBeNull();
    const placed = s.issues.filter((i) => i.severity === 'error' && i.x !== null);
    expect(placed.length).toBeGreaterThan(0);
    expect(placed[0].message.length).toBeGreaterThan(5);
  });
});

describe('stale runs', () => {
  test('messages of an older run id are ignored', () => {
    const m = manualRunner();
    const store = createLiveStore({ runner: m.runner });
    store.actions.submit(csStage('4.7k'));
    store.actions.submit(withR1(csStage(), '10k'));
    expect(m.requests.map((r) => r.runId)).toEqual([1, 2]);
    m.deliver({ runId: 1, stage: 1, result: runStage1(m.requests[0]) });
    expect(store.getState().result).toBeNull();
    m.deliver({ runId: 2, stage: 1, result: runStage1(m.requests[1]) });
    // Gray & Meyer, R_D ∥ r_o
    expect(zOut(store.getState())).toBeCloseTo(par(10000, 1 / GDS), 6);
  });

  test('the scheduler skips a superseded request and the later stages of a superseded run', () => {
    const posted: WorkerMessage[] = [];
    const queue: (() => void)[] = [];
    const sch = createScheduler((msg) => posted.push(msg), (fn) => queue.push(fn));
    const req = (runId: number, r1: string): RunRequest => ({ runId, netlist: netlistOf(r1), frequencyHz: 0, offSources: [], offLoops: [] });
    sch.push(req(1, '4.7k'));
    sch.push(req(2, '10k')); // supersedes 1 before it started
    queue.shift()!(); // stage 1 of run 2
    sch.push(req(3, '22k')); // arrives between the stages of run 2
    while (queue.length) queue.shift()!();
    const summary = posted.map((p) => (p.stage === 'loopDetail' ? 'detail' : `${p.runId}:${p.stage}`));
    expect(summary).toEqual(['1:dropped', '2:1', '2:dropped', '3:1', '3:complete', '3:2']);
  });

  test('stage 1 is the overlay data; the complete result that follows equals analyze() and adds the sweeps', () => {
    const posted: WorkerMessage[] = [];
    const queue: (() => void)[] = [];
    const sch = createScheduler((msg) => posted.push(msg), (fn) => queue.push(fn));
    const request: RunRequest = { runId: 1, netlist: netlistOf('4.7k'), frequencyHz: 0, offSources: [], offLoops: [], feedback: false };
    sch.push(request);
    while (queue.length) queue.shift()!();
    const s1 = posted.find((p) => p.stage === 1), done = posted.find((p) => p.stage === 'complete');
    if (s1?.stage !== 1 || done?.stage !== 'complete') throw new Error('stage 1 and the complete result were expected');
    expect(posted.map((p) => (p.stage === 'loopDetail' ? 'detail' : `${p.runId}:${p.stage}`))).toEqual(['1:1', '1:complete']);
    expect(s1.result.impedanceSweep).toBeNull();
    // the overlay's figure: |Z(out)| at DC = R1 ∥ ro (Gray & Meyer, R_D ∥ r_o)
    expect(s1.result.nodes.find((n) => n.name === 'out')!.dcOhms).toBeCloseTo(par(4700, 1 / GDS), 6);
    const whole = runStage1(request);
    expect(done.result.nodes).toEqual(s1.result.nodes);
    expect(done.result.poles).toEqual(whole.poles);
    expect(done.result.zeros).toEqual(whole.zeros);
    expect(done.result.impedanceSweep).toEqual(whole.impedanceSweep);
    expect(done.result.impedanceSweep!.nodes).toContain('out');
  });

  test('loop-detail requests run after the stages of the current run, newest only', () => {
    const posted: WorkerMessage[] = [];
    const queue: (() => void)[] = [];
    const sch = createScheduler((msg) => posted.push(msg), (fn) => queue.push(fn));
    const netlist = netlistOf('4.7k');
    const detail = (id: number) => ({ kind: 'loopDetail' as const, id, netlist, key: 'M1.gm', offSources: [], fMin: 1e3, fMax: 1e9, perDecade: 5, part: 'gain' as const });
    sch.push({ runId: 1, netlist, frequencyHz: 0, offSources: [], offLoops: [] });
    sch.push(detail(1));
    sch.push(detail(2)); // supersedes 1 before it started
    while (queue.length) queue.shift()!();
    const summary = posted.map((p) => (p.stage === 'loopDetail' ? `detail:${p.detail.id}` : `${p.runId}:${p.stage}`));
    expect(summary).toEqual(['1:1', '1:complete', '1:2', 'detail:2']);
    const d = posted.at(-1)!;
    if (d.stage !== 'loopDetail') throw new Error('loop detail expected');
    expect(d.detail.values.length).toBe(d.detail.hz.length);
    expect(d.detail.hz.length).toBeGreaterThan(20);
  });

  test('the store keeps only the answer to its newest loop-detail ask, also with a runner without details', async () => {
    const m = manualRunner();
    const store = createLiveStore({ runner: m.runner });
    const netlist = netlistOf('4.7k');
    const ask = { netlist, key: 'M1.gm', offSources: [], fMin: 1e3, fMax: 1e9, perDecade: 5, part: 'gain' as const };
    store.actions.askLoopDetail(ask);
    const id = store.actions.askLoopDetail({ ...ask, key: 'M9.gm' });
    const s = await until(store, (x) => x.loopDetail !== null);
    expect(s.loopDetail!.id).toBe(id);
    expect(s.loopDetail!.message).toMatch(/M9\.gm/); // the unknown source is named
  });
});

describe('throttling', () => {
  test('a drag runs at the leading and trailing edge only; a committed edit runs at once', () => {
    vi.useFakeTimers();
    const m = manualRunner();
    const store = createLiveStore({ runner: m.runner, throttleMs: 50 });
    const values = ['1k', '2k', '3k', '4k', '5k', '6k'];
    for (const v of values) { store.actions.submit(withR1(csStage(), v), { drag: true }); vi.advanceTimersByTime(5); }
    expect(m.requests.length).toBe(1);
    vi.advanceTimersByTime(50);
    expect(m.requests.length).toBe(2);
    const r1Of = (r: RunRequest) => r.netlist.parts.find((p) => p.name === 'R1')!.values.value;
    expect(m.requests.map(r1Of)).toEqual([1000, 6000]);
    store.actions.submit(withR1(csStage(), '7k'));
    expect(m.requests.length).toBe(3);
    expect(r1Of(m.requests[2])).toBe(7000);
  });

  test('an edit that leaves the circuit unchanged (notes) does not re-run', () => {
    const m = manualRunner();
    const store = createLiveStore({ runner: m.runner });
    const doc = csStage();
    store.actions.submit(doc);
    m.deliver({ runId: 1, stage: 1, result: runStage1(m.requests[0]) });
    const moved = structuredClone(doc);
    moved.notes = 'not analysed'; // same netlist text
    store.actions.submit(moved);
    expect(m.requests.length).toBe(1);
    expect(store.getState().doc).toBe(moved);
  });

  test('frequency and loop switches re-run with the new settings', () => {
    const m = manualRunner();
    const store = createLiveStore({ runner: m.runner });
    store.actions.submit(csStage());
    store.actions.setFrequency(1e6);
    expect(m.requests.at(-1)!.frequencyHz).toBe(1e6);
    store.actions.setLoopEnabled('M1.gm>R1', false);
    expect(m.requests.at(-1)!.offLoops).toEqual(['M1.gm>R1']);
    store.actions.toggleLoop('M1.gm>R1');
    expect(m.requests.at(-1)!.offLoops).toEqual([]);
    store.actions.setColorMode('timeConstant'); // display only: no run
    expect(m.requests.length).toBe(4);
  });
});

function netlistOf(r1: string) {
  const m = manualRunner();
  const store = createLiveStore({ runner: m.runner });
  store.actions.submit(withR1(csStage(), r1));
  return m.requests[0].netlist;
}
