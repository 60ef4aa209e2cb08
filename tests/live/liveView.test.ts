// The overlay's derived data (src/live/liveView.ts): shared by the Konva layer and the HTML marks,
// memoised on what annotate() reads. Checks of its own contract (common practice for a memo: the
// same inputs give the same object, a changed input a new one with the new figures), with the
// output impedance checked against the hand formula.
import { produce } from 'immer';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/engine/index';
import { liveView } from '../../src/live/liveView';
import { DEFAULT_SETTINGS, type LiveState } from '../../src/live/types';
import { documentToNetlist, geometryKey } from '../../src/schematic/toNetlist';
import type { DrawingDocument, PartId } from '../../src/schematic/document';
import { csStage, GDS, par } from './fixtures';

function stateOf(doc: DrawingDocument, withResult: DrawingDocument = doc): LiveState {
  const drawing = documentToNetlist(doc);
  const result = analyze(documentToNetlist(withResult).netlist!, { frequencyHz: 0 });
  return {
    runId: 1, status: 'idle', stage: 1, feedbackPending: false, result, feedback: null, blackman: {}, loopDetail: null,
    issues: [], doc, drawing, netlist: drawing.netlist ?? null, settings: { ...DEFAULT_SETTINGS }, loops: {}, pinnedA: null, failure: null, runner: 'same-thread',
  };
}

const freezeDoc = (d: DrawingDocument) => produce(d, () => {});

describe('live overlay view', () => {
  it('a value edit waiting for its result keeps the annotations; its result brings the new figures', () => {
    const doc = freezeDoc(csStage('4.7k'));
    const edited = produce(doc, (d) => { d.parts['part:r1' as PartId].params.value = '10k'; });
    expect(geometryKey(edited)).toBe(geometryKey(doc));
    const shown = stateOf(doc);
    const before = liveView(shown);
    // the store has the edited drawing, the result shown is still the one of the drawing before
    const waiting = liveView({ ...shown, doc: edited, drawing: documentToNetlist(edited) });
    expect(waiting.ann).toBe(before.ann);
    expect(waiting.netOfWire).toBe(before.netOfWire);
    const arrived = liveView(stateOf(edited));
    expect(arrived.ann).not.toBe(before.ann);
    // |Z(out)| at DC = R1 ∥ ro (Gray & Meyer, R_D ∥ r_o), before and after the edit
    expect(before.ann!.nets.out.ohms).toBeCloseTo(par(4700, 1 / GDS), 6);
    expect(arrived.ann!.nets.out.ohms).toBeCloseTo(par(10e3, 1 / GDS), 6);
  });

  it('a moved part (new geometry) gets new annotations at once, with the old figures', () => {
    const doc = freezeDoc(csStage('4.7k'));
    const moved = produce(doc, (d) => { d.parts['part:r1' as PartId].x += 40; });
    expect(geometryKey(moved)).not.toBe(geometryKey(doc));
    const shown = stateOf(doc);
    const before = liveView(shown);
    const after = liveView({ ...shown, doc: moved, drawing: documentToNetlist(moved) });
    expect(after.ann).not.toBe(before.ann);
    expect(after.ann!.nets.out.ohms).toBe(before.ann!.nets.out.ohms);
  });

  it('the lit nets follow the hovered and selected net', () => {
    const s = stateOf(freezeDoc(csStage('4.7k')));
    expect([...liveView(s).lit]).toEqual([]);
    const lit = liveView({ ...s, settings: { ...s.settings, hoveredNet: 'out', selectedNet: 'in' } }).lit;
    expect([...lit].sort()).toEqual(['in', 'out']);
  });
});
