// Layout model → ELK graph JSON (the input of elkjs). Layered, signal left to right from the input
// marker to the output marker, orthogonal edges, every pin a port with a fixed side. Option keys
// carry the `elk.` prefix and all values are strings, as ELK's JSON format expects.

import type { DrawingDocument, PartId } from '../schematic/document';
import { symbolOf, type PinSide } from '../schematic/symbols';
import type { LayoutModel, LayoutPart } from './model';

export interface ElkPortJson { id: string; x: number; y: number; width: number; height: number; layoutOptions: Record<string, string> }
export interface ElkNodeJson {
  id: string;
  x?: number;
  y?: number;
  width: number;
  height: number;
  layoutOptions?: Record<string, string>;
  ports?: ElkPortJson[];
}
export interface ElkSectionJson { startPoint: { x: number; y: number }; endPoint: { x: number; y: number }; bendPoints?: { x: number; y: number }[] }
export interface ElkEdgeJson { id: string; sources: string[]; targets: string[]; sections?: ElkSectionJson[] }
export interface ElkGraphJson {
  id: string;
  layoutOptions: Record<string, string>;
  children: ElkNodeJson[];
  edges: ElkEdgeJson[];
}

/** Anything that lays out an ELK graph (elkjs in a worker, or its bundled build in node). */
export interface ElkRunner {
  layout(graph: ElkGraphJson): Promise<ElkGraphJson>;
}

export const ELK_SIDE: Record<PinSide, 'NORTH' | 'EAST' | 'SOUTH' | 'WEST'> = {
  top: 'NORTH', right: 'EAST', bottom: 'SOUTH', left: 'WEST',
};

export const ROOT_OPTIONS: Readonly<Record<string, string>> = {
  'elk.algorithm': 'layered',
  'elk.direction': 'RIGHT',
  'elk.edgeRouting': 'ORTHOGONAL',
  'elk.spacing.nodeNode': '40',
  'elk.layered.spacing.nodeNodeBetweenLayers': '60',
  'elk.spacing.edgeNode': '20',
  'elk.spacing.edgeEdge': '10',
  'elk.layered.spacing.edgeNodeBetweenLayers': '20',
  'elk.layered.spacing.edgeEdgeBetweenLayers': '10',
  'elk.padding': '[top=20,left=20,bottom=20,right=20]',
  'elk.layered.nodePlacement.strategy': 'NETWORK_SIMPLEX',
};

/** Port id of a part pin (also the pin key of the drawing). */
export const portId = (part: PartId, pin: string) => `${part}#${pin}`;

/** Pins that drive their net in the small-signal sense (outputs of gain parts and sources). */
const DRIVER_PINS: Partial<Record<string, readonly string[]>> = {
  nmos: ['d'], pmos: ['d'], npn: ['c'], pnp: ['c'], vccs: ['p', 'n'], vcvs: ['p', 'n'], amplifier: ['out'], input: ['p'],
};

/** Edge source per net: a driving pin (gain-part output, the input marker) before any other, then
 *  the pin closest to the input marker (breadth-first over parts and nets), so edges point along
 *  the signal and the layered layout puts the input left, the output right. */
function signalOrder(doc: DrawingDocument, model: LayoutModel): Map<PartId, number> {
  const partsOfNet = new Map<string, PartId[]>();
  const netsOfPart = new Map<PartId, string[]>();
  for (const n of model.nets) {
    if (n.rail) continue;
    for (const k of n.pins) {
      const part = k.slice(0, k.lastIndexOf('#')) as PartId;
      (partsOfNet.get(n.key) ?? partsOfNet.set(n.key, []).get(n.key)!).push(part);
      (netsOfPart.get(part) ?? netsOfPart.set(part, []).get(part)!).push(n.key);
    }
  }
  const dist = new Map<PartId, number>();
  const queue: PartId[] = [];
  for (const p of Object.values(doc.parts)) {
    if (symbolOf(p.kind).role === 'input' || p.isInput) { dist.set(p.id, 0); queue.push(p.id); }
  }
  while (queue.length) {
    const p = queue.shift()!;
    for (const net of netsOfPart.get(p) ?? []) {
      for (const q of partsOfNet.get(net) ?? []) {
        if (!dist.has(q)) { dist.set(q, dist.get(p)! + 1); queue.push(q); }
      }
    }
  }
  return dist;
}

function node(doc: DrawingDocument, lp: LayoutPart): ElkNodeJson {
  const part = doc.parts[lp.id];
  const role = symbolOf(part.kind).role;
  const layoutOptions: Record<string, string> = { 'elk.portConstraints': 'FIXED_SIDE' };
  if (role === 'input') layoutOptions['elk.layered.layering.layerConstraint'] = 'FIRST';
  if (role === 'output') layoutOptions['elk.layered.layering.layerConstraint'] = 'LAST';
  return {
    id: lp.id,
    width: lp.box.width,
    height: lp.box.height,
    layoutOptions,
    ports: lp.pins.map((pin) => ({
      id: portId(lp.id, pin.name),
      x: pin.x - lp.box.x,
      y: pin.y - lp.box.y,
      width: 0,
      height: 0,
      layoutOptions: { 'elk.port.side': ELK_SIDE[pin.side] },
    })),
  };
}

/** ELK graph of the moving parts; one edge per (source pin, other pin) of each signal net. */
export function toElkGraph(doc: DrawingDocument, model: LayoutModel): ElkGraphJson {
  const moving = new Set(model.moving.map((m) => m.id));
  const children = model.moving.map((lp) => node(doc, lp));
  const dist = signalOrder(doc, model);
  const edges: ElkEdgeJson[] = [];
  for (const net of model.nets) {
    if (net.rail) continue;
    const pins = net.pins.filter((k) => moving.has(k.slice(0, k.lastIndexOf('#')) as PartId));
    if (pins.length < 2) continue;
    const d = (k: string) => dist.get(k.slice(0, k.lastIndexOf('#')) as PartId) ?? Infinity;
    const drives = (k: string) => {
      const part = doc.parts[k.slice(0, k.lastIndexOf('#')) as PartId];
      const pin = k.slice(k.lastIndexOf('#') + 1);
      return (DRIVER_PINS[part.kind]?.includes(pin) || ((part.kind === 'vsource' || part.kind === 'isource') && part.isInput && pin === 'p')) ? 0 : 1;
    };
    const source = [...pins].sort((a, b) => drives(a) - drives(b) || d(a) - d(b) || (a < b ? -1 : 1))[0];
    for (const k of pins) {
      if (k === source) continue;
      edges.push({ id: `e${edges.length}:${net.key}`, sources: [source], targets: [k] });
    }
  }
  return { id: 'root', layoutOptions: { ...ROOT_OPTIONS }, children, edges };
}
