// Malformed drawings: refused with a message naming the place (and the drawing open in the editor
// kept exactly as it was), or accepted and marked with named issues at the part, pin or wire.
// The file path is exercised three ways: opening in the app (src/panels/browserHost.ts openText
// does loadDrawing, then editor.load only when valid), restoring an autosave, and the CLI.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createEditor } from '../../src/editor/editor';
import type { Editor } from '../../src/editor/types';
import { EXAMPLE_DRAWINGS } from '../../src/examples/index';
import type { DrawingDocument, PartId, WireId } from '../../src/schematic/document';
import { AUTOSAVE_KEY, loadDrawing, restoreAutosave, saveDrawing } from '../../src/schematic/file';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { placedPins } from '../../src/schematic/symbols';
import { createLiveStore } from '../../src/live/store';
import { main } from '../../src/cli/analyze';
import { checkLive, syncRunner } from './appChecks';

const example = () => EXAMPLE_DRAWINGS[0].load(); // sensor-cs-miller: Rsens, Cload, M1, M2, …
const exampleText = () => saveDrawing(example());

/** What the app does with an opened file (browserHost.ts openText): load only a valid drawing. */
function openLikeTheApp(editor: Editor, text: string): string | null {
  const r = loadDrawing(text);
  if (!r.ok) return r.reason;
  editor.load(r.doc, { label: 'Open file' });
  return null;
}

const edit = (f: (doc: Record<string, any>) => void) => { const j = JSON.parse(exampleText()); f(j); return JSON.stringify(j, null, 2); };

/** [what, file text, the reason must match]. Each reason names where the problem is. */
const REFUSED: [string, string, RegExp][] = [
  ['an empty file', '', /empty/],
  ['a wrong version (newer)', edit((j) => { j.version = 2; }), /newer version.*format version 2.*up to version 1/],
  ['a wrong version (text)', edit((j) => { j.version = '1'; }), /version "1" is not valid/],
  ['a wrong version (zero)', edit((j) => { j.version = 0; }), /version 0 is not valid/],
  ['an unknown part type', edit((j) => { j.parts['part:rsens'].kind = 'warp-drive'; }), /Part Rsens: unknown kind "warp-drive"/],
  ['a value 1e400 as a JSON number', exampleText().replace('"value": "25k"', '"value": 1e400'), /Part Rsens: parameter "value" is a number too large/],
  ['a position 1e400', exampleText().replace(/("id": "part:rsens",\s*"kind": "resistor",\s*"ref": "Rsens",\s*"x": )-?\d+/, '$11e400'), /Part Rsens: position x, y must be finite/],
  ['a value that is an object', edit((j) => { j.parts['part:cload'].params.value = { pico: 1 }; }), /Part Cload: parameter "value" must be a text or a number/],
  ['a wire of one point', edit((j) => { j.wires['wire:w1'].points = [{ x: 0, y: 0 }]; }), /Wire wire:w1: needs at least two points/],
  ['a wire point that is text', edit((j) => { j.wires['wire:w2'].points[1].x = 'left'; }), /Wire wire:w2: point 1 must have finite x and y/],
  ['parts given as a list', edit((j) => { j.parts = Object.values(j.parts); }), /Field "parts" must be an object keyed by id/],
  ['a part filed under another id', edit((j) => { j.parts['part:rsens'].id = 'part:other'; }), /Part Rsens: its id "part:other" does not match its key part:rsens/],
  ['a mirror flag that is text', edit((j) => { j.parts['part:m1'].mirror = 'yes'; }), /Part M1: field "mirror" must be true or false/],
];

describe('malformed drawing files are refused with the place named; the open drawing is kept', () => {
  const dir = mkdtempSync(join(tmpdir(), 'polesketch-bad-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('a save cut off anywhere is refused at its last line, marked as cut off', () => {
    const full = exampleText();
    for (const at of [1, 37, 400, Math.floor(full.length / 2), full.length - 4]) {
      const text = full.slice(0, at);
      const r = loadDrawing(text);
      expect(r.ok, `cut at ${at}`).toBe(false);
      if (r.ok) continue;
      // the line reported is the last line of the text (counted here independently)
      const lastLine = text.split('\n').length;
      expect(r.reason, `cut at ${at}`).toMatch(new RegExp(`not valid JSON at line ${lastLine}, column \\d+; the text ends too early`));
    }
    // a broken character mid-file is placed on its own line, not called a cut
    const lines = full.split('\n');
    lines[9] = lines[9].replace(/,$/, ',,');
    const r = loadDrawing(lines.join('\n'));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.reason).toMatch(/line (10|11), column \d+/);
      expect(r.reason).not.toMatch(/cut off/);
    }
  });

  for (const [what, text, re] of [...REFUSED, ['a truncated save', exampleText().slice(0, 1500), /line \d+, column \d+; the text ends too early/] as [string, string, RegExp]]) {
    it(`${what}: refused, named, drawing and history unchanged (app, autosave, CLI)`, async () => {
      const editor = createEditor();
      editor.load(EXAMPLE_DRAWINGS[1].load(), { label: 'Open example' });
      const before = editor.document;
      const depth = editor.history.size.undo;
      const reason = openLikeTheApp(editor, text);
      expect(reason).not.toBeNull();
      expect(reason!).toMatch(re);
      expect(editor.document).toBe(before);
      expect(editor.history.size.undo).toBe(depth);
      // the same text as an autosave: refused, not thrown on
      const store = { getItem: (k: string) => (k === AUTOSAVE_KEY ? text : null), setItem: () => {} };
      const restored = restoreAutosave(store);
      expect(restored?.ok).toBe(false);
      // the CLI on the same file: exit 1, the reason on stderr, no stack trace
      const file = join(dir, `${what.replace(/\W+/g, '-')}.json`);
      writeFileSync(file, text);
      const err: string[] = [];
      const code = await main([file], () => {}, (s) => err.push(s));
      expect(code).toBe(1);
      expect(err.join('\n')).not.toMatch(/\n\s+at .+:\d+:\d+/);
      expect(err.join('\n').length).toBeGreaterThan(20);
    });
  }
});

