import { describe, expect, it } from 'vitest';
import { autosave, loadDrawing, restoreAutosave, runMigrations, saveDrawing, type Migration } from '../../src/schematic/file';
import { History } from '../../src/schematic/history';
import { emptyDocument } from '../../src/schematic/document';
import { drawing, part, pt } from './build';

const sample = () => drawing([part('resistor', 'R1', 0, 0), part('ground', 'GND1', 0, 30)], [['a', pt(0, -30), pt(0, -60)]]);

describe('opening files', () => {
  it('refuses a drawing from a newer version, naming the versions', () => {
    const text = saveDrawing(sample()).replace('"version": 1', '"version": 7');
    const r = loadDrawing(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/newer version.*7.*up to version 1/);
  });
  it('refuses broken JSON, other formats and engine netlists with clear reasons', () => {
    const cases: [string, RegExp][] = [
      ['{"format": "polesketch-drawing", "version": 1, "parts": {', /not valid JSON/],
      ['[1, 2]', /not a JSON object/],
      ['{"format": "something-else", "version": 1}', /not a drawing/],
      ['{"format": "polesketch-netlist", "version": 1, "parts": []}', /engine netlist/],
    ];
    for (const [text, re] of cases) {
      const r = loadDrawing(text);
      expect(r.ok, text).toBe(false);
      if (!r.ok) expect(r.reason).toMatch(re);
    }
  });
  it('names the part and field of a damaged record', () => {
    const doc = JSON.parse(saveDrawing(sample()));
    doc.parts['part:r1'].rotation = 45;
    const r = loadDrawing(doc);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/Part R1: rotation must be 0, 90, 180 or 270/);
    const doc2 = JSON.parse(saveDrawing(sample()));
    doc2.wires['wire:a'].points = [{ x: 0, y: 0 }, { x: 10, y: 10 }];
    const r2 = loadDrawing(doc2);
    if (!r2.ok) expect(r2.reason).toMatch(/Wire wire:a: segment 1 is not horizontal or vertical/);
    expect(r2.ok).toBe(false);
    const doc3 = JSON.parse(saveDrawing(sample()));
    doc3.parts['part:r1'].kind = 'flux-capacitor';
    const r3 = loadDrawing(doc3);
    if (!r3.ok) expect(r3.reason).toMatch(/Part R1: unknown kind "flux-capacitor"/);
    expect(r3.ok).toBe(false);
  });
  it('runs numbered migrations in order up to the current version', () => {
    // A made-up migration table (v1 → v2 → v3) exercising the runner.
    const table: Record<number, Migration> = {
      1: (d) => ({ ...d, steps: ['1→2'] }),
      2: (d) => ({ ...d, steps: [...(d.steps as string[]), '2→3'] }),
    };
    const r = runMigrations({ format: 'polesketch-drawing', version: 1 }, 1, 3, table);
    expect(r).toEqual({ ok: true, doc: { format: 'polesketch-drawing', version: 3, steps: ['1→2', '2→3'] } });
    const gap = runMigrations({ version: 1 }, 1, 3, { 1: table[1] });
    expect(gap.ok).toBe(false);
    // loadDrawing with a higher limit migrates, then validates
    const loaded = loadDrawing(saveDrawing(sample()), 2, { 1: (d) => ({ ...d, title: 'migrated' }) });
    expect(loaded.ok && loaded.migratedFrom).toBe(1);
    expect(loaded.ok && loaded.doc.title).toBe('migrated');
  });
  it('autosaves to storage and restores; a broken autosave is refused, not crashed on', () => {
    const mem = new Map<string, string>();
    const store = { getItem: (k: string) => mem.get(k) ?? null, setItem: (k: string, v: string) => void mem.set(k, v) };
    expect(restoreAutosave(store)).toBeNull();
    expect(autosave(store, sample())).toEqual({ ok: true });
    const back = restoreAutosave(store);
    expect(back?.ok && back.doc).toEqual(sample());
    for (const k of mem.keys()) mem.set(k, '{"format": "polesketch-drawing", "version": 1, "parts": 3}');
    const bad = restoreAutosave(store);
    expect(bad?.ok).toBe(false);
    const full = { getItem: () => null, setItem: () => { throw new Error('quota exceeded'); } };
    expect(autosave(full, sample())).toEqual({ ok: false, reason: 'Autosave failed: quota exceeded' });
  });
});

describe('history', () => {
  it('undoes and redoes every change, and a new change clears redo', () => {
    const h = new History(emptyDocument());
    h.change('a', (d) => { d.title = 'one'; });
    h.change('b', (d) => { d.title = 'two'; });
    expect(h.undo()).toBe(true);
    expect(h.doc.title).toBe('one');
    expect(h.redo()).toBe(true);
    expect(h.doc.title).toBe('two');
    h.undo(); h.undo();
    expect(h.doc.title).toBeUndefined();
    expect(h.undo()).toBe(false);
    h.redo();
    h.change('c', (d) => { d.title = 'three'; });
    expect(h.canRedo).toBe(false);
  });
  it('records a gesture as one entry and cancel restores the start', () => {
    const start = sample();
    const h = new History(start);
    h.begin('drag');
    for (let x = 10; x <= 50; x += 10) h.change('step', (d) => { d.parts['part:r1'].x = x; });
    h.end();
    expect(h.size.undo).toBe(1);
    expect(h.doc.parts['part:r1'].x).toBe(50);
    h.undo();
    expect(h.doc).toEqual(start);
    h.begin('drag 2');
    h.change('step', (d) => { d.parts['part:r1'].y = 90; });
    h.cancel();
    expect(h.doc).toEqual(start);
    expect(h.size).toEqual({ undo: 0, redo: 1 });
  });
  it('records nothing for a change that changes nothing', () => {
    const h = new History(sample());
    h.change('noop', (d) => { d.parts['part:r1'].x = 0; });
    expect(h.size.undo).toBe(0);
  });
});
