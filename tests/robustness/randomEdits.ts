// Seeded random edits for the editor fuzz test: each edit is a short sequence of the plain events
// (or editor calls) the UI would send, chosen from what is in the drawing now, with absurd values
// mixed in. Deterministic for a given seed (mulberry32, common practice).
import type { Editor } from '../../src/editor/types';
import type { EditorActions } from '../../src/editor/commands';
import { drive } from '../../src/editor/driver';
import { serializeClip, clipOf } from '../../src/editor/clipboard';
import { pinKey, type ItemId, type PartId, type PartRecord, type Rotation, type SymbolKind } from '../../src/schematic/document';
import { loadDrawing, saveDrawing } from '../../src/schematic/file';
import { placedPins, SYMBOL_KINDS, symbolOf } from '../../src/schematic/symbols';
import { EXAMPLE_DRAWINGS } from '../../src/examples/index';
import { documentToNetlist } from '../../src/schematic/toNetlist';

export { rng } from '../seeded';

/** Values a designer might type. */
const SENSIBLE = ['1k', '4.7k', '10k', '2p', '100f', '1m', '20u', '1', '0.5', '10', '1M', '50', '2 pF', '3.3 kΩ', '60dB', '-4'];
/** Values nobody should type, but someone will. */
export const ABSURD = [
  '1e400', '-1e400', 'abc', '', '   ', 'NaN', 'Infinity', '-Infinity', '-2p', '0', '-0', '1e-400', '1e308',
  '1e-320', '∞', '4.7kk', '1..2', '0x10', '1e', '--1', 'k', '12 parsecs', '1/0', '1e+999999', 'x'.repeat(300),
  '💥', '\u0000', '  4.7 k  ', '1_000', '-', '+', '.', '1e-30', '1e30', 'null', 'undefined', '[object Object]',
];
const REFS = ['R1', 'M1', 'C1', '', '  ', '1abc', 'a b', 'X_9', 'GND1', 'Q', 'résistance', 'R1'.repeat(40)];
const MALFORMED_FILES = [
  '{"format": "polesketch-drawing", "version": 1, "parts": {',
  '', 'null', '[]', '42', '{"format": "polesketch-drawing", "version": 99, "parts": {}, "wires": {}}',
  '{"format": "polesketch-drawing", "version": 1, "parts": {"part:x1": {"id": "part:x1", "kind": "warp-drive", "ref": "X1", "x": 0, "y": 0, "rotation": 0, "mirror": false, "params": {}}}, "wires": {}}',
  '{"format": "polesketch-drawing", "version": 1, "parts": {}, "wires": {"wire:a": {"id": "wire:a", "points": [{"x": 0, "y": 0}]}}}',
  '{"format": "polesketch-drawing", "version": 1, "parts": {"part:r1": {"id": "part:r1", "kind": "resistor", "ref": "R1", "x": 1e400, "y": 0, "rotation": 0, "mirror": false, "params": {}}}, "wires": {}}',
];
const KEYS = ['t', 'f', 'd', 'h', '=', '-', '?', 'Escape', 'Enter', 'Backspace', 'ArrowLeft', 'ArrowDown', 's', 'c', 'x', 'q', '1', '5', '9'];

const WIRED_KINDS: readonly SymbolKind[] = ['resistor', 'resistor', 'capacitor', 'capacitor', 'inductor', 'isource', 'vsource'];

export type EditKind =
  | 'place' | 'wire' | 'delete' | 'value' | 'turn' | 'undo' | 'redo' | 'move' | 'nudge' | 'duplicate'
  | 'copyPaste' | 'field' | 'rename' | 'pasteText' | 'open' | 'noise' | 'placeWired' | 'interrupt' | 'fix';

