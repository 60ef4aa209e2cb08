// @vitest-environment jsdom
import { describe, it, expect } from 'vitest';
import { act, fireEvent, render, screen, within } from '@testing-library/react';
import { App } from '../../src/App';
import { createEditor } from '../../src/editor/editor';
import { emptyDocument, DRAWING_VERSION, type DrawingDocument, type PartId } from '../../src/schematic/document';
import { newPart } from '../../src/schematic/kinds';
import { engineValues } from '../../src/schematic/kinds';
import { saveDrawing } from '../../src/schematic/file';

function docWith(...parts: ReturnType<typeof newPart>[]): DrawingDocument {
  const doc = emptyDocument('panel test');
  for (const p of parts) doc.parts[p.id] = p;
  return doc;
}

const R1 = 'part:r1' as PartId;
const M1 = 'part:m1' as PartId;

function setup(doc: DrawingDocument, select?: PartId) {
  const editor = createEditor(doc);
  const view = render(<App editor={editor} storage={null} />);
  if (select) act(() => editor.select([select]));
  return { editor, view };
}

function fieldOf(label: RegExp): HTMLInputElement {
  const panel = screen.getByTestId('part-inspector');
  return within(panel).getByLabelText(label) as HTMLInputElement;
}

describe('property panel', () => {
  it('entering 4.7k in the resistance field updates the part', () => {
    const { editor } = setup(docWith(newPart('resistor', R1, 'R1', { x: 0, y: 0 })), R1);
    const input = fieldOf(/Resistance/);
    expect(input.value).toBe('10k'); // the symbol's default
    fireEvent.change(input, { target: { value: '4.7k' } });
    expect(input.getAttribute('aria-invalid')).toBe('false');
    fireEvent.keyDown(input, { key: 'Enter' });
    expect(editor.document.parts[R1].params.value).toBe('4.7k');
    // SI prefix k = 10³ (BIPM SI brochure, 9th ed., Table 7): the engine sees 4700 Ω.
    expect(engineValues(editor.document.parts[R1]).values.value).toBeCloseTo(4700, 9);
    expect(screen.getByText('= 4.70 kΩ')).toBeTruthy();
  });

  it('a bad value is marked, explained and not applied, even after leaving the field', () => {
    const { editor } = setup(docWith(newPart('resistor', R1, 'R1', { x: 0, y: 0 })), R1);
    const input = fieldOf(/Resistance/);
    fireEvent.change(input, { target: { value: '4.7 kF' } });
    expect(input.getAttribute('aria-invalid')).toBe('true');
    const alert = screen.getByRole('alert');
    // The message names the field and says why (farads where ohms are expected).
    expect(alert.textContent).toMatch(/Resistance/);
    expect(alert.textContent).toMatch(/Ω/);
    expect(alert.textContent).toMatch(/not applied/);
    fireEvent.keyDown(input, { key: 'Enter' });
    fireEvent.blur(input);
    expect(editor.document.parts[R1].params.value).toBe('10k');
    expect(editor.history.canUndo).toBe(false);
    // The typed text stays visible for fixing, not silently dropped.
    expect(fieldOf(/Resistance/).value).toBe('4.7 kF');
    // Escape goes back to the applied value.
    fireEvent.keyDown(fieldOf(/Resistance/), { key: 'Escape' });
    expect(fieldOf(/Resistance/).value).toBe('10k');
  });

  it('undo and redo from the top bar restore the value and the field', () => {
    const { editor } = setup(docWith(newPart('resistor', R1, 'R1', { x: 0, y: 0 })), R1);
    const undo = screen.getByRole('button', { name: 'Undo' }) as HTMLButtonElement;
    const redo = screen.getByRole('button', { name: 'Redo' }) as HTMLButtonElement;
    expect(undo.disabled).toBe(true);
    fireEvent.change(fieldOf(/Resistance/), { target: { value: '4.7k' } });
    fireEvent.keyDown(fieldOf(/Resistance/), { key: 'Enter' });
    fireEvent.change(fieldOf(/Resistance/), { target: { value: '22k' } });
    fireEvent.blur(fieldOf(/Resistance/));
    expect(editor.document.parts[R1].params.value).toBe('22k');
    fireEvent.click(undo);
    expect(editor.document.parts[R1].params.value).toBe('4.7k');
    expect(fieldOf(/Resistance/).value).toBe('4.7k');
    fireEvent.click(undo);
    expect(editor.document.parts[R1].params.value).toBe('10k');
    expect(undo.disabled).toBe(true);
    fireEvent.click(redo);
    expect(fieldOf(/Resistance/).value).toBe('4.7k');
    fireEvent.click(redo);
    expect(fieldOf(/Resistance/).value).toBe('22k');
    expect(redo.disabled).toBe(true);
  });

  it('keyboard undo outside a field uses the shortcut from the command registry', () => {
    const { editor } = setup(docWith(newPart('resistor', R1, 'R1', { x: 0, y: 0 })), R1);
    fireEvent.change(fieldOf(/Resistance/), { target: { value: '1M' } });
    fireEvent.keyDown(fieldOf(/Resistance/), { key: 'Enter' });
    // Ctrl+Z typed inside the field belongs to the field, not to the drawing.
    fireEvent.keyDown(fieldOf(/Resistance/), { key: 'z', ctrlKey: true });
    expect(editor.document.parts[R1].params.value).toBe('1M');
    fireEvent.keyDown(window, { key: 'z', ctrlKey: true });
    expect(editor.document.parts[R1].params.value).toBe('10k');
  });

  it('a MOSFET shows bias fields or direct small-signal fields, whichever is chosen', () => {
    const { editor } = setup(docWith(newPart('nmos', M1, 'M1', { x: 0, y: 0 })), M1);
    expect(fieldOf(/Drain current/).value).toBe('100u');
    expect(within(screen.getByTestId('part-inspector')).queryByLabelText(/^gds/)).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Small-signal' }));
    expect(editor.document.parts[M1].mode).toBe('direct');
    expect(within(screen.getByTestId('part-inspector')).queryByLabelText(/Drain current/)).toBeNull();
    fireEvent.change(fieldOf(/^gds/), { target: { value: '20uS' } });
    fireEvent.keyDown(fieldOf(/^gds/), { key: 'Enter' });
    expect(editor.document.parts[M1].params.gds).toBe('20uS');
    fireEvent.change(screen.getByLabelText('Bulk'), { target: { value: 'pin' } });
    expect(editor.document.parts[M1].bulk).toBe('pin');
  });

  it('renaming to a taken reference designator is refused with the reason', () => {
    const { editor } = setup(docWith(newPart('resistor', R1, 'R1', { x: 0, y: 0 }), newPart('nmos', M1, 'M1', { x: 100, y: 0 })), R1);
    fireEvent.change(fieldOf(/^Name/), { target: { value: 'M1' } });
    expect(screen.getByRole('alert').textContent).toMatch(/already used/);
    fireEvent.blur(fieldOf(/^Name/));
    expect(editor.document.parts[R1].ref).toBe('R1');
    fireEvent.change(fieldOf(/^Name/), { target: { value: 'Rload' } });
    fireEvent.keyDown(fieldOf(/^Name/), { key: 'Enter' });
    expect(editor.document.parts[R1].ref).toBe('Rload');
  });
});

