// 1,000 seeded random edits (place, wire, delete, values including absurd ones, turn, undo, redo,
// move, paste, open broken files, stray input) through the editor and the live store. After every
// edit: no exception escaped, the editor state is valid, the drawing still converts to a netlist
// (or to named issues), and undo/redo land on exactly the document recorded at that depth. Every
// few edits the store runs the analysis (the worker's compute functions, same thread) and the
// overlay's labels are checked for NaN (common practice: fuzzing with fixed seeds).
import { isDeepStrictEqual } from 'node:util';
import { describe, expect, it } from 'vitest';
import { createEditor } from '../../src/editor/editor';
import type { DrawingDocument } from '../../src/schematic/document';
import { emptyDocument } from '../../src/schematic/document';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { EXAMPLE_DRAWINGS } from '../../src/examples/index';
import { createLiveStore } from '../../src/live/store';
import type { LiveStore } from '../../src/live/types';
import { applyEdit, chooseEdit, rng, type EditContext } from './randomEdits';
import { checkEditor, checkLive, nonFinitePaths, syncRunner } from './appChecks';

/** Seeds and edits per seed: 4 × 250 = 1,000 edits. */
const RUNS = [
  { seed: 11, start: () => EXAMPLE_DRAWINGS[0].load() },
  { seed: 23, start: () => EXAMPLE_DRAWINGS[3].load() },
  { seed: 37, start: () => EXAMPLE_DRAWINGS[4].load() },
  { seed: 41, start: () => emptyDocument('fuzz') },
];
const EDITS_PER_RUN = 250;
/** The analysis runs every ANALYZE_EVERY edits; the feedback stage every FEEDBACK_EVERY-th run. */
const ANALYZE_EVERY = 4;
const FEEDBACK_EVERY = 8;
/** Save → open round trip of the drawing every ROUND_TRIP_EVERY edits (and after every open). */
const ROUND_TRIP_EVERY = 3;

const clone = (d: DrawingDocument) => structuredClone(d);

const FREQUENCIES = [0, 1, 1e3, 1e6, 1e9, 1e12, -5, NaN, Infinity, 1e308, 5e-324];

/** A random change of the live settings: frequency, colour mode, a loop selected or switched. */
function changeSettings(store: LiveStore, r: () => number): string {
  const st = store.getState();
  const loops = Object.keys(st.loops);
  const u = r();
  if (u < 0.4) {
    const f = FREQUENCIES[Math.floor(r() * FREQUENCIES.length)];
    store.actions.setFrequency(f);
    return `frequency ${f}`;
  }
  if (u < 0.55) { store.actions.setColorMode(r() < 0.5 ? 'timeConstant' : 'impedance'); return 'colour mode'; }
  const id = loops.length && r() < 0.8 ? loops[Math.floor(r() * loops.length)] : 'no-such-loop';
  if (u < 0.75) { store.actions.selectLoop(id); return `select loop ${id}`; }
  store.actions.toggleLoop(id);
  return `toggle loop ${id}`;
}

