// Wires an editor to a live analysis store. useLiveSubmit (in the app) submits every document
// change (drags throttled) and re-renders the app on editor changes, without subscribing to the
// store's state, so a new result does not
// re-render the whole app; useLiveOverlay (in the overlay's own components, src/canvas/LiveOverlay)
// subscribes, derives the overlay's data once (liveView.ts), and keeps the hovered and selected
// net of the store in step with the wire under the pointer and the selected wire.
import { useEffect, useLayoutEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import type { Editor, HitTarget } from '../editor/types';
import type { ItemId } from '../schematic/document';
import { createLiveStore } from './store';
import type { LiveStore } from './types';
import { useAnalysis } from './useAnalysis';
import { liveView } from './liveView';
import { arrivals, perfMeasure } from './perfMarks';
import { gatedEditorSubscribe } from './editGate';

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

/** The store (given, or owned), fed with the editor's document; the calling component re-renders
 *  on every editor change, a committed edit held until its analysis arrives (editGate.ts). */
export function useLiveSubmit(editor: Editor, given?: LiveStore): LiveStore {
  const store = useOwnedStore(given);
  const version = useRef(0);
  const subscribe = useMemo(() => {
    const gated = gatedEditorSubscribe(editor, store);
    return (fn: () => void) => gated(() => { version.current += 1; fn(); });
  }, [editor, store]);
  useSyncExternalStore(subscribe, () => version.current, () => version.current);
  const doc = editor.document;
  const dragging = editor.state.mode === 'select.moving';
  // the first drawing, and any the editor's subscription did not see
  useEffect(() => {
    if (store.getState().doc !== doc) store.actions.submit(doc, { drag: dragging });
  }, [store, doc, dragging]);
  // edit handed to the store → the page committed its own render of the edit
  useLayoutEffect(() => { if (arrivals.edit > 0) perfMeasure('render-edit', arrivals.edit); }, [doc]);
  return store;
}

/** The live state and the overlay's data; the pointer's net (a wire under the pointer with a
 *  result) and the selected wire's net are handed to the store as hovered and selected net. */
export function useLiveOverlay(store: LiveStore, hover: HitTarget, selection: ReadonlySet<ItemId>, track = false) {
  const { state, actions } = useAnalysis(store);
  const view = liveView(state);
  const wires = view.netOfWire;
  const pointerNet = hover.type === 'wire' && state.result?.ok ? wires.get(hover.wire) ?? null : null;
  const picked = selection.size === 1 ? wires.get([...selection][0]) ?? null : null;
  const lastPointerNet = useRef<string | null>(null);
  const lastPicked = useRef<string | null>(null);
  useEffect(() => {
    if (!track || pointerNet === lastPointerNet.current) return;
    lastPointerNet.current = pointerNet;
    actions.hoverNet(pointerNet);
  }, [actions, pointerNet, track]);
  // One wire selected on the canvas selects its net.
  useEffect(() => {
    if (!track || picked === lastPicked.current) return;
    lastPicked.current = picked;
    actions.selectNet(picked);
  }, [actions, picked, track]);
  // stage-1 arrival → this render committed (React work of the overlay for the new result)
  useLayoutEffect(() => { if (track && arrivals.stage1 > 0) perfMeasure('render-stage1', arrivals.stage1); }, [state.result?.nodes, track]);
  return { state, actions, ...view, pointerNet };
}
