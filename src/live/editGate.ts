// A committed edit and its analysis painted in the same frame. At each editor change the drawing
// goes to the live store at once (the worker starts before the page renders anything); when that
// started a worker run, the page's render of the edit waits until the run's first stage arrives
// (or EDIT_HOLD_MS pass), so the frame that shows the edit also shows its new colours and
// badges, never the new value beside the old figures. Meanwhile the page thread is idle and the
// worker has the processor to itself (on a 2-core machine the two otherwise slow each other
// down). Drags are never held: the part follows the pointer and the figures follow (throttled).
import type { Editor } from '../editor/types';
import type { DrawingDocument } from '../schematic/document';
import { arrivals, perfNow } from './perfMarks';
import type { LiveStore } from './types';

/** Longest wait of the edit's render for its analysis (ms): two 60 Hz frames. */
export const EDIT_HOLD_MS = 32;

type EditorSource = Pick<Editor, 'subscribe' | 'document' | 'state'>;

export interface EditGateOptions {
  holdMs?: number;
  /** Timer (tests pass their own). */
  later?: (fn: () => void, ms: number) => unknown;
  cancel?: (t: unknown) => void;
}

/** A subscribe function for useSyncExternalStore over the editor: it submits every new drawing to
 *  the store first, then tells React, holding document changes as described above. */
export function gatedEditorSubscribe(editor: EditorSource, store: LiveStore, opts: EditGateOptions = {}) {
  const holdMs = opts.holdMs ?? EDIT_HOLD_MS;
  const later = opts.later ?? ((fn: () => void, ms: number) => setTimeout(fn, ms));
  const cancel = opts.cancel ?? ((t: unknown) => clearTimeout(t as ReturnType<typeof setTimeout>));
  return (notify: () => void) => {
    let shown: DrawingDocument = editor.document;
    let timer: unknown = null;
    let offStore: (() => void) | null = null;
    const release = () => {
      if (timer !== null) cancel(timer);
      timer = null;
      offStore?.();
      offStore = null;
      shown = editor.document;
      notify();
    };
    const offEditor = editor.subscribe(() => {
      const doc = editor.document;
      const drag = editor.state.mode === 'select.moving';
      if (store.getState().doc !== doc) {
        arrivals.edit = perfNow();
        store.actions.submit(doc, { drag });
      }
      if (timer !== null) return; // held: the release shows this change too
      const s = store.getState();
      const waiting = doc !== shown && !drag && s.runner === 'worker' && s.doc === doc && s.status === 'busy' && s.stage === 0;
      if (!waiting) { shown = doc; notify(); return; }
      let runId = s.runId;
      timer = later(release, holdMs);
      offStore = store.subscribe(() => {
        const t = store.getState();
        if (t.runId === runId && t.stage === 0 && t.status === 'busy') return;
        // a newer edit during the hold: wait for its run instead, within the same deadline
        if (t.runId !== runId && t.doc === editor.document && t.stage === 0 && t.status === 'busy') { runId = t.runId; return; }
        release();
      });
    });
    return () => {
      offEditor();
      if (timer !== null) cancel(timer);
      offStore?.();
    };
  };
}