/** The example with a change, straight (the loader accepts these drawings). */
function changed(f: (doc: DrawingDocument) => void): DrawingDocument {
  const doc = example();
  f(doc);
  const r = loadDrawing(saveDrawing(doc));
  expect(r.ok, r.ok ? '' : r.reason).toBe(true);
  return r.ok ? r.doc : doc;
}

function liveState(doc: DrawingDocument) {
  const store = createLiveStore({ runner: syncRunner(() => true) });
  store.actions.submit(doc);
  const st = store.getState();
  store.actions.dispose();
  return st;
}

describe('drawings that open but are wrong get named issues at their place', () => {
  it('duplicate reference designators: an error at the second part, no analysis', () => {
    const doc = changed((d) => { d.parts['part:cload' as PartId].ref = 'Rsens'; });
    const conv = documentToNetlist(doc);
    expect(conv.netlist).toBeUndefined();
    const dup = conv.issues.find((i) => i.code === 'duplicate-ref');
    expect(dup).toMatchObject({ severity: 'error', part: 'part:rsens' });
    expect(dup!.message).toMatch(/Two parts are named Rsens/);
    const st = liveState(doc);
    expect(st.status).toBe('error');
    expect(st.issues.find((i) => i.code === 'duplicate-ref')).toMatchObject({ x: doc.parts['part:rsens' as PartId].x, y: doc.parts['part:rsens' as PartId].y });
    expect(checkLive(st)).toEqual([]);
  });

  it('a wire to nowhere: a warning at its open end, and the analysis is the same as without it', () => {
    const base = example();
    const pin = placedPins(base.parts['part:rsens' as PartId])[0];
    const end = { x: pin.x - 200, y: pin.y };
    const doc = changed((d) => { d.wires['wire:stray' as WireId] = { id: 'wire:stray' as WireId, points: [pin, { x: end.x, y: pin.y }] }; });
    const conv = documentToNetlist(doc);
    expect(conv.issues.find((i) => i.code === 'open-wire-end')).toMatchObject({ severity: 'warning', wire: 'wire:stray', x: end.x, y: end.y });
    // a wire that ends in the air carries no current: the poles cannot change (fact of the trade)
    const a = liveState(base), b = liveState(doc);
    expect(b.result?.ok).toBe(true);
    expect(b.result!.poles.map((p) => p.hz)).toEqual(a.result!.poles.map((p) => p.hz));
    expect(checkLive(b)).toEqual([]);
  });

  const VALUES: [string, string, string, RegExp][] = [
    ['part:cload', 'value', '1e400', /Cload: Capacitance "1e400" is too large to represent/],
    ['part:cload', 'value', 'abc', /Cload: Capacitance "abc" is not a number/],
    ['part:cload', 'value', '-2p', /Cload: Capacitance must be positive \(got -2p\)/],
    ['part:cload', 'value', 'NaN', /Cload: Capacitance "NaN" is not a number/],
    ['part:rsens', 'value', '0', /Rsens: Resistance must be positive \(got 0\)/],
    ['part:rsens', 'value', 'inf', /Rsens: Resistance "inf": an infinite value cannot be analysed/],
    ['part:m1', 'gmid', '∞', /M1: .*"∞": an infinite value cannot be analysed/],
  ];
  for (const [id, field, text, re] of VALUES) {
    it(`${id.slice(5)}.${field} = ${JSON.stringify(text)}: a bad-value error naming part and field, no NaN shown`, () => {
      const doc = changed((d) => { d.parts[id as PartId].params[field] = text; });
      const conv = documentToNetlist(doc);
      expect(conv.netlist).toBeUndefined();
      const bad = conv.issues.filter((i) => i.code === 'bad-value');
      expect(bad).toHaveLength(1);
      expect(bad[0]).toMatchObject({ severity: 'error', part: id, field });
      expect(bad[0].message).toMatch(re);
      const st = liveState(doc);
      expect(st.status).toBe('error');
      expect(st.result).toBeNull();
      expect(checkLive(st)).toEqual([]);
      // the typed text is kept in the drawing, to be shown and corrected
      expect(st.doc!.parts[id as PartId].params[field]).toBe(text);
    });
  }
});
