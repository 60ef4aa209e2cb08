// ELK's answer → the tidied drawing. Parts move to ELK's node positions snapped onto the grid; each
// ELK edge route is snapped, joined to the real pin positions (ELK may slide a port along its side)
// and kept as an orthogonal wire when it obeys the drawing's connection rules (occupancy.ts);
// otherwise the maze router lays that wire. Rail pins get their own ground / supply symbols.

import type { Draft } from 'immer';
import type { DrawingDocument, PartId, Point, WireId } from '../schematic/document';
import { freshId, GRID, pinKey, snap } from '../schematic/document';
import { newPart, nextRef } from '../schematic/kinds';
import { placedBounds, placedPins, type PinSide } from '../schematic/symbols';
import type { ElkGraphJson } from './elkGraph';
import { gridRect, partBox, railStub, unionRect, type LayoutModel, type RailStub, type Rect } from './model';
import { mazeRoute } from './maze';
import { Occupancy, between, simplify } from './occupancy';

export interface ApplyOutcome {
  ok: boolean;
  /** What went wrong, naming the net (when ok is false). */
  message?: string;
  /** Wires the ELK route could not give and the maze router laid instead. */
  rerouted: number;
  wiresFromElk: number;
}

const BLOCK_GAP = 20;

/** Where the laid-out block goes: where the moving parts were, unless that overlaps a part that
 *  stays, in which case it goes right of those parts. */
function blockOffset(doc: DrawingDocument, model: LayoutModel, elkBox: Rect): Point {
  const old = unionRect(model.moving.map((m) => {
    const p = doc.parts[m.id];
    return { x: p.x + m.box.x, y: p.y + m.box.y, width: m.box.width, height: m.box.height };
  }));
  // Parts that stay, with their pins and text, kept a wire channel away from the block.
  const fixedBox = gridRect(unionRect(model.fixed.map((id) => {
    const p = doc.parts[id], b = partBox(p, []);
    return { x: p.x + b.x, y: p.y + b.y, width: b.width, height: b.height };
  })), 4 * GRID);
  let x = old.x, y = old.y;
  const overlaps = model.fixed.length > 0 && !(x + elkBox.width < fixedBox.x || x > fixedBox.x + fixedBox.width || y + elkBox.height < fixedBox.y || y > fixedBox.y + fixedBox.height);
  if (overlaps) { x = fixedBox.x + fixedBox.width + BLOCK_GAP; y = fixedBox.y; }
  return { x: snap(x - elkBox.x), y: snap(y - elkBox.y) };
}

const HORIZONTAL: ReadonlySet<PinSide> = new Set(['left', 'right']);

/** An ELK route joined to the real pins: snapped, orthogonal, start at `from`, end at `to`. */
export function joinRoute(from: Point & { side: PinSide }, to: Point & { side: PinSide }, inner: Point[]): Point[] {
  const pts: Point[] = [from];
  if (inner.length === 0) {
    if (HORIZONTAL.has(from.side)) {
      const mx = snap((from.x + to.x) / 2);
      pts.push({ x: mx, y: from.y }, { x: mx, y: to.y });
    } else {
      const my = snap((from.y + to.y) / 2);
      pts.push({ x: from.x, y: my }, { x: to.x, y: my });
    }
  } else {
    const b1 = inner[0];
    pts.push(HORIZONTAL.has(from.side) ? { x: b1.x, y: from.y } : { x: from.x, y: b1.y });
    for (let i = 0; i < inner.length; i++) {
      const prev = pts[pts.length - 1], p = inner[i];
      if (prev.x !== p.x && prev.y !== p.y) pts.push({ x: prev.x, y: p.y });
      pts.push(p);
    }
    const bn = pts[pts.length - 1];
    pts.push(HORIZONTAL.has(to.side) ? { x: bn.x, y: to.y } : { x: to.x, y: bn.y });
  }
  pts.push({ x: to.x, y: to.y });
  return simplify(pts.map((p) => ({ x: p.x, y: p.y })));
}