const WEIGHTS: [EditKind, number][] = [
  ['place', 5], ['wire', 8], ['delete', 5], ['value', 12], ['turn', 5], ['undo', 10], ['redo', 6],
  ['move', 5], ['nudge', 3], ['duplicate', 2], ['copyPaste', 2], ['field', 4], ['rename', 3],
  ['pasteText', 2], ['open', 2], ['noise', 4], ['placeWired', 14], ['interrupt', 3], ['fix', 24],
];
const TOTAL_WEIGHT = WEIGHTS.reduce((s, [, w]) => s + w, 0);

export interface EditContext {
  editor: Editor & { actions: EditorActions };
  r: () => number;
  /** Set by the 'open' edit: what the app tells the user (the host's banner), null if opened. */
  refused: string | null;
}

const pickOf = <T>(r: () => number, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];
const gridPoint = (r: () => number) => ({ x: Math.round(r() * 40 - 10) * 10, y: Math.round(r() * 40 - 10) * 10 });

function randomPart(c: EditContext): PartRecord | null {
  const parts = Object.values(c.editor.document.parts);
  return parts.length ? pickOf(c.r, parts) : null;
}

function randomItems(c: EditContext, most: number): ItemId[] {
  const all = [...Object.keys(c.editor.document.parts), ...Object.keys(c.editor.document.wires)] as ItemId[];
  const n = 1 + Math.floor(c.r() * most);
  return Array.from({ length: Math.min(n, all.length) }, () => pickOf(c.r, all));
}

/** A point worth clicking on for a wire: mostly a pin, sometimes a wire vertex or free space. */
function wirePoint(c: EditContext): { x: number; y: number } {
  const u = c.r();
  const part = randomPart(c);
  if (part && u < 0.75) return pickOf(c.r, placedPins(part));
  const wires = Object.values(c.editor.document.wires);
  if (wires.length && u < 0.85) return pickOf(c.r, pickOf(c.r, wires).points);
  return gridPoint(c.r);
}

export function chooseEdit(r: () => number): EditKind {
  let u = r() * TOTAL_WEIGHT;
  for (const [k, w] of WEIGHTS) if ((u -= w) < 0) return k;
  return 'noise';
}

