import { describe, expect, it } from 'vitest';
import { createEditor } from '../../src/editor/editor';
import { drive } from '../../src/editor/driver';
import { COMMANDS, commandForKey, matchesShortcut } from '../../src/editor/commands';
import { CLIP_FORMAT } from '../../src/editor/clipboard';
import { computeConnectivity } from '../../src/schematic/connectivity';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { drawing, part, pt } from '../schematic/build';

describe('command registry', () => {
  it('has unique ids and no shortcut bound twice', () => {
    expect(new Set(COMMANDS.map((c) => c.id)).size).toBe(COMMANDS.length);
    const all = COMMANDS.flatMap((c) => c.shortcuts.map((s) => s.toLowerCase()));
    expect(new Set(all).size).toBe(all.length);
  });
  it('matches keys with modifiers; Shift is part of a letter shortcut but not of "?"', () => {
    expect(matchesShortcut({ key: 'z', ctrl: true }, 'Mod+Z')).toBe(true);
    expect(matchesShortcut({ key: 'z', meta: true }, 'Mod+Z')).toBe(true);
    expect(matchesShortcut({ key: 'Z', ctrl: true, shift: true }, 'Mod+Z')).toBe(false);
    expect(commandForKey({ key: 'Z', ctrl: true, shift: true })?.id).toBe('edit.redo');
    expect(commandForKey({ key: 'T', shift: true })?.id).toBe('edit.turnBack');
    expect(commandForKey({ key: '?', shift: true })?.id).toBe('help.toggle');
    expect(commandForKey({ key: 'c' })?.id).toBe('tool.wire');
    expect(commandForKey({ key: 'c', ctrl: true })?.id).toBe('edit.copy');
    expect(commandForKey({ key: 'q' })).toBeUndefined();
  });
});

