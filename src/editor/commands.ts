// The one command registry: id, label, shortcut, enabled-when, run. Menus, the keyboard handler
// and the help overlay all read COMMANDS, so the key map is written once, here.
//
// Our key scheme: single letters for the frequent drawing actions (c = connect with a wire,
// t = turn, f = flip, d = duplicate, h = home/fit), digits pick a part to place, the usual
// system modifiers for clipboard, undo, save and open. "Mod" is Ctrl (Cmd on macOS).

import type { SymbolKind } from '../schematic/document';
import type { Modifiers } from './types';

/** What a command may do; implemented by the editor (editor.ts). */
export interface EditorActions {
  canUndo(): boolean;
  canRedo(): boolean;
  hasSelection(): boolean;
  hasClipboard(): boolean;
  isEmpty(): boolean;
  undo(): void;
  redo(): void;
  deleteSelection(): void;
  turn(quarterTurns: 1 | 3): void;
  flip(): void;
  duplicate(): void;
  copy(): void;
  cut(): void;
  paste(): void;
  selectAll(): void;
  /** Move the selection by a grid step (wires follow). */
  nudge(dx: number, dy: number): void;
  cancel(): void;
  setTool(tool: 'select' | 'wire' | 'place', kind?: SymbolKind): void;
  fitView(): void;
  zoom(factor: number): void;
  toggleHelp(): void;
  save(): void;
  open(): void;
  /** Tidy layout (src/layout/tidy.ts tidyEditor): the selection, or the whole drawing; one undo step. */
  tidy?(): void;
  /** The tidy action is available (the host provides it); without this, `tidy` being set is enough. */
  canTidy?(): boolean;
}

export type CommandGroup = 'Tools' | 'Place' | 'Edit' | 'View' | 'File' | 'Help';

export interface Command {
  id: string;
  label: string;
  group: CommandGroup;
  /** Shortcuts like 'c', 'Shift+T', 'Mod+Z', 'Delete'; the first one is shown in menus. */
  shortcuts: string[];
  enabled(a: EditorActions): boolean;
  run(a: EditorActions): void;
}

const always = (): boolean => true;

function placeCommand(kind: SymbolKind, label: string, key: string): Command {
  return {
    id: `place.${kind}`, label: `Place ${label}`, group: 'Place', shortcuts: [key],
    enabled: always, run: (a) => a.setTool('place', kind),
  };
}

