// Checks of "the app's state is valid" for the fuzz tests: the editor (document, selection, mode,
// camera), the live store (status, issues) and the texts the overlay would print. Each returns
// a list of problems (empty = fine), so a failing fuzz step can report all of them at once.
import type { Editor } from '../../src/editor/types';
import { GRID, type DrawingDocument } from '../../src/schematic/document';
import { loadDrawing, saveDrawing } from '../../src/schematic/file';
import { placedPins, symbolOf } from '../../src/schematic/symbols';
import { partValueText } from '../../src/canvas/partText';
import { wireReadout } from '../../src/canvas/overlayModel';
import { liveAnnotations } from '../../src/live/annotateLive';
import type { LiveState } from '../../src/live/types';
import type { SchematicAnnotations } from '../../src/export/annotations';
import { runStage1, runStage2 } from '../../src/worker/compute';
import type { AnalysisRunner, RunMessage, RunRequest } from '../../src/worker/protocol';

/** Paths of numbers in `v` that are NaN or ±Infinity. */
export function nonFinitePaths(v: unknown, path = '$', out: string[] = []): string[] {
  if (typeof v === 'number') { if (!Number.isFinite(v)) out.push(`${path} = ${v}`); return out; }
  if (v instanceof Float64Array) { v.forEach((x, i) => { if (!Number.isFinite(x)) out.push(`${path}[${i}] = ${x}`); }); return out; }
  if (Array.isArray(v)) { v.forEach((x, i) => nonFinitePaths(x, `${path}[${i}]`, out)); return out; }
  if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) nonFinitePaths(x, `${path}.${k}`, out);
  return out;
}

/** JSON with keys sorted at every level (key order is not content). */
export function canonical(v: unknown): string {
  return JSON.stringify(v, (_k, x) => (x && typeof x === 'object' && !Array.isArray(x)
    ? Object.fromEntries(Object.keys(x).sort().map((k) => [k, (x as Record<string, unknown>)[k]])) : x));
}

const onGrid = (v: number) => Number.isFinite(v) && v % GRID === 0;
const MODE_TOOL: Record<string, string> = { select: 'select', place: 'place', wire: 'wire' };

export function checkEditor(editor: Editor, opts: { roundTrip?: boolean } = {}): string[] {
  const out: string[] = [];
  const doc = editor.document;
  out.push(...checkDocument(doc, opts));
  for (const id of editor.selection) if (!(id in doc.parts) && !(id in doc.wires)) out.push(`selection holds ${id}, which is not in the drawing`);
  const s = editor.state;
  const family = s.mode.split('.')[0];
  // a drag from a pin in the select tool draws a wire (tools.ts), so wire.drawing goes with any tool
  if (family !== 'pan' && s.mode !== 'wire.drawing' && MODE_TOOL[family] !== s.tool) out.push(`mode ${s.mode} with tool ${s.tool}`);
  if ((s.ghost !== null) !== (s.mode === 'place.ghost')) out.push(`ghost ${s.ghost ? 'shown' : 'missing'} in mode ${s.mode}`);
  if (s.mode !== 'wire.drawing' && s.wirePreview !== null) out.push(`wire preview left over in mode ${s.mode}`);
  if (editor.history.inGesture) out.push('a gesture is still open after the edit');
  out.push(...nonFinitePaths(s, 'state'), ...nonFinitePaths(editor.camera, 'camera'));
  if (!(editor.camera.scale > 0)) out.push(`camera scale ${editor.camera.scale}`);
  return out;
}

/** A document must save and open again to the same thing, with every pin and vertex on the grid. */
export function checkDocument(doc: DrawingDocument, opts: { roundTrip?: boolean } = {}): string[] {
  const out: string[] = [];
  if (opts.roundTrip ?? true) {
    const back = loadDrawing(saveDrawing(doc));
    if (!back.ok) out.push(`the drawing does not open again after saving: ${back.reason}`);
    else if (canonical(back.doc) !== canonical(doc)) out.push('save → open gives a different drawing');
  }
  for (const [key, p] of Object.entries(doc.parts)) {
    if (p.id !== key) out.push(`part key ${key} holds id ${p.id}`);
    if (!onGrid(p.x) || !onGrid(p.y)) out.push(`${p.ref} is off the grid at ${p.x},${p.y}`);
    for (const pin of placedPins(p)) if (!onGrid(pin.x) || !onGrid(pin.y)) out.push(`pin ${pin.name} of ${p.ref} is off the grid`);
    if (typeof p.ref !== 'string') out.push(`${key} has no reference designator`);
  }
  for (const [key, w] of Object.entries(doc.wires)) {
    if (w.id !== key) out.push(`wire key ${key} holds id ${w.id}`);
    if (w.points.length < 2) out.push(`wire ${key} has ${w.points.length} point(s)`);
    for (const q of w.points) if (!onGrid(q.x) || !onGrid(q.y)) out.push(`wire ${key} has a vertex off the grid at ${q.x},${q.y}`);
  }
  return out;
}