function fuzzRun(seed: number, start: DrawingDocument) {
  const editor = createEditor(start);
  let runs = 0;
  const store = createLiveStore({ runner: syncRunner(() => ++runs % FEEDBACK_EVERY === 0), throttleMs: 0 });
  const c: EditContext = { editor, r: rng(seed), refused: null };
  // snapshots[d] = the document when the undo stack was d deep, recorded as each entry is made
  const snapshots: DrawingDocument[] = [clone(editor.document)];
  const history = editor.history;
  let replaying = false;
  let lastDepth = 0, lastDoc = editor.document;
  const historyFaults: string[] = [];
  // Undo and redo are marked while they run, so the listener knows a replay from a new entry.
  for (const name of ['undo', 'redo'] as const) {
    const original = history[name].bind(history);
    history[name] = () => { replaying = true; try { return original(); } finally { replaying = false; } };
  }
  history.subscribe(() => {
    if (history.inGesture) return;
    const d = history.size.undo;
    if (replaying) {
      // Undo / redo must give back exactly the document recorded at this depth.
      if (!isDeepStrictEqual(history.doc, snapshots[d])) historyFaults.push(`undo/redo to depth ${d} gave a different document`);
      undoChecks++;
    } else if (d === lastDepth + 1) { snapshots.length = d; snapshots.push(clone(history.doc)); }
    else if (d === lastDepth && history.doc !== lastDoc) historyFaults.push('the drawing changed without an undo entry');
    else if (d !== lastDepth) historyFaults.push(`undo depth jumped from ${lastDepth} to ${d} outside undo/redo`);
    lastDepth = d;
    lastDoc = history.doc;
  });
  let undoChecks = 0;
  const stats = { analysed: 0, ok: 0, refusedFiles: 0, kinds: {} as Record<string, number> };
  for (let step = 0; step < EDITS_PER_RUN; step++) {
    const kind = chooseEdit(c.r);
    stats.kinds[kind] = (stats.kinds[kind] ?? 0) + 1;
    const before = editor.document;
    let what = kind as string;
    const where = () => `seed ${seed}, edit ${step} (${what})`;
    try {
      what = applyEdit(kind, c);
    } catch (e) {
      throw new Error(`${where()}: exception escaped: ${(e as Error).stack}`);
    }
    expect(checkEditor(editor, { roundTrip: step % ROUND_TRIP_EVERY === 0 || kind === 'open' }), where()).toEqual([]);
    expect(historyFaults, where()).toEqual([]);
    if (kind === 'undo' || kind === 'redo') expect(editor.document, where()).toStrictEqual(snapshots[history.size.undo]);
    if (kind === 'open' && c.refused !== null) {
      stats.refusedFiles++;
      expect(editor.document, `${where()}: a refused file must leave the drawing as it was`).toBe(before);
      expect(c.refused.length, where()).toBeGreaterThan(15);
    }
    let converted;
    try {
      converted = documentToNetlist(editor.document);
    } catch (e) {
      throw new Error(`${where()}: documentToNetlist threw: ${(e as Error).stack}`);
    }
    expect(nonFinitePaths(converted.netlist ?? {}), where()).toEqual([]);
    if (!converted.netlist) expect(converted.issues.some((i) => i.severity === 'error'), `${where()}: no netlist and no error named`).toBe(true);
    if (step % ANALYZE_EVERY === ANALYZE_EVERY - 1) {
      store.actions.submit(editor.document);
      expect(checkLive(store.getState()), where()).toEqual([]);
      // Now and then the overlay settings change too, absurd frequencies included.
      if (c.r() < 0.15) what = `${what}; ${changeSettings(store, c.r)}`;
      const st = store.getState();
      expect(checkLive(st), where()).toEqual([]);
      if (st.netlist) stats.analysed++;
      if (st.result?.ok) stats.ok++;
    }
  }
  // Walk the whole history back to the start and forward again, checking every depth.
  const top = editor.history.size.undo;
  for (let d = top - 1; d >= 0; d--) {
    editor.dispatch({ type: 'key', key: 'z', ctrl: true });
    expect(editor.document, `seed ${seed}: undo to depth ${d}`).toStrictEqual(snapshots[d]);
  }
  expect(editor.history.canUndo).toBe(false);
  for (let d = 1; d <= top; d++) {
    editor.dispatch({ type: 'key', key: 'y', ctrl: true });
    expect(editor.document, `seed ${seed}: redo to depth ${d}`).toStrictEqual(snapshots[d]);
  }
  store.actions.dispose();
  return { ...stats, undoChecks, depth: top };
}

describe('1,000 random edits through the editor and the live store', () => {
  const totals = { edits: 0, analysed: 0, computed: 0, refused: 0 };
  for (const { seed, start } of RUNS) {
    it(`seed ${seed}: ${EDITS_PER_RUN} edits keep the app valid and undo exact`, () => {
      const s = fuzzRun(seed, start());
      totals.edits += EDITS_PER_RUN;
      totals.analysed += s.analysed;
      totals.computed += s.ok;
      totals.refused += s.refusedFiles;
      console.log(`seed ${seed}: undo depth ${s.depth}, ${s.undoChecks} undo/redo checks, ${s.refusedFiles} files refused, ` +
        `${s.analysed} netlists analysed (${s.ok} computed); edits ${JSON.stringify(s.kinds)}`);
      // The run must have exercised what it claims to: undo checks, refusals and analyses.
      expect(s.undoChecks).toBeGreaterThan(10);
      expect(s.depth).toBeGreaterThan(20);
    });
  }
  it('the runs together analysed working circuits and refused broken files', () => {
    // Guards the fuzz itself: edits that never reach the engine or the file check prove little.
    expect(totals.edits).toBe(1000);
    expect(totals.computed).toBeGreaterThan(20);
    expect(totals.refused).toBeGreaterThan(5);
  });
});