/** Apply one edit; returns a short description (for failure messages). */
export function applyEdit(kind: EditKind, c: EditContext): string {
  const { editor, r } = c;
  const d = drive(editor);
  c.refused = null;
  switch (kind) {
    case 'place': {
      const k = pickOf(r, SYMBOL_KINDS) as SymbolKind;
      const at = gridPoint(r);
      d.send({ type: 'tool', tool: 'place', kind: k }).move(at.x, at.y);
      if (r() < 0.3) d.key('t');
      d.click(at.x, at.y).key('Escape');
      return `place ${k} at ${at.x},${at.y}`;
    }
    case 'placeWired': {
      // A two-pin part placed off to the side and wired from each pin to a pin already there,
      // so that the drawing often stays a complete circuit the engine can analyse.
      const targets = Object.values(editor.document.parts).flatMap((p) => placedPins(p));
      const k = pickOf(r, WIRED_KINDS);
      const at = { x: 400 + Math.round(r() * 20) * 10, y: Math.round(r() * 40 - 10) * 10 };
      d.send({ type: 'tool', tool: 'place', kind: k }).move(at.x, at.y).click(at.x, at.y).key('Escape');
      const placed = Object.values(editor.document.parts).find((p) => p.x === at.x && p.y === at.y && p.kind === k);
      if (!placed || targets.length === 0) return `place ${k} (no pins to wire to)`;
      for (const pin of placedPins(placed)) {
        const t = pickOf(r, targets);
        d.key('c').click(pin.x, pin.y).move(t.x, t.y).click(t.x, t.y).key('Enter').key('Escape');
      }
      return `place ${k} at ${at.x},${at.y} and wire it in`;
    }
    case 'fix': {
      // What a designer does with the list of errors: give a good value, or delete the part.
      const conv = documentToNetlist(editor.document);
      const errors = conv.issues.filter((i) => i.severity === 'error' && i.part);
      if (errors.length === 0) {
        // the engine's "output is ground" names no part: the designer moves the marker away
        const grounded = Object.values(editor.document.parts).find((p) => p.kind === 'output' && conv.netOfPin[pinKey({ part: p.id, pin: 'p' })] === '0');
        if (!grounded) return 'fix (nothing to fix)';
        d.key('Escape');
        editor.select([grounded.id]);
        d.key('Delete');
        return `fix: output marker ${grounded.ref} taken off ground`;
      }
      const e = pickOf(r, errors);
      const part = editor.document.parts[e.part!];
      const spec = e.code === 'bad-value' && part ? symbolOf(part.kind).params.find((q) => q.name === e.field) : undefined;
      if (spec && spec.default !== '') editor.setParam(part.id, spec.name, spec.default);
      else if (e.code === 'bad-value' && part) editor.setParam(part.id, e.field!, '');
      else if (e.code === 'unconnected-pin' && e.pin && r() < 0.5) {
        const from = placedPins(part).find((q) => q.name === e.pin)!;
        const others = Object.values(editor.document.parts).filter((q) => q.id !== part.id).flatMap((q) => placedPins(q));
        if (others.length === 0) return 'fix (no pin to wire to)';
        const to = pickOf(r, others);
        d.key('Escape').key('c').click(from.x, from.y).move(to.x, to.y).click(to.x, to.y).key('Enter').key('Escape');
      } else { d.key('Escape'); editor.select([e.part!]); d.key('Delete'); }
      return `fix ${e.code} at ${part?.ref}`;
    }
    case 'interrupt': {
      // A gesture cut short by a key (undo, redo, Escape, a tool key) before the release.
      const p = randomPart(c);
      const from = p && r() < 0.7 ? (r() < 0.5 ? { x: p.x, y: p.y } : pickOf(r, placedPins(p))) : gridPoint(r);
      const to = gridPoint(r);
      d.key('Escape');
      if (r() < 0.3) d.key('c');
      d.move(from.x, from.y).down(from.x, from.y).move((from.x + to.x) / 2, (from.y + to.y) / 2);
      const key = pickOf(r, ['z', 'y', 'Escape', 'c', 's', '3', 'Delete', 't']);
      d.key(key, key === 'z' || key === 'y' ? { ctrl: true } : {});
      d.move(to.x, to.y).up(to.x, to.y).key('Escape');
      return `gesture from ${from.x},${from.y} cut by ${key}`;
    }
    case 'wire': {
      const a = wirePoint(c), b = wirePoint(c);
      d.key('Escape').key('c').click(a.x, a.y).move(b.x, b.y).click(b.x, b.y).key('Enter').key('Escape');
      return `wire ${a.x},${a.y} → ${b.x},${b.y}`;
    }
    case 'delete': {
      const ids = randomItems(c, 3);
      editor.select(ids);
      d.key(r() < 0.5 ? 'Delete' : 'Backspace');
      return `delete ${ids.join(' ')}`;
    }
    case 'value': {
      const p = randomPart(c);
      if (!p) return 'value (no part)';
      const names = symbolOf(p.kind).params.map((s) => s.name);
      const name = names.length && r() < 0.9 ? pickOf(r, names) : 'bogus';
      const text = r() < 0.45 ? pickOf(r, ABSURD) : pickOf(r, SENSIBLE);
      editor.setParam(p.id, name, text);
      return `set ${p.ref}.${name} = ${JSON.stringify(text.slice(0, 20))}`;
    }
    case 'turn': {
      const ids = randomItems(c, 2);
      editor.select(ids);
      const key = pickOf(r, ['t', 'T', 'f']);
      d.key(key, key === 'T' ? { shift: true } : {});
      return `turn ${key} ${ids.join(' ')}`;
    }
    case 'undo':
      d.key('z', { ctrl: true });
      return 'undo';
    case 'redo':
      if (r() < 0.5) d.key('z', { ctrl: true, shift: true });
      else d.key('y', { ctrl: true });
      return 'redo';
    case 'move': {
      const p = randomPart(c);
      if (!p) return 'move (no part)';
      const to = gridPoint(r);
      d.key('Escape').drag([p.x, p.y], [to.x, to.y]);
      return `drag ${p.ref} to ${to.x},${to.y}`;
    }
    case 'nudge': {
      editor.select(randomItems(c, 3));
      d.key(pickOf(r, ['ArrowLeft', 'ArrowRight', 'ArrowUp', 'ArrowDown']));
      return 'nudge';
    }
    case 'duplicate':
      editor.select(randomItems(c, 3));
      d.key('d');
      return 'duplicate';
    case 'copyPaste': {
      editor.select(randomItems(c, 4));
      const cut = r() < 0.3;
      d.key(cut ? 'x' : 'c', { ctrl: true });
      const at = gridPoint(r);
      d.move(at.x, at.y).key('v', { ctrl: true });
      return `${cut ? 'cut' : 'copy'} and paste at ${at.x},${at.y}`;
    }
    case 'field': {
      const p = randomPart(c);
      if (!p) return 'field (no part)';
      const u = r();
      if (u < 0.25) editor.updatePart(p.id, { mode: r() < 0.5 ? 'bias' : 'direct' });
      else if (u < 0.5) editor.updatePart(p.id, { bulk: pickOf(r, ['pin', 'source', 'rail'] as const) });
      else if (u < 0.75) editor.updatePart(p.id, { isInput: r() < 0.6 });
      else editor.updatePart(p.id, { rotation: pickOf(r, [0, 90, 180, 270] as Rotation[]), mirror: r() < 0.5 });
      return `field of ${p.ref}`;
    }
    case 'rename': {
      const p = randomPart(c);
      if (!p) return 'rename (no part)';
      const other = randomPart(c);
      const ref = r() < 0.4 && other ? other.ref : pickOf(r, REFS);
      editor.setRef(p.id, ref);
      return `rename ${p.ref} → ${JSON.stringify(ref.slice(0, 20))}`;
    }
    case 'pasteText': {
      const ids = randomItems(c, 3);
      const good = serializeClip(clipOf(editor.document, ids));
      const text = r() < 0.5 ? good : pickOf(r, [good.slice(0, Math.floor(good.length / 2)), 'hello', '{}', good.replace(/"x":\s*-?\d+/, '"x": "left"')]);
      d.send({ type: 'paste', text, at: r() < 0.5 ? gridPoint(r) : undefined });
      return 'paste text';
    }
    case 'open': {
      // What the app does with a picked file (src/panels/browserHost.ts): load only when valid.
      const text = r() < 0.8 ? pickOf(r, MALFORMED_FILES)
        : r() < 0.5 ? saveDrawing(pickOf(r, EXAMPLE_DRAWINGS).load())
        : saveDrawing(editor.document).slice(0, 40 + Math.floor(r() * 200));
      const loaded = loadDrawing(text);
      if (loaded.ok) editor.load(loaded.doc, { label: 'Open file' });
      else c.refused = loaded.reason;
      return `open file (${loaded.ok ? 'opened' : 'refused'})`;
    }
    case 'noise': {
      const u = r();
      const at = gridPoint(r);
      if (u < 0.2) d.send({ type: 'wheel', sx: at.x, sy: at.y, deltaY: (r() - 0.5) * 1e6 });
      else if (u < 0.4) d.down(at.x, at.y, { button: pickOf(r, [0, 1, 2] as const) }).move(at.x + 1e6, at.y - 1e6).send({ type: 'pointerLeave' }).up(at.x, at.y);
      else if (u < 0.6) d.send({ type: 'doubleClick', x: at.x, y: at.y });
      else if (u < 0.8) d.key(pickOf(r, KEYS), { shift: r() < 0.2 });
      else d.send({ type: 'viewport', width: Math.floor(r() * 2000), height: Math.floor(r() * 2000) }).key('h');
      return `noise ${u.toFixed(2)}`;
    }
  }
}

export type { PartId };
