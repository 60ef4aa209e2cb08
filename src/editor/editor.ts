// The editor: document history, selection, camera and the tool state machine behind one
// event-driven object. The UI forwards plain events (world coordinates) and renders `state`.

import type { DrawingDocument, ItemId, PartId, PartRecord, SymbolKind } from '../schematic/document';
import { emptyDocument, isPartId, snap } from '../schematic/document';
import { History } from '../schematic/history';
import { checkRef, newPart, newPartId, nextRef } from '../schematic/kinds';
import { DEFAULT_CAMERA, fitToView, wheelZoom, zoomAt, type Camera } from '../canvas/camera';
import { clipOf, clipOrigin, freeOffset, insertClip, parseClip, serializeClip, type Clip } from './clipboard';
import { COMMANDS_BY_ID, commandForKey, type EditorActions } from './commands';
import { deleteItems, flipItems, moveItems, reorientPart, turnItems } from './edits';
import { boundsOf } from './geometry';
import { handlePointer, type ToolContext, type ToolData } from './tools';
import type { Editor, EditorEvent, EditorHost, EditorState, ModeName } from './types';

/** Modes that hold a pointer gesture's data (ToolData press / move / wire). */
const GESTURE_MODES: ReadonlySet<ModeName> = new Set<ModeName>(['select.pointing', 'select.moving', 'select.boxing', 'wire.drawing']);

const INITIAL_STATE: EditorState = {
  mode: 'select.idle', tool: 'select', cursor: null, hover: { type: 'none' }, ghost: null,
  wirePreview: null, box: null, notice: null, helpOpen: false,
};

