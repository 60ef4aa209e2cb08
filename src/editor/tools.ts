// Pointer handling of the tools as a small state machine over `state.mode`:
//   select.idle → select.pointing → select.moving | select.boxing → select.idle
//   place.ghost (the part follows the pointer, placed on release)
//   wire.idle → wire.drawing (click adds a leg with an automatic elbow; ends on a pin or wire,
//   on a double click, Enter or a click on the last point; Escape drops it) → wire.idle
//   select.pointing on a pin of an unselected part + drag → wire.drawing → select.idle
//   any mode → pan.dragging (middle button, or Alt + drag) → back

import { produce } from 'immer';
import type { DrawingDocument, ItemId, PartId, Point, Rotation, SymbolKind, WireId } from '../schematic/document';
import { freshId, samePoint, snap, snapPoint } from '../schematic/document';
import type { History } from '../schematic/history';
import { pan, rectFromCorners, type Camera } from '../canvas/camera';
import { moveItems } from './edits';
import { cleanPolyline, elbowPath, hitTest, isConnectionPoint, itemOfHit, itemsInBox } from './geometry';
import type { EditorEvent, EditorState, ModeName } from './types';

export interface ToolData {
  press?: { start: Point; sx: number; sy: number; item: ItemId | null; shift: boolean; wasSelected: boolean; pin?: Point };
  move?: { startDoc: DrawingDocument; dx: number; dy: number };
  wire?: { points: Point[]; hFirst?: boolean; downS?: { sx: number; sy: number } };
  pan?: { sx: number; sy: number; back: ModeName };
  placeOnce?: boolean;
}

export interface ToolContext {
  readonly doc: DrawingDocument;
  readonly history: History;
  readonly state: EditorState;
  readonly selection: ReadonlySet<ItemId>;
  readonly camera: Camera;
  setState(patch: Partial<EditorState>): void;
  setSelection(ids: Iterable<ItemId>): void;
  setCamera(c: Camera): void;
  data: ToolData;
  placePart(kind: SymbolKind, at: Point, rotation: Rotation, mirror: boolean): PartId;
}

/** Screen pixels the pointer must travel before a press becomes a drag (common practice). */
const DRAG_PIXELS = 3;

const screenOf = (ctx: ToolContext, ev: { x: number; y: number; sx?: number; sy?: number }) => ({
  sx: ev.sx ?? ev.x * ctx.camera.scale + ctx.camera.x,
  sy: ev.sy ?? ev.y * ctx.camera.scale + ctx.camera.y,
});

function hitAt(ctx: ToolContext, p: Point) {
  const tol = Math.max(4, 6 / ctx.camera.scale);
  return hitTest(ctx.doc, p, { pinRadius: tol, wireTolerance: tol });
}

function wirePreview(points: Point[], cursor: Point, hFirst?: boolean): Point[] {
  const last = points[points.length - 1];
  return [...points, ...elbowPath(last, cursor, hFirst).slice(1)];
}

function finishWire(ctx: ToolContext): void {
  const w = ctx.data.wire;
  ctx.data.wire = undefined;
  if (w) {
    const points = cleanPolyline(w.points);
    if (points.length >= 2) {
      ctx.history.change('Draw wire', (d) => {
        const id = freshId('wire', d.wires) as WireId;
        (d as DrawingDocument).wires[id] = { id, points };
      });
    }
  }
  ctx.setState({ mode: idleMode(ctx), wirePreview: null });
}

/** Where wire drawing returns to: the wire tool, or select when the wire was dragged from a pin. */
function idleMode(ctx: ToolContext): ModeName {
  return ctx.state.tool === 'wire' ? 'wire.idle' : 'select.idle';
}

