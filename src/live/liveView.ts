// What the canvas overlay draws of a live state, derived once per change of what it reads: the
// annotations (annotate(), via liveAnnotations), wire → net, and the lit nets. Shared by the
// overlay's Konva layer and its HTML marks (each subscribes to the store on its own, so a new
// result re-renders those two and not the whole app). Memoised on the inputs by identity and
// value; the drawing enters by its geometry only (geometryKey), so a value edit that is still
// waiting for its result keeps the annotation object as it was and nothing is drawn again.
import type { SchematicAnnotations } from '../export/annotations';
import { geometryKey } from '../schematic/toNetlist';
import { netOfWire, netsOfPole } from '../canvas/overlayModel';
import { liveAnnotations } from './annotateLive';
import { perfMeasure, perfNow } from './perfMarks';
import type { LiveState } from './types';

export interface LiveView {
  ann: SchematicAnnotations | null;
  /** Wire id → net name. */
  netOfWire: Map<string, string>;
  /** Nets lit by the hovered pole, the hovered net and the selected net. */
  lit: ReadonlySet<string>;
}

const same = (a: readonly unknown[], b: readonly unknown[]) => a.length === b.length && a.every((x, i) => Object.is(x, b[i]));

/** fn memoised on one set of keys (the last call's). */
function lastCall<T>(fn: () => T): (keys: readonly unknown[], make?: () => T) => T {
  let keys: readonly unknown[] | null = null;
  let value: T;
  return (k, make = fn) => {
    if (keys && same(keys, k)) return value;
    value = make();
    keys = k;
    return value;
  };
}

const annMemo = lastCall<SchematicAnnotations | null>(() => null);
const wiresMemo = lastCall<Map<string, string>>(() => new Map());
const litMemo = lastCall<ReadonlySet<string>>(() => new Set());
const viewMemo = lastCall<LiveView>(() => ({ ann: null, netOfWire: new Map(), lit: new Set() }));

/** The overlay's data for `state` (the same objects while their inputs are the same). */
export function liveView(state: LiveState): LiveView {
  const s = state.settings;
  const r = state.result;
  const loop = s.selectedLoopId ? state.loops[s.selectedLoopId] : undefined;
  const ann = annMemo(
    [state.doc ? geometryKey(state.doc) : null, r?.ok, r?.nodes, r?.conditions.frequencyHz, loop ? JSON.stringify(loop) : '', s.frequencyHz, s.colorMode, s.selectedLoopId],
    () => {
      const t0 = perfNow();
      const out = liveAnnotations(state);
      perfMeasure('annotate', t0);
      return out;
    },
  );
  const wires = wiresMemo([state.drawing?.nets], () => netOfWire(state.drawing));
  const lit = litMemo([r?.participation, s.hoveredPoleIndex, s.hoveredNet, s.selectedNet], () => {
    const set = new Set(netsOfPole(r, s.hoveredPoleIndex));
    if (s.hoveredNet) set.add(s.hoveredNet);
    if (s.selectedNet) set.add(s.selectedNet);
    return set;
  });
  return viewMemo([ann, wires, lit], () => ({ ann, netOfWire: wires, lit }));
}