/** Tidy `doc` in place (an immer draft or a plain copy) from ELK's result; see ApplyOutcome. */
export function applyElkLayout(draft: Draft<DrawingDocument> | DrawingDocument, source: DrawingDocument, model: LayoutModel, laid: ElkGraphJson): ApplyOutcome {
  const doc = draft as DrawingDocument;
  const outcome: ApplyOutcome = { ok: true, rerouted: 0, wiresFromElk: 0 };
  const nodes = new Map(laid.children.map((c) => [c.id, c]));
  const elkBox = unionRect(laid.children.map((c) => ({ x: c.x ?? 0, y: c.y ?? 0, width: c.width, height: c.height })));
  const off = blockOffset(source, model, elkBox);

  // Which nets are rebuilt: those with a moving pin or a dropped rail symbol.
  const split = { netOfPin: model.netOfPin, netOfWire: model.netOfWire };
  const movingIds = new Set<PartId>(model.moving.map((m) => m.id));
  const rebuilt = new Set<string>();
  for (const [key, net] of Object.entries(split.netOfPin)) {
    const part = key.slice(0, key.lastIndexOf('#')) as PartId;
    if (movingIds.has(part) || model.dropped.includes(part)) rebuilt.add(net);
  }
  for (const [w, net] of Object.entries(split.netOfWire)) if (rebuilt.has(net)) delete doc.wires[w as WireId];
  for (const id of model.dropped) delete doc.parts[id];

  // Move the parts.
  for (const m of model.moving) {
    const n = nodes.get(m.id);
    if (!n) return { ...outcome, ok: false, message: `the layout engine returned no position for ${source.parts[m.id].ref}` };
    doc.parts[m.id].x = snap((n.x ?? 0) - m.box.x + off.x);
    doc.parts[m.id].y = snap((n.y ?? 0) - m.box.y + off.y);
  }

  // Rail stubs: moving parts bring theirs; fixed pins on a rebuilt rail net get one as well.
  const stubs: { part: PartId; stub: RailStub; net: string; world: boolean }[] = [];
  for (const m of model.moving) for (const s of m.stubs) stubs.push({ part: m.id, stub: s, net: split.netOfPin[pinKey({ part: m.id, pin: s.pin })], world: false });
  // A fixed pin still sitting on a rail symbol that stays needs none.
  const railPoints = new Set<string>();
  for (const p of Object.values(doc.parts)) if (p.kind === 'ground' || p.kind === 'supply') for (const q of placedPins(p)) railPoints.add(`${q.x},${q.y}`);
  for (const net of model.nets) {
    if (!net.rail || !rebuilt.has(net.key)) continue;
    for (const k of net.pins) {
      const part = k.slice(0, k.lastIndexOf('#')) as PartId;
      if (movingIds.has(part)) continue;
      const pin = placedPins(source.parts[part]).find((p) => `${part}#${p.name}` === k);
      if (pin && railPoints.has(`${pin.x},${pin.y}`)) continue;
      if (pin) stubs.push({ part, stub: railStub(pin, net.rail, net.railName), net: net.key, world: true });
    }
  }
  const wireNet = new Map<WireId, string>();
  const addWire = (points: Point[], net: string) => {
    const id = freshId('wire', doc.wires) as WireId;
    doc.wires[id] = { id, points };
    wireNet.set(id, net);
    return id;
  };
  const refsTaken: string[] = [];
  const stubNet = new Map<PartId, string>();
  for (const { part, stub, net, world } of stubs) {
    const base = world ? { x: 0, y: 0 } : doc.parts[part];
    const at = { x: base.x + stub.at.x, y: base.y + stub.at.y };
    const ref = nextRef(doc, stub.kind, refsTaken);
    refsTaken.push(ref);
    const id = freshId('part', doc.parts, ref);
    const rec = newPart(stub.kind, id, ref, at, stub.rotation);
    if (stub.kind === 'supply') rec.params.net = stub.rail ?? 'vdd';
    doc.parts[id] = rec;
    stubNet.set(id, net);
    if (stub.wire.length >= 2) addWire(stub.wire.map((p) => ({ x: base.x + p.x, y: base.y + p.y })), net);
  }

  // Occupancy of everything that stays or has been placed.
  const occ = new Occupancy();
  const netOfNewPin = (part: PartId, pin: string): string => stubNet.get(part) ?? split.netOfPin[pinKey({ part, pin })] ?? `__part:${part}`;
  const pinAt = new Map<string, Point & { side: PinSide }>();
  for (const p of Object.values(doc.parts)) {
    occ.addBody(placedBounds(p));
    for (const pin of placedPins(p)) {
      occ.addPin(pin, netOfNewPin(p.id, pin.name));
      pinAt.set(`${p.id}#${pin.name}`, pin);
    }
  }
  for (const [id, w] of Object.entries(doc.wires)) {
    occ.addWire(w.points, wireNet.get(id as WireId) ?? split.netOfWire[id] ?? `__wire:${id}`);
  }
  // Routes per net: the tree grows from the net's first placed pin.
  const tree = new Map<string, Point[]>();
  const grow = (net: string, points: Point[]) => {
    const t = tree.get(net) ?? [];
    points.forEach((p, i) => { t.push(p); if (i > 0) t.push(...between(points[i - 1], p)); });
    tree.set(net, t);
  };
  const pending: { net: string; pin: string }[] = [];
  const joined = new Set<string>();
  for (const e of laid.edges) {
    const net = e.id.slice(e.id.indexOf(':') + 1);
    const from = pinAt.get(e.sources[0]), to = pinAt.get(e.targets[0]);
    if (!from || !to) continue;
    if (!tree.has(net)) { grow(net, [from]); joined.add(e.sources[0]); }
    const sec = e.sections?.[0];
    const inner = sec ? (sec.bendPoints ?? []).map((b) => ({ x: snap(b.x + off.x), y: snap(b.y + off.y) })) : null;
    const cand = inner ? joinRoute(from, to, inner) : null;
    if (cand && occ.wireFits(cand, net)) {
      addWire(cand, net);
      occ.addWire(cand, net);
      grow(net, cand);
      joined.add(e.targets[0]);
      outcome.wiresFromElk += 1;
    } else {
      pending.push({ net, pin: e.targets[0] });
    }
  }
  // Every pin of a rebuilt signal net not joined yet (ELK gave no clean route, or its part stays
  // where it is) is joined by the maze router to the net's tree.
  const queued = new Set(pending.map((j) => j.pin));
  for (const net of model.nets) {
    if (net.rail || !rebuilt.has(net.key)) continue;
    const pins = [...net.pins].sort((a, b) => Number(joined.has(b)) - Number(joined.has(a)));
    for (const k of pins) {
      if (!pinAt.has(k)) continue;
      if (!tree.has(net.key)) { grow(net.key, [pinAt.get(k)!]); joined.add(k); continue; }
      if (joined.has(k) || queued.has(k)) continue;
      pending.push({ net: net.key, pin: k });
      queued.add(k);
    }
  }
  const all = [...Object.values(doc.parts).map((p) => placedBounds(p)), ...Object.values(doc.wires).map((w) => unionRect(w.points.map((q) => ({ ...q, width: 0, height: 0 }))))];
  const area = gridRect(unionRect(all), 8 * GRID);
  for (const job of pending) {
    const from = pinAt.get(job.pin)!;
    const route = mazeRoute(occ, { net: job.net, from, side: from.side, targets: tree.get(job.net) ?? [], area });
    if (!route) {
      const [part, pin] = job.pin.split('#');
      return { ...outcome, ok: false, message: `no clean wire found for net ${job.net} at ${source.parts[part as PartId]?.ref ?? part} pin ${pin}` };
    }
    addWire(route, job.net);
    occ.addWire(route, job.net);
    grow(job.net, route);
    outcome.rerouted += 1;
  }
  return outcome;
}
