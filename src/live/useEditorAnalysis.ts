// Wires an editor to a live analysis store: every document change is submitted (drags throttled),
// the wire under the pointer becomes the hovered net, and the overlay's data is derived once here
// for the canvas layer, the HTML marks and the legend.
import { useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import type { Editor } from '../editor/types';
import { liveAnnotations } from './annotateLive';
import { createLiveStore } from './store';
import type { LiveStore } from './types';
import { useAnalysis } from './useAnalysis';
import { netOfWire, netsOfPole } from '../canvas/overlayModel';
import { arrivals, perfMeasure, perfNow } from './perfMarks';

/** The given store, or one owned by the calling component (disposed when it unmounts). */
function useOwnedStore(given?: LiveStore): LiveStore {
  const own = useRef<LiveStore | null>(null);
  const [, remake] = useState(0);
  if (!given && !own.current) own.current = createLiveStore();
  useEffect(() => {
    if (given) return;
    return () => {
      // StrictMode runs effects twice: the store is made again on the next render.
      own.current?.actions.dispose();
      own.current = null;
      remake((n) => n + 1);
    };
  }, [given]);
  return given ?? own.current!;
}

export function useEditorAnalysis(editor: Editor, given?: LiveStore) {
  const store = useOwnedStore(given);
  const { state, actions } = useAnalysis(store);
  const doc = editor.document;
  const dragging = editor.state.mode === 'select.moving';

  useEffect(() => {
    if (store.getState().doc !== doc) actions.submit(doc, { drag: dragging });
  }, [store, actions, doc, dragging]);
  // Submit at the edit itself, before React renders it: the worker starts on the new drawing while
  // the page is still drawing the edit (the effect above then finds it submitted).
  useEffect(() => editor.subscribe(() => {
    const d = editor.document;
    if (store.getState().doc === d) return;
    arrivals.edit = perfNow();
    store.actions.submit(d, { drag: editor.state.mode === 'select.moving' });
  }), [editor, store]);
  // edit handed to the store → the page committed its own render of the edit
  useLayoutEffect(() => { if (arrivals.edit > 0) perfMeasure('render-edit', arrivals.edit); }, [doc]);

  const wires = useMemo(() => netOfWire(state.drawing), [state.drawing]);
  const hover = editor.state.hover;
  const pointerNet = hover.type === 'wire' && state.result?.ok ? wires.get(hover.wire) ?? null : null;
  const lastPointerNet = useRef<string | null>(null);
  useEffect(() => {
    if (pointerNet === lastPointerNet.current) return;
    lastPointerNet.current = pointerNet;
    actions.hoverNet(pointerNet);
  }, [actions, pointerNet]);

  // One wire selected on the canvas selects its net.
  const selection = editor.selection;
  const picked = selection.size === 1 ? wires.get([...selection][0]) ?? null : null;
  const lastPicked = useRef<string | null>(null);
  useEffect(() => {
    if (picked === lastPicked.current) return;
    lastPicked.current = picked;
    actions.selectNet(picked);
  }, [actions, picked]);

  const s = state.settings;
  // annotate() reads the result's node table and frequency only: the complete result (same node
  // table, kept by the store) or a feedback stage that leaves the selected loop as it was draw
  // nothing new.
  const selectedLoop = s.selectedLoopId ? state.loops[s.selectedLoopId] : undefined;
  const loopKey = selectedLoop ? JSON.stringify(selectedLoop) : '';
  const ann = useMemo(
    () => {
      const t0 = perfNow();
      const out = liveAnnotations(state);
      perfMeasure('annotate', t0);
      return out;
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [state.doc, state.result?.ok, state.result?.nodes, state.result?.conditions.frequencyHz, loopKey, s.frequencyHz, s.colorMode, s.selectedLoopId],
  );
  // stage-1 arrival → this render committed (React work of the whole tree for the new result)
  useLayoutEffect(() => { if (arrivals.stage1 > 0) perfMeasure('render-stage1', arrivals.stage1); }, [state.result?.nodes]);
  const lit = useMemo(() => {
    const set = new Set(netsOfPole(state.result, s.hoveredPoleIndex));
    if (s.hoveredNet) set.add(s.hoveredNet);
    if (s.selectedNet) set.add(s.selectedNet);
    return set;
  }, [state.result, s.hoveredPoleIndex, s.hoveredNet, s.selectedNet]);

  return { store, state, actions, ann, lit, netOfWire: wires, pointerNet };
}
