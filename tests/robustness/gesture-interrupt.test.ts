// Regression tests for a defect the edit fuzz found: undo / redo during a pointer gesture dropped
// the gesture's data but left its mode, so the next pointer event threw inside the editor.
// Expected behaviour (common practice for editors): the key ends the gesture, the drawing goes
// back to its state before the gesture, and the pointer works as before.
import { describe, expect, it } from 'vitest';
import { createEditor } from '../../src/editor/editor';
import { drive } from '../../src/editor/driver';
import { drawing, part } from '../schematic/build';

const twoResistors = () => drawing([part('resistor', 'R1', 0, 0), part('resistor', 'R2', 100, 0)]);

describe('a gesture cut short by undo or redo', () => {
  it('undo while a wire is being dragged out of a pin ends the wire; the next click works', () => {
    const e = createEditor(twoResistors());
    const d = drive(e).key('1').click(200, 200).key('Escape'); // one undo entry to go back over
    const withR3 = e.document;
    // R1.n is at (0, 30): a drag from it in the select tool draws a wire
    d.move(0, 30).down(0, 30).move(0, 60).up(0, 60).expectState('wire.drawing');
    d.key('z', { ctrl: true }).expectState('select.idle');
    expect(e.state.wirePreview).toBeNull();
    expect(e.document).not.toBe(withR3); // the placement was undone
    expect(Object.keys(e.document.parts).sort()).toEqual(['part:r1', 'part:r2']);
    expect(() => d.click(50, 50).move(60, 60)).not.toThrow();
    expect(Object.keys(e.document.wires)).toEqual([]);
  });

  it('undo between press and drag ends the press; a key during a move is ignored until release', () => {
    const e = createEditor(twoResistors());
    const d = drive(e).key('1').click(300, 300).key('Escape');
    d.move(0, 0).down(0, 0).expectState('select.pointing');
    d.key('z', { ctrl: true }).expectState('select.idle');
    expect(Object.keys(e.document.parts)).toHaveLength(2);
    expect(() => d.move(40, 0).move(80, 40).up(80, 40)).not.toThrow();
    expect(e.document.parts['part:r1']).toMatchObject({ x: 0, y: 0 });
    // while a move is under way undo is not offered (commands.ts: enabled only when canUndo)
    d.click(0, 0).move(0, 0).down(0, 0).move(40, 0).move(80, 40).expectState('select.moving');
    expect(e.dispatch({ type: 'key', key: 'z', ctrl: true })).toBe(false);
    d.up(80, 40).expectState('select.idle');
    expect(e.document.parts['part:r1']).toMatchObject({ x: 80, y: 40 });
    d.key('z', { ctrl: true });
    expect(e.document.parts['part:r1']).toMatchObject({ x: 0, y: 0 });
  });

  it('redo during a rubber-band box and during a pan leaves a usable editor', () => {
    const e = createEditor(twoResistors());
    const d = drive(e).key('1').click(300, 300).key('Escape').key('z', { ctrl: true });
    d.move(-50, -50).down(-50, -50).move(150, 60).expectState('select.boxing');
    d.key('y', { ctrl: true }).expectState('select.idle');
    expect(e.state.box).toBeNull();
    expect(Object.keys(e.document.parts)).toHaveLength(3);
    // wire drawing, then a middle-button pan, then undo, then the pan ends: back to wire.idle
    d.key('c').click(0, 30).expectState('wire.drawing');
    d.down(10, 10, { button: 1 }).expectState('pan.dragging');
    d.key('z', { ctrl: true });
    d.up(10, 10, { button: 1 }).expectState('wire.idle');
    expect(() => d.click(0, 30).click(100, 30)).not.toThrow();
    expect(Object.keys(e.document.wires)).toHaveLength(1);
  });
});