/** Typed text may legitimately be echoed in a message; a NaN the user did not type may not. */
function typedTexts(doc: DrawingDocument | null): string {
  return doc ? Object.values(doc.parts).map((p) => `${p.ref} ${Object.values(p.params).join(' ')}`).join(' ') : '';
}

const BAD_TEXT = /\bNaN\b|\bInfinity\b|\bundefined\b|\[object Object\]/;

/** Problems in a text shown to the user: a NaN, Infinity, "undefined" not typed by the user. */
export function badText(text: string, typed: string): string | null {
  const m = BAD_TEXT.exec(text);
  if (!m) return null;
  return typed.includes(m[0]) ? null : `"${text.slice(0, 120)}" shows ${m[0]}`;
}

export function annotationTexts(a: SchematicAnnotations): string[] {
  return [
    ...a.badges.flatMap((b) => b.lines), a.slowest?.label ?? '', a.loop?.label ?? '', a.caution,
    a.legend?.title ?? '', ...(a.legend?.stops.map((s) => s.label) ?? []), a.legend?.noValueLabel ?? '',
  ];
}

export function checkLive(state: LiveState): string[] {
  const out: string[] = [];
  const typed = typedTexts(state.doc);
  if (state.failure) out.push(`the analysis run failed: ${state.failure}`);
  if (state.status === 'error' && !state.issues.some((i) => i.severity === 'error') && !state.failure) {
    out.push('status is error but no error is shown');
  }
  for (const i of state.issues) {
    if (i.message.trim().length < 8) out.push(`issue ${i.code} has no real message`);
    const b = badText(i.message, typed);
    if (b) out.push(`issue ${i.code}: ${b}`);
    if (/internal problem/.test(i.message)) out.push(`engine fault surfaced: ${i.message}`);
    const placed = i.x !== null || i.part !== undefined || i.node !== undefined || i.field !== undefined;
    if (!placed && !['no-ground', 'no-input', 'no-output'].includes(i.code) && i.source === 'drawing') out.push(`issue ${i.code} names no place: ${i.message}`);
    if ((i.x === null) !== (i.y === null) || (i.x !== null && !Number.isFinite(i.x))) out.push(`issue ${i.code} has a broken position`);
  }
  if (state.result) out.push(...nonFinitePaths(state.result, 'result').slice(0, 5));
  if (state.feedback) out.push(...nonFinitePaths(state.feedback, 'feedback').slice(0, 5));
  for (const mode of ['impedance', 'timeConstant'] as const) {
    const ann = liveAnnotations({ ...state, settings: { ...state.settings, colorMode: mode } });
    if (!ann) continue;
    out.push(...nonFinitePaths(ann, `overlay(${mode})`).slice(0, 5));
    for (const t of annotationTexts(ann)) { const b = badText(t, typed); if (b) out.push(`overlay label ${b}`); }
  }
  if (state.result?.ok && state.drawing) {
    for (const net of state.drawing.nets) {
      const bm = state.feedback?.loops[0] ? state.blackman[state.feedback.loops[0].loop.key] ?? null : null;
      for (const row of wireReadout(state.result, net.name, bm, state.feedback?.loops[0]?.loop.label ?? null, state.settings.frequencyHz)) {
        const b = badText(`${row.label} ${row.value}`, typed);
        if (b) out.push(`wire read-out of ${net.name}: ${b}`);
      }
    }
  }
  if (state.doc) for (const p of Object.values(state.doc.parts)) {
    const b = badText(partValueText(p, symbolOf(p.kind)), typed);
    if (b) out.push(`value text of ${p.ref}: ${b}`);
  }
  return out;
}

/** A runner that answers at once on the same thread (the worker's compute functions), catching
 *  any throw as a 'failed' message so the test sees it as the app would. Stage 2 only when
 *  `withFeedback()` says so, to keep the fuzz run short. */
export function syncRunner(withFeedback: () => boolean): AnalysisRunner {
  const listeners: ((m: RunMessage) => void)[] = [];
  const emit = (m: RunMessage) => { for (const fn of listeners) fn(m); };
  return {
    kind: 'same-thread',
    run(req: RunRequest) {
      try {
        emit({ runId: req.runId, stage: 1, result: runStage1(req) });
        if (withFeedback()) emit({ runId: req.runId, stage: 2, ...runStage2(req) });
      } catch (e) {
        emit({ runId: req.runId, stage: 'failed', message: `threw: ${(e as Error).stack ?? e}` });
      }
    },
    onMessage: (fn) => { listeners.push(fn); },
    dispose: () => {},
  };
}
