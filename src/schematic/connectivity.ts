// Nets of a drawing by union-find (Galler & Fischer 1964, with path halving and union by size).
// What connects: a pin and any wire point at its position; all points of one wire; a wire vertex
// (end or bend) or a pin lying on another wire's segment (T-junction); net labels of the same
// name; every ground and supply symbol (AC ground, node "0"). Segments that merely cross, with
// no vertex at the crossing, do NOT connect.

import type { DrawingDocument, PartId, PinRef, Point, WireId } from './document';
import { pinKey, pointKey } from './document';
import { labelNet } from './kinds';
import { placedPins, symbolOf, type PlacedPin } from './symbols';

export const GROUND_NET = '0';

class UnionFind {
  private parent: number[] = [];
  private size: number[] = [];
  add(): number {
    this.parent.push(this.parent.length);
    this.size.push(1);
    return this.parent.length - 1;
  }
  find(a: number): number {
    while (this.parent[a] !== a) {
      this.parent[a] = this.parent[this.parent[a]];
      a = this.parent[a];
    }
    return a;
  }
  union(a: number, b: number): void {
    let ra = this.find(a);
    let rb = this.find(b);
    if (ra === rb) return;
    if (this.size[ra] < this.size[rb]) [ra, rb] = [rb, ra];
    this.parent[rb] = ra;
    this.size[ra] += this.size[rb];
  }
}

export interface NetInfo {
  name: string;
  /** true when no label named it (automatic name n1, n2 …). */
  auto: boolean;
  pins: PinRef[];
  wires: WireId[];
  /** A point of the net to show messages at (first pin, else first wire point). */
  anchor: Point;
  /** Label names that met on this net (more than one = conflicting labels). */
  labels: string[];
}

export interface PinPlace extends PlacedPin {
  part: PartId;
}

export interface Connectivity {
  nets: NetInfo[];
  /** pinKey(part, pin) → net name. */
  netOfPin: Record<string, string>;
  netOfWire: Record<WireId, string>;
  /** Points where three or more conductors meet (junction dots). */
  junctions: Point[];
  /** Wire ends touching nothing else. */
  openEnds: { wire: WireId; x: number; y: number }[];
  pins: PinPlace[];
}

interface Segment {
  wire: WireId;
  a: Point;
  b: Point;
}

function onSegmentInterior(p: Point, s: Segment): boolean {
  if (s.a.x === s.b.x && p.x === s.a.x) return p.y > Math.min(s.a.y, s.b.y) && p.y < Math.max(s.a.y, s.b.y);
  if (s.a.y === s.b.y && p.y === s.a.y) return p.x > Math.min(s.a.x, s.b.x) && p.x < Math.max(s.a.x, s.b.x);
  return false;
}