export function createEditor(initial?: DrawingDocument, opts: { host?: EditorHost } = {}): Editor & { actions: EditorActions } {
  const history = new History(initial ?? emptyDocument());
  let state: EditorState = INITIAL_STATE;
  let selection: ReadonlySet<ItemId> = new Set();
  let camera: Camera = DEFAULT_CAMERA;
  let viewport = { width: 800, height: 600 };
  let host: EditorHost = opts.host ?? {};
  let clip: Clip | null = null;
  const data: ToolData = {};
  const listeners = new Set<() => void>();
  let batching = false;
  let dirty = false;
  const emit = () => {
    if (batching) { dirty = true; return; }
    for (const fn of [...listeners]) fn();
  };
  history.subscribe(emit);

  const setState = (patch: Partial<EditorState>) => {
    state = { ...state, ...patch };
    emit();
  };
  const setSelection = (ids: Iterable<ItemId>) => {
    const doc = history.doc;
    selection = new Set([...ids].filter((id) => id in doc.parts || id in doc.wires));
    emit();
  };
  const pruneSelection = () => {
    const doc = history.doc;
    if ([...selection].some((id) => !(id in doc.parts || id in doc.wires))) setSelection(selection);
  };

  const ctx: ToolContext = {
    get doc() { return history.doc; },
    history,
    get state() { return state; },
    get selection() { return selection; },
    get camera() { return camera; },
    setState,
    setSelection,
    setCamera: (c) => { camera = c; emit(); },
    data,
    placePart: (kind, at, rotation, mirror) => {
      let id: PartId | null = null;
      history.change(`Place ${kind}`, (d) => {
        const doc = d as DrawingDocument;
        const ref = nextRef(doc, kind);
        id = newPartId(doc, ref);
        const part = newPart(kind, id, ref, at, rotation, mirror);
        if ((kind === 'vsource' || kind === 'isource') && !Object.values(doc.parts).some((p) => p.isInput || p.kind === 'input')) part.isInput = true;
        doc.parts[id] = part;
      });
      return id!;
    },
  };

  const cancelGesture = () => {
    if (history.inGesture) history.cancel();
    data.press = undefined;
    data.wire = undefined;
    data.move = undefined;
    // The gesture's data is gone, so its mode goes too (else the next pointer event finds none).
    const idle: ModeName = state.tool === 'wire' ? 'wire.idle' : 'select.idle';
    if (data.pan && GESTURE_MODES.has(data.pan.back)) data.pan.back = idle;
    if (GESTURE_MODES.has(state.mode)) setState({ mode: idle, wirePreview: null, box: null });
  };

  const actions: EditorActions = {
    canUndo: () => history.canUndo,
    canRedo: () => history.canRedo,
    hasSelection: () => selection.size > 0,
    hasClipboard: () => clip !== null,
    isEmpty: () => Object.keys(history.doc.parts).length + Object.keys(history.doc.wires).length === 0,
    undo: () => { cancelGesture(); history.undo(); pruneSelection(); },
    redo: () => { cancelGesture(); history.redo(); pruneSelection(); },
    deleteSelection: () => {
      if (selection.size === 0) return;
      let result = { removedWires: 0, openEnds: 0 };
      const ids = selection;
      history.change('Delete', (d) => { result = deleteItems(d as DrawingDocument, ids); });
      setSelection([]);
      const bits: string[] = [];
      if (result.removedWires) bits.push(`${result.removedWires} wire${result.removedWires > 1 ? 's' : ''} left hanging ${result.removedWires > 1 ? 'were' : 'was'} removed too`);
      if (result.openEnds) bits.push(`${result.openEnds} wire end${result.openEnds > 1 ? 's are' : ' is'} now open (marked on the drawing)`);
      setState({ notice: bits.length ? `Deleted. ${bits.join('; ')}.` : null });
    },
    turn: (q) => {
      if (state.mode === 'place.ghost' && state.ghost) {
        const g = state.ghost;
        setState({ ghost: { ...g, rotation: ((g.rotation + q * 90) % 360) as PartRecord['rotation'] } });
        return;
      }
      if (selection.size === 0 || history.inGesture) return;
      const ids = selection;
      history.change('Turn', (d) => turnItems(d as DrawingDocument, ids, q));
    },
    flip: () => {
      if (state.mode === 'place.ghost' && state.ghost) {
        const g = state.ghost;
        setState({ ghost: { ...g, mirror: !g.mirror, rotation: ((360 - g.rotation) % 360) as PartRecord['rotation'] } });
        return;
      }
      if (selection.size === 0 || history.inGesture) return;
      const ids = selection;
      history.change('Flip', (d) => flipItems(d as DrawingDocument, ids));
    },
    duplicate: () => {
      if (selection.size === 0) return;
      const c = clipOf(history.doc, selection);
      let added: ItemId[] = [];
      const { dx, dy } = freeOffset(history.doc, c);
      history.change('Duplicate', (d) => { added = insertClip(d as DrawingDocument, c, dx, dy); });
      setSelection(added);
    },
    copy: () => {
      if (selection.size === 0) return;
      clip = clipOf(history.doc, selection);
      host.writeClipboard?.(serializeClip(clip));
    },
    cut: () => { actions.copy(); actions.deleteSelection(); },
    paste: () => {
      if (host.requestPaste) host.requestPaste();
      else if (clip) pasteClip(clip);
    },
    nudge: (dx, dy) => {
      if (selection.size === 0 || history.inGesture) return;
      const ids = selection;
      history.change('Nudge', (d) => moveItems(d as DrawingDocument, ids, dx, dy));
    },
    selectAll: () => setSelection([...Object.keys(history.doc.parts), ...Object.keys(history.doc.wires)] as ItemId[]),
    cancel: () => {
      if (state.helpOpen) { setState({ helpOpen: false }); return; }
      const mode = state.mode;
      cancelGesture();
      if (mode === 'wire.drawing') { setState({ mode: state.tool === 'wire' ? 'wire.idle' : 'select.idle', wirePreview: null }); return; }
      if (mode === 'select.idle') { setSelection([]); setState({ notice: null }); return; }
      setState({ mode: 'select.idle', tool: 'select', ghost: null, wirePreview: null, box: null });
    },
    setTool: (tool, kind?: SymbolKind) => {
      cancelGesture();
      if (tool === 'place' && kind) {
        const at = state.cursor ?? { x: 0, y: 0 };
        data.placeOnce = false;
        setState({ tool, mode: 'place.ghost', ghost: { kind, x: at.x, y: at.y, rotation: 0, mirror: false }, wirePreview: null, box: null });
      } else if (tool === 'wire') {
        setState({ tool, mode: 'wire.idle', ghost: null, wirePreview: null, box: null });
      } else {
        setState({ tool: 'select', mode: 'select.idle', ghost: null, wirePreview: null, box: null });
      }
    },
    fitView: () => {
      const b = boundsOf(history.doc);
      ctx.setCamera(fitToView(b, viewport));
    },
    zoom: (f) => ctx.setCamera(zoomAt(camera, { x: viewport.width / 2, y: viewport.height / 2 }, f)),
    toggleHelp: () => setState({ helpOpen: !state.helpOpen }),
    save: () => host.saveFile?.(history.doc),
    open: () => host.openFile?.(),
    tidy: () => host.tidy?.(),
    canTidy: () => !!host.tidy,
  };

  function pasteClip(c: Clip, at?: { x: number; y: number }): void {
    const o = clipOrigin(c);
    const target = at ?? state.cursor;
    const free = freeOffset(history.doc, c);
    const dx = target ? snap(target.x) - o.x : free.dx;
    const dy = target ? snap(target.y) - o.y : free.dy;
    let added: ItemId[] = [];
    history.change('Paste', (d) => { added = insertClip(d as DrawingDocument, c, dx, dy); });
    setSelection(added);
  }

  function dispatch(ev: EditorEvent): boolean {
    batching = true;
    try {
      return handle(ev);
    } finally {
      batching = false;
      if (dirty) { dirty = false; emit(); }
    }
  }

  function handle(ev: EditorEvent): boolean {
    switch (ev.type) {
      case 'key': {
        if (state.mode === 'wire.drawing' && ['Enter', 'Escape', 'Backspace'].includes(ev.key)) return handlePointer(ctx, ev);
        const cmd = commandForKey(ev);
        if (!cmd) return handlePointer(ctx, ev);
        if (!cmd.enabled(actions)) return false; // let the browser have keys we do not use now
        cmd.run(actions);
        return true;
      }
      case 'command': {
        const cmd = COMMANDS_BY_ID.get(ev.id);
        if (!cmd || !cmd.enabled(actions)) return false;
        cmd.run(actions);
        return true;
      }
      case 'tool':
        actions.setTool(ev.tool, ev.kind);
        if (ev.tool === 'place') data.placeOnce = !!ev.once;
        return true;
      case 'paste': {
        const r = parseClip(ev.text);
        if (!r.ok) { setState({ notice: r.reason }); return false; }
        pasteClip(r.clip, ev.at);
        return true;
      }
      case 'viewport':
        viewport = { width: ev.width, height: ev.height };
        return true;
      case 'wheel':
        ctx.setCamera(wheelZoom(camera, { x: ev.sx, y: ev.sy }, ev.deltaY));
        return true;
      case 'cancel':
        actions.cancel();
        return true;
      default:
        return handlePointer(ctx, ev);
    }
  }

  return {
    get state() { return state; },
    get document() { return history.doc; },
    get selection() { return selection; },
    get camera() { return camera; },
    history,
    actions,
    dispatch,
    subscribe(fn) { listeners.add(fn); return () => { listeners.delete(fn); }; },
    load(doc, o = {}) {
      cancelGesture();
      if (o.record === false) history.replaceUnrecorded(doc);
      else history.replace(o.label ?? 'Open drawing', doc);
      setSelection([]);
      setState({ mode: state.tool === 'wire' ? 'wire.idle' : state.mode === 'place.ghost' ? 'place.ghost' : 'select.idle', wirePreview: null, box: null });
    },
    select: (ids) => setSelection(ids),
    setParam(part, name, text) {
      if (!history.doc.parts[part]) return;
      history.change(`Edit ${name}`, (d) => { (d as DrawingDocument).parts[part].params[name] = text; });
    },
    updatePart(part, patch) {
      if (!history.doc.parts[part]) return;
      history.change('Edit part', (d) => {
        const doc = d as DrawingDocument;
        const p = doc.parts[part];
        const { rotation, mirror, ...rest } = patch;
        if (rotation !== undefined || mirror !== undefined) reorientPart(doc, part, rotation ?? p.rotation, mirror ?? p.mirror);
        for (const [k, v] of Object.entries(rest)) (p as unknown as Record<string, unknown>)[k] = v;
        if (patch.isInput) for (const q of Object.values((d as DrawingDocument).parts)) if (q.id !== part && q.isInput) q.isInput = false;
      });
    },
    setRef(part, ref) {
      if (!isPartId(part) || !history.doc.parts[part]) return { ok: false, reason: `No part ${part}.` };
      const r = checkRef(history.doc, part, ref);
      if (!r.ok) return r;
      history.change('Rename', (d) => { (d as DrawingDocument).parts[part].ref = ref.trim(); });
      return { ok: true };
    },
    setHost(h) { host = h; },
  };
}