export const COMMANDS: readonly Command[] = [
  { id: 'tool.select', label: 'Select and move', group: 'Tools', shortcuts: ['s'], enabled: always, run: (a) => a.setTool('select') },
  { id: 'tool.wire', label: 'Connect (draw wire)', group: 'Tools', shortcuts: ['c'], enabled: always, run: (a) => a.setTool('wire') },
  { id: 'edit.cancel', label: 'Cancel / back to select', group: 'Tools', shortcuts: ['Escape'], enabled: always, run: (a) => a.cancel() },
  placeCommand('resistor', 'resistor', '1'),
  placeCommand('capacitor', 'capacitor', '2'),
  placeCommand('nmos', 'nMOS', '3'),
  placeCommand('pmos', 'pMOS', '4'),
  placeCommand('ground', 'ground', '5'),
  placeCommand('supply', 'supply rail', '6'),
  placeCommand('netLabel', 'net label', '7'),
  placeCommand('isource', 'current source', '8'),
  placeCommand('output', 'output marker', '9'),
  placeCommand('input', 'input marker', '0'),
  { id: 'edit.turn', label: 'Turn 90° clockwise', group: 'Edit', shortcuts: ['t'], enabled: always, run: (a) => a.turn(1) },
  { id: 'edit.turnBack', label: 'Turn 90° counter-clockwise', group: 'Edit', shortcuts: ['Shift+T'], enabled: always, run: (a) => a.turn(3) },
  { id: 'edit.flip', label: 'Flip (mirror)', group: 'Edit', shortcuts: ['f'], enabled: always, run: (a) => a.flip() },
  { id: 'edit.delete', label: 'Delete', group: 'Edit', shortcuts: ['Delete', 'Backspace'], enabled: (a) => a.hasSelection(), run: (a) => a.deleteSelection() },
  { id: 'edit.duplicate', label: 'Duplicate', group: 'Edit', shortcuts: ['d'], enabled: (a) => a.hasSelection(), run: (a) => a.duplicate() },
  { id: 'edit.copy', label: 'Copy', group: 'Edit', shortcuts: ['Mod+C'], enabled: (a) => a.hasSelection(), run: (a) => a.copy() },
  { id: 'edit.cut', label: 'Cut', group: 'Edit', shortcuts: ['Mod+X'], enabled: (a) => a.hasSelection(), run: (a) => a.cut() },
  { id: 'edit.paste', label: 'Paste', group: 'Edit', shortcuts: ['Mod+V'], enabled: always, run: (a) => a.paste() },
  { id: 'edit.undo', label: 'Undo', group: 'Edit', shortcuts: ['Mod+Z'], enabled: (a) => a.canUndo(), run: (a) => a.undo() },
  { id: 'edit.redo', label: 'Redo', group: 'Edit', shortcuts: ['Mod+Shift+Z', 'Mod+Y'], enabled: (a) => a.canRedo(), run: (a) => a.redo() },
  { id: 'edit.nudgeLeft', label: 'Nudge left one grid step', group: 'Edit', shortcuts: ['ArrowLeft'], enabled: (a) => a.hasSelection(), run: (a) => a.nudge(-10, 0) },
  { id: 'edit.nudgeRight', label: 'Nudge right one grid step', group: 'Edit', shortcuts: ['ArrowRight'], enabled: (a) => a.hasSelection(), run: (a) => a.nudge(10, 0) },
  { id: 'edit.nudgeUp', label: 'Nudge up one grid step', group: 'Edit', shortcuts: ['ArrowUp'], enabled: (a) => a.hasSelection(), run: (a) => a.nudge(0, -10) },
  { id: 'edit.nudgeDown', label: 'Nudge down one grid step', group: 'Edit', shortcuts: ['ArrowDown'], enabled: (a) => a.hasSelection(), run: (a) => a.nudge(0, 10) },
  { id: 'edit.selectAll', label: 'Select all', group: 'Edit', shortcuts: ['Mod+A'], enabled: (a) => !a.isEmpty(), run: (a) => a.selectAll() },
  { id: 'layout.tidy', label: 'Tidy layout (selection or all)', group: 'Edit', shortcuts: ['Shift+L'], enabled: (a) => (a.canTidy ? a.canTidy() : !!a.tidy) && !a.isEmpty(), run: (a) => a.tidy?.() },
  { id: 'view.fit', label: 'Fit drawing to view', group: 'View', shortcuts: ['h'], enabled: always, run: (a) => a.fitView() },
  { id: 'view.zoomIn', label: 'Zoom in', group: 'View', shortcuts: ['=', '+'], enabled: always, run: (a) => a.zoom(1.25) },
  { id: 'view.zoomOut', label: 'Zoom out', group: 'View', shortcuts: ['-'], enabled: always, run: (a) => a.zoom(0.8) },
  { id: 'file.save', label: 'Save drawing…', group: 'File', shortcuts: ['Mod+S'], enabled: always, run: (a) => a.save() },
  { id: 'file.open', label: 'Open drawing…', group: 'File', shortcuts: ['Mod+O'], enabled: always, run: (a) => a.open() },
  { id: 'help.toggle', label: 'Show / hide shortcuts', group: 'Help', shortcuts: ['?'], enabled: always, run: (a) => a.toggleHelp() },
];

export const COMMANDS_BY_ID: ReadonlyMap<string, Command> = new Map(COMMANDS.map((c) => [c.id, c]));

interface ParsedShortcut {
  key: string;
  mod: boolean;
  shift: boolean;
  alt: boolean;
}

export function parseShortcut(s: string): ParsedShortcut {
  const parts = s.split('+');
  // a trailing '+' key (e.g. '+', 'Mod++') leaves empty strings
  let key = parts[parts.length - 1];
  if (key === '' && s.endsWith('+')) key = '+';
  const mods = new Set(parts.slice(0, key === '+' && s !== '+' ? -2 : -1));
  return { key, mod: mods.has('Mod'), shift: mods.has('Shift'), alt: mods.has('Alt') };
}

/** Does a key event match a shortcut? Letters and named keys compare Shift; symbol characters
 *  ('?', '+') already carry the Shift in the character, so Shift is ignored for them. */
export function matchesShortcut(ev: { key: string } & Modifiers, shortcut: string): boolean {
  const p = parseShortcut(shortcut);
  const mod = !!(ev.ctrl || ev.meta);
  if (mod !== p.mod || !!ev.alt !== p.alt) return false;
  const isSymbol = p.key.length === 1 && !/[a-z0-9]/i.test(p.key);
  if (!isSymbol && !!ev.shift !== p.shift) return false;
  return ev.key.toLowerCase() === p.key.toLowerCase();
}

export function commandForKey(ev: { key: string } & Modifiers): Command | undefined {
  return COMMANDS.find((c) => c.shortcuts.some((s) => matchesShortcut(ev, s)));
}

/** Shortcut text for display ('Mod' shown as Ctrl or ⌘). */
export function shortcutLabel(s: string, mac = false): string {
  return s.replace('Mod', mac ? '⌘' : 'Ctrl');
}

/** Rows of the help overlay, grouped. */
export function helpRows(mac = false): { group: CommandGroup; label: string; keys: string[] }[] {
  return COMMANDS.map((c) => ({ group: c.group, label: c.label, keys: c.shortcuts.map((s) => shortcutLabel(s, mac)) }));
}
