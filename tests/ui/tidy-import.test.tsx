// @vitest-environment jsdom
// The app's tidy (top-bar button, Shift+L, one undo step, pinned parts stay) and netlist import
// (file open → tidy drawing, one undo step back to the old drawing). ELK runs in-process here.
import { describe, expect, it } from 'vitest';
import { act, fireEvent, render, screen, within } from '@testing-library/react';
import { App } from '../../src/App';
import { createEditor } from '../../src/editor/editor';
import { EXAMPLE_DRAWINGS } from '../../src/examples/index';
import { nodeElk } from '../../src/layout/elkNode';
import type { ElkGraphJson, ElkRunner } from '../../src/layout/elkGraph';
import type { PartId } from '../../src/schematic/document';
import { loadDrawing, saveDrawing } from '../../src/schematic/file';
import { documentToNetlist } from '../../src/schematic/toNetlist';

const elk = nodeElk();

async function until(cond: () => boolean, ms = 8000): Promise<void> {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > ms) throw new Error('condition not met in time');
    await act(async () => { await new Promise((r) => setTimeout(r, 25)); });
  }
}

function setup(runner: ElkRunner = elk) {
  const doc = EXAMPLE_DRAWINGS[0].load();
  const editor = createEditor(doc);
  render(<App editor={editor} storage={null} elk={() => runner} />);
  return { editor, doc: editor.document };
}

describe('tidy in the app', () => {
  it('the Tidy button lays the drawing out as one undo step with the same netlist', async () => {
    const { editor, doc } = setup();
    fireEvent.click(screen.getByRole('button', { name: 'Tidy' }));
    await until(() => editor.document !== doc);
    expect(editor.history.undoLabel).toBe('Tidy layout');
    // Common practice: a layout change must not change the circuit.
    expect(documentToNetlist(editor.document).netlist).toEqual(documentToNetlist(doc).netlist);
    act(() => { editor.dispatch({ type: 'command', id: 'edit.undo' }); });
    expect(saveDrawing(editor.document)).toBe(saveDrawing(doc));
  });

  it('Shift+L tidies, and a part marked "keep in place" does not move', async () => {
    const { editor, doc } = setup();
    const id = Object.values(doc.parts).find((p) => p.kind === 'nmos')!.id as PartId;
    act(() => editor.select([id]));
    fireEvent.click(within(screen.getByTestId('part-inspector')).getByLabelText(/keep in place when tidying/i));
    expect(editor.document.parts[id].pinned).toBe(true);
    // The flag survives a save and reopen (file validation keeps it).
    const back = loadDrawing(saveDrawing(editor.document));
    expect(back.ok && back.doc.parts[id].pinned).toBe(true);
    act(() => editor.select([]));
    const before = editor.document;
    act(() => { window.dispatchEvent(new KeyboardEvent('keydown', { key: 'L', shiftKey: true })); });
    await until(() => editor.document !== before);
    expect(editor.history.undoLabel).toBe('Tidy layout');
    expect({ x: editor.document.parts[id].x, y: editor.document.parts[id].y }).toEqual({ x: before.parts[id].x, y: before.parts[id].y });
    const moved = Object.values(before.parts).filter((p) => editor.document.parts[p.id] && (editor.document.parts[p.id].x !== p.x || editor.document.parts[p.id].y !== p.y));
    expect(moved.length).toBeGreaterThan(0);
  });

  it('a refused tidy shows its message and leaves the drawing', async () => {
    const broken: ElkRunner = { layout: (_g: ElkGraphJson) => Promise.reject(new Error('invented failure')) };
    const { editor, doc } = setup(broken);
    fireEvent.click(screen.getByRole('button', { name: 'Tidy' }));
    await until(() => screen.queryByRole('alert') !== null);
    expect(screen.getByRole('alert').textContent).toMatch(/layout engine failed: invented failure/);
    expect(editor.document).toBe(doc);
  });
});

describe('netlist import in the app', () => {
  const netlist = {
    format: 'polesketch-netlist', version: 1, title: 'Invented npn stage', input: 'Vin', output: { kind: 'voltage', node: 'out' },
    parts: [
      { name: 'Vin', kind: 'vsource', pins: { p: 'base', n: '0' }, values: {} },
      { name: 'Q1', kind: 'npn', pins: { c: 'out', b: 'base', e: '0' }, values: { ic: '100u', beta: '150' } },
      { name: 'RC', kind: 'resistor', pins: { p: 'out', n: '0' }, values: { value: '20k' } },
    ],
  };

  it('opening a netlist file loads its tidy drawing; undo brings the old drawing back', async () => {
    const { editor, doc } = setup();
    const file = new File([JSON.stringify(netlist)], 'npn-stage.json', { type: 'application/json' });
    await act(async () => { fireEvent.change(screen.getByTestId('file-input'), { target: { files: [file] } }); });
    await until(() => editor.document !== doc || screen.queryByRole('alert') !== null);
    expect(screen.queryByRole('alert')?.textContent ?? '').toBe('');
    const q1 = documentToNetlist(editor.document).netlist!.parts.find((p) => p.name === 'Q1');
    expect(q1?.pins).toEqual({ c: 'out', b: 'base', e: '0' });
    expect(editor.history.undoLabel).toBe('Import netlist npn-stage.json');
    act(() => { editor.dispatch({ type: 'command', id: 'edit.undo' }); });
    expect(saveDrawing(editor.document)).toBe(saveDrawing(doc));
  });

  it('a netlist that cannot be drawn is named in the message and changes nothing', async () => {
    const { editor, doc } = setup();
    const bad = { ...netlist, parts: [{ name: 'R9', kind: 'resistor', pins: { p: 'a' }, values: { value: '1k' } }] };
    const file = new File([JSON.stringify(bad)], 'bad.json', { type: 'application/json' });
    await act(async () => { fireEvent.change(screen.getByTestId('file-input'), { target: { files: [file] } }); });
    await until(() => screen.queryByRole('alert') !== null);
    expect(screen.getByRole('alert').textContent).toMatch(/bad\.json was not imported: .*R9/);
    expect(editor.document).toBe(doc);
  });
});
