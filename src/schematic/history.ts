// Undo / redo on immer patches. Every recorded change is one entry; a gesture (a drag) is opened
// with begin(), changed any number of times (unrecorded while open) and closed with end(), which
// stores ONE entry holding the net change from the gesture start; cancel() restores the start.

import { applyPatches, enablePatches, produceWithPatches, type Draft, type Patch } from 'immer';
import type { DrawingDocument } from './document';

enablePatches();

export interface HistoryEntry {
  label: string;
  patches: Patch[];
  inverse: Patch[];
}

type Listener = () => void;

export class History {
  private current: DrawingDocument;
  private past: HistoryEntry[] = [];
  private future: HistoryEntry[] = [];
  private gesture: { label: string; start: DrawingDocument } | null = null;
  private listeners = new Set<Listener>();

  constructor(doc: DrawingDocument) {
    this.current = doc;
  }

  get doc(): DrawingDocument {
    return this.current;
  }
  get canUndo(): boolean {
    return this.gesture === null && this.past.length > 0;
  }
  get canRedo(): boolean {
    return this.gesture === null && this.future.length > 0;
  }
  get inGesture(): boolean {
    return this.gesture !== null;
  }
  get undoLabel(): string | undefined {
    return this.past[this.past.length - 1]?.label;
  }
  get redoLabel(): string | undefined {
    return this.future[this.future.length - 1]?.label;
  }
  get size(): { undo: number; redo: number } {
    return { undo: this.past.length, redo: this.future.length };
  }

  subscribe(fn: Listener): () => void {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  }
  private emit(): void {
    for (const fn of this.listeners) fn();
  }

  /** Apply a change. Outside a gesture it is one undo entry (none if nothing changed); inside a
   *  gesture it only updates the document until end(). */
  change(label: string, recipe: (draft: Draft<DrawingDocument>) => void): void {
    const [next, patches, inverse] = produceWithPatches(this.current, recipe);
    if (patches.length === 0) return;
    this.current = next;
    if (!this.gesture) {
      this.past.push({ label, patches, inverse });
      this.future = [];
    }
    this.emit();
  }

  /** Replace the document without recording (restore after reload, gesture previews). */
  replaceUnrecorded(doc: DrawingDocument): void {
    this.current = doc;
    this.emit();
  }

  /** Replace the whole document as one undoable entry (open a file, load an example). */
  replace(label: string, doc: DrawingDocument): void {
    this.change(label, (draft) => {
      const d = draft as unknown as Record<string, unknown>;
      for (const k of Object.keys(d)) if (!(k in doc)) delete d[k];
      for (const [k, v] of Object.entries(doc)) d[k] = v;
    });
  }

  begin(label: string): void {
    if (this.gesture) this.end();
    this.gesture = { label, start: this.current };
  }

  /** Close the gesture as one entry: the net difference between its start and now. */
  end(): void {
    const g = this.gesture;
    if (!g) return;
    this.gesture = null;
    const final = this.current;
    if (final === g.start) return;
    const [next, patches, inverse] = produceWithPatches(g.start, (draft) => copyChanges(draft, g.start, final));
    this.current = next;
    if (patches.length > 0) {
      this.past.push({ label: g.label, patches, inverse });
      this.future = [];
    }
    this.emit();
  }

  /** Abandon the gesture: the document goes back to how it was at begin(). */
  cancel(): void {
    const g = this.gesture;
    if (!g) return;
    this.gesture = null;
    this.current = g.start;
    this.emit();
  }

  undo(): boolean {
    if (this.gesture) this.cancel();
    const e = this.past.pop();
    if (!e) return false;
    this.current = applyPatches(this.current, e.inverse);
    this.future.push(e);
    this.emit();
    return true;
  }

  redo(): boolean {
    if (this.gesture) this.cancel();
    const e = this.future.pop();
    if (!e) return false;
    this.current = applyPatches(this.current, e.patches);
    this.past.push(e);
    this.emit();
    return true;
  }

  /** Forget all entries (after opening a document the user does not want to undo into). */
  clear(): void {
    this.past = [];
    this.future = [];
    this.gesture = null;
    this.emit();
  }
}

/** Write into `draft` (a draft of `from`) the records that differ in `to`, per id in parts and
 *  wires and per key elsewhere, so the patches stay as small as the change. */
function copyChanges(draft: Draft<DrawingDocument>, from: DrawingDocument, to: DrawingDocument): void {
  const d = draft as unknown as Record<string, unknown>;
  const f = from as unknown as Record<string, unknown>;
  const t = to as unknown as Record<string, unknown>;
  for (const key of new Set([...Object.keys(f), ...Object.keys(t)])) {
    if (f[key] === t[key]) continue;
    if (!(key in t)) {
      delete d[key];
    } else if ((key === 'parts' || key === 'wires') && f[key] && t[key]) {
      const dr = d[key] as Record<string, unknown>;
      const fr = f[key] as Record<string, unknown>;
      const tr = t[key] as Record<string, unknown>;
      for (const id of Object.keys(fr)) if (!(id in tr)) delete dr[id];
      for (const [id, rec] of Object.entries(tr)) if (fr[id] !== rec) dr[id] = rec;
    } else {
      d[key] = t[key];
    }
  }
}
