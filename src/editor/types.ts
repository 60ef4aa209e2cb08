// Editor contract: plain event objects in, a renderable state out. The UI forwards pointer and
// key events in WORLD coordinates (plus the screen position for panning) and draws `state`.

import type { DrawingDocument, ItemId, PartId, Point, Rotation, SymbolKind, WireId } from '../schematic/document';
import type { Camera } from '../canvas/camera';

export type { Camera };

export interface Modifiers {
  shift?: boolean;
  ctrl?: boolean;
  alt?: boolean;
  meta?: boolean;
}

/** 0 = primary, 1 = middle, 2 = secondary (DOM MouseEvent.button numbering). */
export type Button = 0 | 1 | 2;

export type EditorEvent =
  | ({ type: 'pointerDown'; x: number; y: number; sx?: number; sy?: number; button?: Button; detail?: number } & Modifiers)
  | ({ type: 'pointerMove'; x: number; y: number; sx?: number; sy?: number } & Modifiers)
  | ({ type: 'pointerUp'; x: number; y: number; sx?: number; sy?: number; button?: Button } & Modifiers)
  /** Leaving the canvas: hover and previews go away, a gesture in progress is kept. */
  | { type: 'pointerLeave' }
  /** Double click (finishes a wire). */
  | ({ type: 'doubleClick'; x: number; y: number } & Modifiers)
  /** Wheel: zoom to the cursor; sx, sy = cursor in screen pixels. */
  | ({ type: 'wheel'; sx: number; sy: number; deltaY: number } & Modifiers)
  /** Key down; `key` as DOM KeyboardEvent.key. Returns handled = true when a command ran. */
  | ({ type: 'key'; key: string } & Modifiers)
  /** Run a command by id (menus, buttons). */
  | { type: 'command'; id: string }
  /** Choose a tool; `kind` for the place tool. `once`: go back to select after one placement
   *  (used for drag-from-palette, which then sends pointerMove / pointerUp over the canvas). */
  | { type: 'tool'; tool: 'select' | 'wire' | 'place'; kind?: SymbolKind; once?: boolean }
  /** Paste text read from the system clipboard (or another tab via storage). */
  | { type: 'paste'; text: string; at?: Point }
  /** Canvas size in screen pixels (for fit-to-view). */
  | { type: 'viewport'; width: number; height: number }
  | { type: 'cancel' };

/** Things under the pointer. */
export type HitTarget =
  | { type: 'pin'; part: PartId; pin: string; x: number; y: number }
  | { type: 'part'; part: PartId }
  | { type: 'wire'; wire: WireId; segment: number }
  | { type: 'none' };

/** Dotted mode names, e.g. 'select.idle', 'select.pointing', 'select.moving', 'select.boxing',
 *  'place.ghost', 'wire.idle', 'wire.drawing', 'pan.dragging'. */
export type ModeName =
  | 'select.idle'
  | 'select.pointing'
  | 'select.moving'
  | 'select.boxing'
  | 'place.ghost'
  | 'wire.idle'
  | 'wire.drawing'
  | 'pan.dragging';

export interface Ghost {
  kind: SymbolKind;
  x: number;
  y: number;
  rotation: Rotation;
  mirror: boolean;
}

export interface EditorState {
  mode: ModeName;
  tool: 'select' | 'wire' | 'place';
  /** Snapped pointer position (world), for cursor crosshair and previews. */
  cursor: Point | null;
  hover: HitTarget;
  /** place tool: the part that follows the pointer. */
  ghost: Ghost | null;
  /** wire tool: the polyline being drawn (committed points + automatic elbow to the cursor). */
  wirePreview: Point[] | null;
  /** select tool: rubber-band box (world). */
  box: { x: number; y: number; width: number; height: number } | null;
  /** A message for the user after an edit (e.g. wires left open by a deletion); null when none. */
  notice: string | null;
  /** Help overlay visible. */
  helpOpen: boolean;
}

export interface Selection {
  readonly ids: ReadonlySet<ItemId>;
}

/** Callbacks the UI can provide for commands that need the browser (files, clipboard). */
export interface EditorHost {
  writeClipboard?(text: string): void;
  requestPaste?(): void;
  saveFile?(doc: DrawingDocument): void;
  openFile?(): void;
  /** Tidy layout of the selection or the whole drawing (src/export/browserExport.ts editorTidy). */
  tidy?(): void;
}

export interface Editor {
  readonly state: EditorState;
  readonly document: DrawingDocument;
  readonly selection: ReadonlySet<ItemId>;
  readonly camera: Camera;
  readonly history: import('../schematic/history').History;
  /** Returns true when the event was used (the UI may then preventDefault). */
  dispatch(ev: EditorEvent): boolean;
  /** Called after every change of state, document, selection or camera. */
  subscribe(fn: () => void): () => void;
  /** Replace the whole document (open file, example); one undoable entry unless record = false. */
  load(doc: DrawingDocument, opts?: { record?: boolean; label?: string }): void;
  select(ids: Iterable<ItemId>): void;
  /** Edit a part's parameter text; the text is kept even when invalid. One undo entry. */
  setParam(part: PartId, name: string, text: string): void;
  /** Edit other part fields (bulk, mode, isInput, rotation, mirror). One undo entry. */
  updatePart(part: PartId, patch: Partial<Pick<import('../schematic/document').PartRecord, 'bulk' | 'mode' | 'isInput' | 'rotation' | 'mirror' | 'pinned'>>): void;
  /** Rename a reference designator; refused (ok: false + reason) when empty, malformed or taken. */
  setRef(part: PartId, ref: string): { ok: true } | { ok: false; reason: string };
  setHost(host: EditorHost): void;
}
