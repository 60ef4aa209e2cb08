// The edit gate (src/live/editGate.ts): a committed edit reaches the store at once, and the page
// hears of it when the run's stage 1 arrives, or after the hold time, whichever is first. Drags,
// same-thread runs and changes that start no run are passed on at once. Answers are delivered
// by hand (handRunner), timers are the test's own. Common practice (behaviour of our own design).
import { describe, expect, it } from 'vitest';
import { createLiveStore } from '../../src/live/index';
import { gatedEditorSubscribe } from '../../src/live/editGate';
import { runOverlayStage } from '../../src/worker/compute';
import { createSameThreadRunner } from '../../src/worker/runner';
import type { DrawingDocument } from '../../src/schematic/document';
import { csStage, handRunner, withR1 } from './fixtures';

function fakeEditor(doc: DrawingDocument) {
  const listeners = new Set<() => void>();
  const ed = {
    document: doc,
    state: { mode: 'select.idle' } as { mode: string },
    subscribe(fn: () => void) { listeners.add(fn); return () => { listeners.delete(fn); }; },
    change(next: DrawingDocument, mode = 'select.idle') { ed.document = next; ed.state.mode = mode; for (const fn of [...listeners]) fn(); },
  };
  return ed;
}

function manualTimers() {
  const pending = new Map<number, () => void>();
  let seq = 0;
  return {
    later: (fn: () => void) => { pending.set(++seq, fn); return seq; },
    cancel: (t: unknown) => { pending.delete(t as number); },
    fire() { const all = [...pending.values()]; pending.clear(); for (const fn of all) fn(); },
    get count() { return pending.size; },
  };
}

function setup(runner = handRunner()) {
  const store = createLiveStore({ runner: runner.runner });
  const first = csStage('4.7k');
  const ed = fakeEditor(first);
  store.actions.submit(first);
  const timers = manualTimers();
  let heard = 0;
  const off = gatedEditorSubscribe(ed as never, store, { later: timers.later, cancel: timers.cancel })(() => { heard += 1; });
  return { store, ed, timers, runner, heard: () => heard, off, first };
}

describe('edit gate', () => {
  it('a committed edit goes to the store at once and reaches the page with its stage 1', () => {
    const s = setup();
    const next = withR1(s.first, '10k');
    s.ed.change(next);
    expect(s.store.getState().doc).toBe(next); // submitted before the page heard of it
    expect(s.runner.requests.length).toBe(2);
    expect(s.heard()).toBe(0); // held
    const req = s.runner.requests[1];
    s.runner.deliver({ runId: req.runId, stage: 1, result: runOverlayStage(req).first, ms: 1 });
    expect(s.heard()).toBe(1);
    expect(s.timers.count).toBe(0); // the hold timer is gone
  });

  it('without an answer the page hears of the edit when the hold time is up', () => {
    const s = setup();
    s.ed.change(withR1(s.first, '10k'));
    expect(s.heard()).toBe(0);
    s.timers.fire();
    expect(s.heard()).toBe(1);
    // a later stage-1 answer changes nothing on the gate's side
    const req = s.runner.requests[1];
    s.runner.deliver({ runId: req.runId, stage: 1, result: runOverlayStage(req).first, ms: 1 });
    expect(s.heard()).toBe(1);
  });

  it('a newer edit during a hold waits for its own run, within the same deadline, and is heard once', () => {
    const s = setup();
    s.ed.change(withR1(s.first, '10k'));
    s.ed.change(withR1(s.first, '12k'));
    expect(s.heard()).toBe(0);
    expect(s.timers.count).toBe(1); // one deadline for both
    const [, stale, fresh] = s.runner.requests;
    s.runner.deliver({ runId: stale.runId, stage: 1, result: runOverlayStage(stale).first, ms: 1 });
    expect(s.heard()).toBe(0); // the stale run's answer is dropped by the store
    s.runner.deliver({ runId: fresh.runId, stage: 1, result: runOverlayStage(fresh).first, ms: 1 });
    expect(s.heard()).toBe(1);
  });

  it('drags and changes that start no run are passed on at once', () => {
    const s = setup();
    s.ed.change(withR1(s.first, '10k'), 'select.moving');
    expect(s.heard()).toBe(1);
    const same = s.ed.document;
    s.ed.change(same); // selection or camera: same drawing
    expect(s.heard()).toBe(2);
  });

  it('a same-thread runner answers inside the submit: nothing is held', () => {
    const r = createSameThreadRunner();
    const store = createLiveStore({ runner: r });
    const first = csStage('4.7k');
    const ed = fakeEditor(first);
    let heard = 0;
    gatedEditorSubscribe(ed as never, store)(() => { heard += 1; });
    ed.change(withR1(first, '10k'));
    expect(heard).toBe(1);
    store.actions.dispose();
  });
});