describe('editing commands', () => {
  // R1 and R2 joined by a wire; a stub wire hangs from R1.p only.
  const two = () => createEditor(drawing([part('resistor', 'R1', 0, 0), part('resistor', 'R2', 100, 0)], [
    ['a', pt(0, 30), pt(0, 50), pt(100, 50), pt(100, 30)],
    ['stub', pt(0, -30), pt(0, -60)],
  ]));

  it('delete removes wires left hanging and tells about ends left open', () => {
    const e = two();
    drive(e).click(0, 0).key('Delete');
    expect(Object.keys(e.document.parts)).toEqual(['part:r2']);
    // the stub touched only R1 → removed; wire a now touches only R2 → removed too
    expect(Object.keys(e.document.wires)).toEqual([]);
    expect(e.state.notice).toMatch(/2 wires left hanging were removed/);
    drive(e).key('z', { ctrl: true });
    expect(Object.keys(e.document.wires).sort()).toEqual(['wire:a', 'wire:stub']);
  });

  it('delete keeps a wire that still joins two things and reports its open end', () => {
    const e = createEditor(drawing([part('resistor', 'R1', 0, 0), part('resistor', 'R2', 100, 0), part('resistor', 'R3', 200, 0)], [
      ['a', pt(0, 30), pt(0, 50), pt(200, 50), pt(200, 30)],
      ['t', pt(100, 30), pt(100, 50)],
    ]));
    drive(e).click(0, 0).key('Delete');
    expect(Object.keys(e.document.wires).sort()).toEqual(['wire:a', 'wire:t']);
    expect(e.state.notice).toMatch(/1 wire end is now open/);
    expect(documentToNetlist(e.document).issues.some((i) => i.code === 'open-wire-end' && i.x === 0 && i.y === 30)).toBe(true);
  });

  it('duplicate copies parts with new references and their internal wires', () => {
    const e = two();
    drive(e).key('a', { ctrl: true }).key('d');
    const refs = Object.values(e.document.parts).map((p) => p.ref).sort();
    expect(refs).toEqual(['R1', 'R2', 'R3', 'R4']);
    expect(Object.keys(e.document.wires)).toHaveLength(4);
    expect(e.selection.size).toBe(4);
    const c = computeConnectivity(e.document);
    const r3 = Object.values(e.document.parts).find((p) => p.ref === 'R3')!;
    const r4 = Object.values(e.document.parts).find((p) => p.ref === 'R4')!;
    expect(c.netOfPin[`${r3.id}#n`]).toBe(c.netOfPin[`${r4.id}#n`]);
    expect(c.netOfPin[`${r3.id}#n`]).not.toBe(c.netOfPin['part:r1#n']);
  });

  it('copies in one tab and pastes in another through the serialised text', () => {
    let text = '';
    const a = two();
    a.setHost({ writeClipboard: (t) => { text = t; } });
    drive(a).click(0, 0).key('c', { ctrl: true });
    expect(JSON.parse(text).format).toBe(CLIP_FORMAT);
    const b = createEditor(drawing([part('resistor', 'R1', 500, 500)]));
    drive(b).move(200, 200).send({ type: 'paste', text });
    const pasted = Object.values(b.document.parts).filter((p) => p.id !== 'part:r1');
    expect(pasted.map((p) => [p.ref, p.x, p.y])).toEqual([['R2', 200, 200]]); // R1 is taken in b
    expect(b.history.size.undo).toBe(1);
    expect(b.dispatch({ type: 'paste', text: 'hello' })).toBe(false);
    expect(b.state.notice).toMatch(/does not hold parts/);
  });

  it('keeps a bad value as typed (and reports it), undo restores the old one', () => {
    const e = createEditor(drawing([part('resistor', 'R1', 0, 0)]));
    e.setParam('part:r1', 'value', '4.7k');
    expect(e.document.parts['part:r1'].params.value).toBe('4.7k');
    e.setParam('part:r1', 'value', '4.7kk');
    expect(e.document.parts['part:r1'].params.value).toBe('4.7kk');
    expect(documentToNetlist(e.document).issues.find((i) => i.code === 'bad-value')?.field).toBe('value');
    e.history.undo();
    expect(e.document.parts['part:r1'].params.value).toBe('4.7k');
    e.history.redo();
    expect(e.document.parts['part:r1'].params.value).toBe('4.7kk');
  });

  it('renames references, refusing empty, malformed and taken ones', () => {
    const e = two();
    expect(e.setRef('part:r1', 'Rload')).toEqual({ ok: true });
    expect(e.document.parts['part:r1'].ref).toBe('Rload');
    expect(e.setRef('part:r1', '')).toMatchObject({ ok: false, reason: expect.stringMatching(/empty/) });
    expect(e.setRef('part:r1', '1R')).toMatchObject({ ok: false });
    expect(e.setRef('part:r1', 'R2')).toMatchObject({ ok: false, reason: expect.stringMatching(/already used/) });
    expect(e.document.parts['part:r1'].ref).toBe('Rload');
  });

  it('marks only one source as the input', () => {
    const e = createEditor(drawing([part('vsource', 'V1', 0, 0, { isInput: true }), part('isource', 'I1', 100, 0)]));
    e.updatePart('part:i1', { isInput: true });
    expect(e.document.parts['part:v1'].isInput).toBe(false);
    expect(e.document.parts['part:i1'].isInput).toBe(true);
  });

  it('toggles the help overlay and fits the drawing into the viewport', () => {
    const e = two();
    drive(e).key('?', { shift: true });
    expect(e.state.helpOpen).toBe(true);
    drive(e).key('Escape');
    expect(e.state.helpOpen).toBe(false);
    e.dispatch({ type: 'viewport', width: 1000, height: 500 });
    drive(e).key('h');
    // the drawing's centre lands at the viewport centre (common practice for fit-to-view)
    const cx = (-8 + 108) / 2; // bounds of the two resistor bodies and pins in x
    expect(cx * e.camera.scale + e.camera.x).toBeCloseTo(500, 6);
  });
});