function addWirePoint(ctx: ToolContext, q: Point): void {
  const w = ctx.data.wire!;
  const last = w.points[w.points.length - 1];
  if (samePoint(last, q)) {
    finishWire(ctx);
    return;
  }
  w.points = wirePreview(w.points, q, w.hFirst);
  if (isConnectionPoint(ctx.doc, q) && !samePoint(q, w.points[0])) {
    finishWire(ctx);
    return;
  }
  ctx.setState({ wirePreview: [...w.points] });
}

export function handlePointer(ctx: ToolContext, ev: EditorEvent): boolean {
  const { state, data } = ctx;
  switch (ev.type) {
    case 'pointerLeave':
      ctx.setState({ hover: { type: 'none' }, cursor: null });
      return true;

    case 'pointerDown': {
      const p = { x: ev.x, y: ev.y };
      const s = screenOf(ctx, ev);
      const button = ev.button ?? 0;
      if (button === 1 || (button === 0 && ev.alt)) {
        data.pan = { ...s, back: state.mode === 'pan.dragging' ? 'select.idle' : state.mode };
        ctx.setState({ mode: 'pan.dragging' });
        return true;
      }
      if (state.mode === 'wire.drawing' && (button === 2 || (ev.detail ?? 1) >= 2)) {
        finishWire(ctx);
        return true;
      }
      if (button !== 0) return false;
      if (state.mode === 'select.idle') {
        const hit = hitAt(ctx, p);
        const item = itemOfHit(hit);
        const wasSelected = item !== null && ctx.selection.has(item);
        if (item && ev.shift) {
          const next = new Set(ctx.selection);
          if (wasSelected) next.delete(item);
          else next.add(item);
          ctx.setSelection(next);
        } else if (item && !wasSelected) {
          ctx.setSelection([item]);
        }
        // Dragging from a pin of a part that was not selected draws a wire from that pin.
        const pin = hit.type === 'pin' && !wasSelected && !ev.shift ? { x: hit.x, y: hit.y } : undefined;
        data.press = { start: p, ...s, item, shift: !!ev.shift, wasSelected, pin };
        ctx.setState({ mode: 'select.pointing', notice: null });
        return true;
      }
      if (state.mode === 'wire.idle') {
        const q = snapPoint(p);
        data.wire = { points: [q], downS: s };
        ctx.setState({ mode: 'wire.drawing', wirePreview: [q], cursor: q });
        return true;
      }
      if (state.mode === 'wire.drawing') {
        data.wire!.downS = s;
        addWirePoint(ctx, snapPoint(p));
        return true;
      }
      return state.mode === 'place.ghost';
    }

    case 'pointerMove': {
      const p = { x: ev.x, y: ev.y };
      const q = snapPoint(p);
      const s = screenOf(ctx, ev);
      switch (state.mode) {
        case 'pan.dragging': {
          const pd = data.pan!;
          ctx.setCamera(pan(ctx.camera, s.sx - pd.sx, s.sy - pd.sy));
          pd.sx = s.sx;
          pd.sy = s.sy;
          return true;
        }
        case 'select.pointing': {
          const pr = data.press!;
          if (Math.hypot(s.sx - pr.sx, s.sy - pr.sy) < DRAG_PIXELS) return true;
          if (pr.pin) {
            data.press = undefined;
            ctx.setSelection([]);
            data.wire = { points: [pr.pin], downS: { sx: pr.sx, sy: pr.sy } };
            ctx.setState({ mode: 'wire.drawing', wirePreview: [pr.pin] });
            return handlePointer(ctx, ev);
          }
          if (pr.item && ctx.selection.has(pr.item)) {
            ctx.history.begin('Move');
            data.move = { startDoc: ctx.doc, dx: 0, dy: 0 };
            ctx.setState({ mode: 'select.moving' });
            return handlePointer(ctx, ev);
          }
          ctx.setState({ mode: 'select.boxing', box: rectFromCorners(pr.start, p) });
          return true;
        }
        case 'select.moving': {
          const pr = data.press!;
          const mv = data.move!;
          const dx = snap(p.x - pr.start.x);
          const dy = snap(p.y - pr.start.y);
          if (dx !== mv.dx || dy !== mv.dy) {
            mv.dx = dx;
            mv.dy = dy;
            const ids = ctx.selection;
            ctx.history.replaceUnrecorded(produce(mv.startDoc, (d) => moveItems(d as DrawingDocument, ids, dx, dy)));
          }
          ctx.setState({ cursor: q });
          return true;
        }
        case 'select.boxing':
          ctx.setState({ box: rectFromCorners(data.press!.start, p), cursor: q });
          return true;
        case 'place.ghost':
          ctx.setState({ ghost: { ...state.ghost!, x: q.x, y: q.y }, cursor: q });
          return true;
        case 'wire.drawing': {
          const w = data.wire!;
          const last = w.points[w.points.length - 1];
          w.hFirst = Math.abs(q.x - last.x) >= Math.abs(q.y - last.y);
          ctx.setState({ wirePreview: wirePreview(w.points, q, w.hFirst), cursor: q, hover: hitAt(ctx, p) });
          return true;
        }
        default:
          ctx.setState({ cursor: q, hover: hitAt(ctx, p) });
          return true;
      }
    }

    case 'pointerUp': {
      const p = { x: ev.x, y: ev.y };
      switch (state.mode) {
        case 'pan.dragging': {
          const back = data.pan?.back ?? 'select.idle';
          data.pan = undefined;
          ctx.setState({ mode: back });
          return true;
        }
        case 'select.pointing': {
          const pr = data.press!;
          data.press = undefined;
          if (pr.item && !pr.shift && pr.wasSelected && ctx.selection.size > 1) ctx.setSelection([pr.item]);
          if (!pr.item && !pr.shift) ctx.setSelection([]);
          ctx.setState({ mode: 'select.idle' });
          return true;
        }
        case 'select.moving':
          ctx.history.end();
          data.press = undefined;
          data.move = undefined;
          ctx.setState({ mode: 'select.idle' });
          return true;
        case 'select.boxing': {
          const inBox = itemsInBox(ctx.doc, rectFromCorners(data.press!.start, p));
          ctx.setSelection(data.press!.shift ? [...ctx.selection, ...inBox] : inBox);
          data.press = undefined;
          ctx.setState({ mode: 'select.idle', box: null });
          return true;
        }
        case 'place.ghost': {
          if ((ev.button ?? 0) !== 0) return false;
          const g = state.ghost!;
          const q = snapPoint(p);
          const id = ctx.placePart(g.kind, q, g.rotation, g.mirror);
          if (data.placeOnce) {
            data.placeOnce = false;
            ctx.setSelection([id]);
            ctx.setState({ mode: 'select.idle', tool: 'select', ghost: null });
          } else {
            ctx.setState({ ghost: { ...g, x: q.x, y: q.y } });
          }
          return true;
        }
        case 'wire.drawing': {
          // A press-drag-release draws the leg to the release point.
          const w = data.wire!;
          const s = screenOf(ctx, ev);
          if (w.downS && Math.hypot(s.sx - w.downS.sx, s.sy - w.downS.sy) > 2 * DRAG_PIXELS) {
            w.downS = undefined;
            addWirePoint(ctx, snapPoint(p));
          }
          return true;
        }
        default:
          return false;
      }
    }

    case 'doubleClick':
      if (state.mode === 'wire.drawing') {
        finishWire(ctx);
        return true;
      }
      return false;

    case 'key':
      if (state.mode === 'wire.drawing') {
        if (ev.key === 'Enter') { finishWire(ctx); return true; }
        if (ev.key === 'Escape') {
          data.wire = undefined;
          ctx.setState({ mode: idleMode(ctx), wirePreview: null });
          return true;
        }
        if (ev.key === 'Backspace' && data.wire!.points.length > 1) {
          data.wire!.points.pop();
          ctx.setState({ wirePreview: [...data.wire!.points] });
          return true;
        }
      }
      return false;

    default:
      return false;
  }
}
