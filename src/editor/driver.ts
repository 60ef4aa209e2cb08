// A small driver that sends plain events to an editor, for tests and scripted demos (no DOM).
// Coordinates are world units; the camera is taken into account for the screen positions.

import type { Editor, EditorEvent, Modifiers, ModeName } from './types';

export interface Driver {
  editor: Editor;
  move(x: number, y: number, mods?: Modifiers): Driver;
  down(x: number, y: number, mods?: Modifiers & { button?: 0 | 1 | 2 }): Driver;
  up(x: number, y: number, mods?: Modifiers & { button?: 0 | 1 | 2 }): Driver;
  click(x: number, y: number, mods?: Modifiers): Driver;
  /** Press at `from`, move in `steps` steps to `to`, release. */
  drag(from: [number, number], to: [number, number], mods?: Modifiers & { button?: 0 | 1 | 2 }, steps?: number): Driver;
  key(key: string, mods?: Modifiers): Driver;
  send(ev: EditorEvent): Driver;
  /** Throws when the editor is not in the given mode. */
  expectState(mode: ModeName): Driver;
}

export function drive(editor: Editor): Driver {
  const screen = (x: number, y: number) => ({ sx: x * editor.camera.scale + editor.camera.x, sy: y * editor.camera.scale + editor.camera.y });
  const d: Driver = {
    editor,
    move: (x, y, mods = {}) => d.send({ type: 'pointerMove', x, y, ...screen(x, y), ...mods }),
    down: (x, y, mods = {}) => d.send({ type: 'pointerDown', x, y, ...screen(x, y), button: 0, ...mods }),
    up: (x, y, mods = {}) => d.send({ type: 'pointerUp', x, y, ...screen(x, y), button: 0, ...mods }),
    click: (x, y, mods = {}) => d.move(x, y, mods).down(x, y, mods).up(x, y, mods),
    drag(from, to, mods = {}, steps = 4) {
      d.move(from[0], from[1], mods).down(from[0], from[1], mods);
      for (let i = 1; i <= steps; i++) {
        const x = from[0] + ((to[0] - from[0]) * i) / steps;
        const y = from[1] + ((to[1] - from[1]) * i) / steps;
        d.move(x, y, mods);
      }
      return d.up(to[0], to[1], mods);
    },
    key: (key, mods = {}) => d.send({ type: 'key', key, ...mods }),
    send(ev) {
      editor.dispatch(ev);
      return d;
    },
    expectState(mode) {
      if (editor.state.mode !== mode) throw new Error(`expected editor state ${mode}, got ${editor.state.mode}`);
      return d;
    },
  };
  return d;
}