export function computeConnectivity(doc: DrawingDocument): Connectivity {
  const uf = new UnionFind();
  const pointNode = new Map<string, number>();
  const degree = new Map<string, number>();
  const bump = (p: Point, by: number) => degree.set(pointKey(p), (degree.get(pointKey(p)) ?? 0) + by);
  const nodeAt = (p: Point): number => {
    const k = pointKey(p);
    let n = pointNode.get(k);
    if (n === undefined) {
      n = uf.add();
      pointNode.set(k, n);
    }
    return n;
  };
  const ground = uf.add();
  const labelNode = new Map<string, number>();

  const parts = Object.values(doc.parts).sort((a, b) => (a.ref < b.ref ? -1 : a.ref > b.ref ? 1 : a.id < b.id ? -1 : 1));
  const pins: PinPlace[] = [];
  const pinNode = new Map<string, number>();
  for (const part of parts) {
    const role = symbolOf(part.kind).role;
    for (const pin of placedPins(part)) {
      const n = nodeAt(pin);
      pins.push({ ...pin, part: part.id });
      pinNode.set(pinKey({ part: part.id, pin: pin.name }), n);
      bump(pin, 1);
      if (role === 'ground' || role === 'supply') uf.union(n, ground);
      if (role === 'netLabel') {
        const name = labelNet(part);
        if (name === GROUND_NET) uf.union(n, ground);
        else if (name) {
          if (!labelNode.has(name)) labelNode.set(name, uf.add());
          uf.union(n, labelNode.get(name)!);
        }
      }
    }
  }

  const segments: Segment[] = [];
  const wires = Object.values(doc.wires).sort((a, b) => (a.id < b.id ? -1 : 1));
  const wireNode = new Map<WireId, number>();
  for (const w of wires) {
    if (w.points.length === 0) continue;
    const first = nodeAt(w.points[0]);
    wireNode.set(w.id, first);
    w.points.forEach((p, i) => {
      uf.union(first, nodeAt(p));
      bump(p, i === 0 || i === w.points.length - 1 ? 1 : 2);
      if (i > 0) segments.push({ wire: w.id, a: w.points[i - 1], b: p });
    });
  }

  // T-junctions: any vertex or pin on the inside of a segment of another wire. Segments are
  // indexed by their line (horizontal by y, vertical by x) so each point checks only its lines.
  const horizontal = new Map<number, Segment[]>();
  const vertical = new Map<number, Segment[]>();
  for (const s of segments) {
    const [map, key] = s.a.y === s.b.y ? [horizontal, s.a.y] : [vertical, s.a.x];
    const list = map.get(key) ?? [];
    list.push(s);
    map.set(key, list);
  }
  const touchers: { p: Point; wire?: WireId }[] = [...pins.map((p) => ({ p: { x: p.x, y: p.y } }))];
  for (const w of wires) for (const p of w.points) touchers.push({ p, wire: w.id });
  const seen = new Set<string>();
  for (const t of touchers) {
    for (const s of [...(horizontal.get(t.p.y) ?? []), ...(vertical.get(t.p.x) ?? [])]) {
      if (s.wire === t.wire || !onSegmentInterior(t.p, s)) continue;
      uf.union(nodeAt(t.p), wireNode.get(s.wire)!);
      const k = `${pointKey(t.p)}|${s.wire}|${s.a.x},${s.a.y}`;
      if (!seen.has(k)) {
        seen.add(k);
        bump(t.p, 2);
      }
    }
  }

  // Collect nets per root.
  const byRoot = new Map<number, NetInfo>();
  const netFor = (n: number, anchor: Point): NetInfo => {
    const r = uf.find(n);
    let net = byRoot.get(r);
    if (!net) {
      net = { name: '', auto: true, pins: [], wires: [], anchor, labels: [] };
      byRoot.set(r, net);
    }
    return net;
  };
  for (const pin of pins) netFor(pinNode.get(pinKey({ part: pin.part, pin: pin.name }))!, pin).pins.push({ part: pin.part, pin: pin.name });
  for (const w of wires) if (wireNode.has(w.id)) netFor(wireNode.get(w.id)!, w.points[0]).wires.push(w.id);
  for (const [name, n] of labelNode) {
    const net = byRoot.get(uf.find(n));
    if (net) net.labels.push(name);
  }
  const groundRoot = uf.find(ground);

  // Names: ground "0"; else the (alphabetically first) label; else n1, n2 … in a stable order
  // (nets with pins ordered by their first pin, i.e. by part reference, then wire-only nets).
  const taken = new Set<string>([GROUND_NET, ...labelNode.keys()]);
  let counter = 0;
  const ordered = [...byRoot.entries()];
  for (const [root, net] of ordered) {
    net.labels.sort();
    if (root === groundRoot) {
      net.name = GROUND_NET;
      net.auto = false;
    } else if (net.labels.length > 0) {
      net.name = net.labels[0];
      net.auto = false;
    } else {
      do counter += 1;
      while (taken.has(`n${counter}`));
      net.name = `n${counter}`;
      taken.add(net.name);
    }
  }

  const netOfPin: Record<string, string> = {};
  for (const pin of pins) {
    const key = pinKey({ part: pin.part, pin: pin.name });
    netOfPin[key] = byRoot.get(uf.find(pinNode.get(key)!))!.name;
  }
  const netOfWire: Record<WireId, string> = {};
  for (const [w, n] of wireNode) netOfWire[w] = byRoot.get(uf.find(n))!.name;

  const junctions: Point[] = [];
  for (const [k, d] of degree) {
    if (d >= 3) {
      const [x, y] = k.split(',').map(Number);
      junctions.push({ x, y });
    }
  }
  const openEnds: Connectivity['openEnds'] = [];
  for (const w of wires) {
    if (w.points.length < 2) continue;
    for (const p of [w.points[0], w.points[w.points.length - 1]]) {
      if ((degree.get(pointKey(p)) ?? 0) <= 1) openEnds.push({ wire: w.id, x: p.x, y: p.y });
    }
  }

  return { nets: [...byRoot.values()], netOfPin, netOfWire, junctions, openEnds, pins };
}