describe('shell', () => {
  it('the help overlay lists the shortcuts of the command registry', () => {
    setup(emptyDocument());
    fireEvent.click(screen.getByRole('button', { name: 'Keyboard shortcuts' }));
    const dialog = screen.getByRole('dialog', { name: 'Keyboard shortcuts' });
    const row = within(dialog).getByText('Connect (draw wire)').closest('tr')!;
    expect(row.textContent).toContain('c');
    expect(within(dialog).getByText('Undo').closest('tr')!.textContent).toMatch(/Ctrl\+Z|⌘\+Z/);
    fireEvent.keyDown(dialog, { key: 'Escape' });
    expect(screen.queryByRole('dialog')).toBeNull();
  });

  it('a shelf click arms the place tool and a click on the sheet places the part on the grid', () => {
    const { editor } = setup(emptyDocument());
    fireEvent.click(screen.getByRole('button', { name: 'Place Capacitor' }));
    expect(editor.state.mode).toBe('place.ghost');
    const sheet = screen.getByTestId('sheet');
    // jsdom boxes sit at (0, 0); the camera maps screen = world·scale + offset.
    const { scale, x, y } = editor.camera;
    const sx = 123 * scale + x, sy = 58 * scale + y;
    fireEvent.pointerMove(sheet, { clientX: sx, clientY: sy });
    fireEvent.pointerDown(sheet, { clientX: sx, clientY: sy, button: 0 });
    fireEvent.pointerUp(sheet, { clientX: sx, clientY: sy, button: 0 });
    const placed = Object.values(editor.document.parts);
    expect(placed).toHaveLength(1);
    expect(placed[0].kind).toBe('capacitor');
    expect([placed[0].x, placed[0].y]).toEqual([120, 60]); // snapped to the 10-unit grid
    expect(placed[0].ref).toBe('C1');
  });

  it('the estimate caveat is always visible in the status line', () => {
    setup(emptyDocument());
    expect(screen.getByRole('status').textContent).toMatch(/small-signal estimates/i);
  });

  it('opening a file from a newer version is refused and the drawing kept', async () => {
    const { editor } = setup(docWith(newPart('resistor', R1, 'R1', { x: 0, y: 0 })));
    const before = editor.document;
    const newer = JSON.parse(saveDrawing(emptyDocument('from the future')));
    newer.version = DRAWING_VERSION + 1;
    const file = new File([JSON.stringify(newer)], 'future.json', { type: 'application/json' });
    await act(async () => {
      fireEvent.change(screen.getByTestId('file-input'), { target: { files: [file] } });
      await new Promise((r) => setTimeout(r, 20));
    });
    expect(screen.getByRole('alert').textContent).toMatch(/future\.json was not opened/);
    expect(screen.getByRole('alert').textContent).toMatch(/unchanged|nothing was changed/i);
    expect(editor.document).toBe(before);
  });
});
