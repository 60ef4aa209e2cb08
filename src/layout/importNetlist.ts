// Engine netlist (format 'polesketch-netlist', no positions) → a tidy drawing. Every engine part
// becomes its symbol with the same name and values; the input source becomes the input marker (or
// an isource marked as input), the observed node gets the output marker, each named node a net
// label, and every pin on ground a rail symbol of its own (supply above a pin leaving upward,
// ground below otherwise: both are small-signal ground). Positions come from the tidy layout.

import { produce } from 'immer';
import type { Netlist } from '../engine/types';
import { validateNetlist, isGroundName } from '../engine/netlist';
import type { DrawingDocument, PartId, PartRecord, SymbolKind } from '../schematic/document';
import { emptyDocument, pinKey } from '../schematic/document';
import { newPart } from '../schematic/kinds';
import { GROUND_NET } from '../schematic/connectivity';
import { isSymbolKind, placedPins, symbolOf } from '../schematic/symbols';
import { documentToNetlist } from '../schematic/toNetlist';
import { applyElkLayout, type ApplyOutcome } from './applyLayout';
import { layoutProblems } from './checks';
import { toElkGraph, type ElkRunner } from './elkGraph';
import { partBox, railStub, type LayoutModel, type LayoutNet, type LayoutPart, type RailStub } from './model';

export interface ImportResult {
  ok: boolean;
  doc: DrawingDocument;
  /** Problems and notes, each naming the part, node or field. */
  messages: string[];
}

const SUPPLY_NAME = 'vdd';

function inverse(map: Record<string, string>): Record<string, string> {
  return Object.fromEntries(Object.entries(map).map(([a, b]) => [b, a]));
}

/** The drawing parts of a netlist (all at the origin) and the net of each pin. */
function partsOf(net: Netlist, messages: string[]) {
  const parts: PartRecord[] = [];
  const netOfPin: Record<string, string> = {};
  const node = (n: string) => (isGroundName(n.trim()) ? GROUND_NET : n.trim());
  for (const np of net.parts) {
    const isInput = net.input === np.name;
    const useMarker = isInput && np.kind === 'vsource' && node(np.pins.n ?? '0') === GROUND_NET && Object.keys(np.values).length === 0;
    const kind: SymbolKind = useMarker ? 'input' : (np.kind as SymbolKind);
    if (!isSymbolKind(kind)) { messages.push(`${np.name}: kind "${np.kind}" has no drawing symbol`); continue; }
    const sym = symbolOf(kind);
    const id = `part:${np.name.toLowerCase().replace(/[^a-z0-9_]+/g, '')}_${parts.length + 1}` as PartId;
    const part = newPart(kind, id, np.name, { x: 0, y: 0 });
    part.params = {};
    for (const [k, v] of Object.entries(np.values)) {
      if (!sym.params.some((p) => p.name === k)) messages.push(`${np.name}: value "${k}" is not a field of the ${sym.title} symbol; kept but not used`);
      part.params[k] = String(v);
    }
    if (kind === 'nmos' || kind === 'pmos') {
      const direct = Object.keys(np.values).some((k) => sym.params.find((p) => p.name === k)?.mode === 'direct');
      part.mode = direct ? 'direct' : 'bias';
      const b = np.pins.b;
      part.bulk = b === undefined ? 'source' : node(b) === GROUND_NET ? 'rail' : 'pin';
    }
    if ((kind === 'vsource' || kind === 'isource') && isInput) part.isInput = true;
    const symPin = inverse(sym.engine?.pins ?? {});
    for (const [enginePin, n] of Object.entries(np.pins)) {
      const sp = symPin[enginePin];
      if (sp === undefined) {
        if (!(useMarker && enginePin === 'n')) messages.push(`${np.name}: pin "${enginePin}" has no place on the ${sym.title} symbol`);
        continue;
      }
      // A MOS bulk tied to its source or rail has no wire; an npn / pnp 'b' is its base, always wired.
      if (enginePin === 'b' && (kind === 'nmos' || kind === 'pmos') && part.bulk !== 'pin') continue;
      netOfPin[pinKey({ part: id, pin: sp })] = node(n);
    }
    parts.push(part);
  }
  if (net.output) {
    if (net.output.kind === 'voltage' && (net.output.ref === undefined || isGroundName(net.output.ref))) {
      const id = 'part:out_marker' as PartId;
      const ref = parts.some((p) => p.ref === 'OUT') ? 'OUT_1' : 'OUT';
      parts.push(newPart('output', id, ref, { x: 0, y: 0 }));
      netOfPin[pinKey({ part: id, pin: 'p' })] = node(net.output.node);
    } else {
      messages.push('output: only a node voltage to ground can be drawn with the output marker; the output was left out');
    }
  }
  // A net label on every named node, so node names survive the trip.
  const named = [...new Set(Object.values(netOfPin))].filter((n) => n !== GROUND_NET).sort();
  for (const n of named) {
    const id = `part:label_${parts.length + 1}` as PartId;
    const label = newPart('netLabel', id, `L${parts.length + 1}`, { x: 0, y: 0 });
    label.params.net = n;
    parts.push(label);
    netOfPin[pinKey({ part: id, pin: 'p' })] = n;
  }
  orientSeriesParts(parts, netOfPin, net.input);
  return { parts, netOfPin };
}

const TWO_PIN: ReadonlySet<SymbolKind> = new Set(['resistor', 'capacitor', 'inductor', 'vsource', 'isource']);

/** Two-pin parts between two signal nets lie horizontally (p toward the input side), so the
 *  series path reads left to right; parts to ground stay upright with their rail stub below. */
function orientSeriesParts(parts: PartRecord[], netOfPin: Record<string, string>, input?: string): void {
  const netsOf = new Map<PartId, string[]>();
  const partsOf = new Map<string, PartId[]>();
  for (const [k, n] of Object.entries(netOfPin)) {
    if (n === GROUND_NET) continue;
    const id = k.slice(0, k.lastIndexOf('#')) as PartId;
    (netsOf.get(id) ?? netsOf.set(id, []).get(id)!).push(n);
    (partsOf.get(n) ?? partsOf.set(n, []).get(n)!).push(id);
  }
  const dist = new Map<string, number>();
  const start = parts.filter((p) => p.kind === 'input' || p.ref === input);
  const queue: [PartId, number][] = start.map((p) => [p.id, 0]);
  while (queue.length) {
    const [id, d] = queue.shift()!;
    for (const n of netsOf.get(id) ?? []) {
      if (dist.has(n)) continue;
      dist.set(n, d);
      for (const q of partsOf.get(n) ?? []) queue.push([q, d + 1]);
    }
  }
  for (const p of parts) {
    if (!TWO_PIN.has(p.kind) || p.isInput) continue;
    const a = netOfPin[pinKey({ part: p.id, pin: 'p' })], b = netOfPin[pinKey({ part: p.id, pin: 'n' })];
    if (a === undefined || b === undefined || a === GROUND_NET || b === GROUND_NET) continue;
    // Rotation 270 puts pin p on the left, 90 on the right (symbols/README.md transform).
    p.rotation = (dist.get(a) ?? Infinity) <= (dist.get(b) ?? Infinity) ? 270 : 90;
  }
}

/** Import a netlist and lay it out; `ok` is false (with messages) when it cannot be drawn faithfully. */
export async function netlistToDrawing(input: unknown, elk: ElkRunner): Promise<ImportResult> {
  const v = validateNetlist(input);
  const messages = v.issues.filter((i) => i.severity === 'error').map((i) => i.message);
  if (!v.netlist || messages.length) return { ok: false, doc: emptyDocument(), messages };
  const net = v.netlist;
  const { parts, netOfPin } = partsOf(net, messages);
  const doc = emptyDocument(net.title);
  if (typeof net.process === 'string') doc.process = net.process;
  else if (net.process) messages.push('process: an inline process card cannot be stored in a drawing; the drawing uses the default card');
  for (const p of parts) doc.parts[p.id] = p;

  const moving: LayoutPart[] = parts.map((p) => {
    const pins = placedPins(p);
    const stubs: RailStub[] = pins
      .filter((pin) => netOfPin[pinKey({ part: p.id, pin: pin.name })] === GROUND_NET)
      .map((pin) => (pin.side === 'top' ? railStub(pin, 'supply', SUPPLY_NAME) : railStub(pin, 'ground')));
    return { id: p.id, box: partBox(p, stubs), pins, stubs };
  });
  const byNet = new Map<string, string[]>();
  for (const [k, n] of Object.entries(netOfPin)) (byNet.get(n) ?? byNet.set(n, []).get(n)!).push(k);
  const nets: LayoutNet[] = [...byNet.entries()].map(([key, pins]) => ({ key, pins: pins.sort(), rail: key === GROUND_NET ? 'ground' : null }));
  const model: LayoutModel = { moving, fixed: [], dropped: [], nets, netOfPin, netOfWire: {} };

  const graph = toElkGraph(doc, model);
  let laid;
  try {
    laid = await elk.layout(structuredClone(graph));
  } catch (e) {
    return { ok: false, doc, messages: [...messages, `the layout engine failed: ${e instanceof Error ? e.message : String(e)}`] };
  }
  let outcome: ApplyOutcome = { ok: false, message: 'not run', rerouted: 0, wiresFromElk: 0 };
  const placed = produce(doc, (d) => { outcome = applyElkLayout(d, doc, model, laid); });
  if (!outcome.ok) return { ok: false, doc: placed, messages: [...messages, `layout: ${outcome.message}`] };
  const problems = layoutProblems(placed);
  if (problems.length) return { ok: false, doc: placed, messages: [...messages, `layout: ${problems[0]}`] };
  const check = sameNets(net, placed);
  if (check) return { ok: false, doc: placed, messages: [...messages, check] };
  return { ok: true, doc: placed, messages };
}

/** Compare the drawing's netlist with the imported one pin by pin; a message when they differ. */
function sameNets(net: Netlist, doc: DrawingDocument): string | null {
  const r = documentToNetlist(doc);
  if (!r.netlist) return `the drawing has problems: ${r.issues.filter((i) => i.severity === 'error').map((i) => i.message).join('; ')}`;
  const node = (n: string) => (isGroundName(n.trim()) ? GROUND_NET : n.trim());
  const got = new Map(r.netlist.parts.map((p) => [p.name, p]));
  for (const p of net.parts) {
    const q = got.get(p.name);
    if (!q) return `${p.name} is missing from the drawing`;
    for (const [pin, n] of Object.entries(p.pins)) {
      const drawn = q.pins[pin] ?? (pin === 'b' ? q.pins.s : pin === 'n' && q.kind === 'vsource' ? GROUND_NET : undefined);
      if (drawn === undefined || node(drawn) !== node(n)) return `${p.name} pin ${pin} ends on ${drawn ?? 'nothing'} instead of ${node(n)}`;
    }
  }
  return null;
}

/** Import pasted or opened text: an engine netlist as JSON. Bad JSON is a message, not a throw. */
export async function importNetlistText(text: string, elk: ElkRunner): Promise<ImportResult> {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    return { ok: false, doc: emptyDocument(), messages: [`the text is not valid JSON (${(e as Error).message})`] };
  }
  if ((json as { format?: unknown } | null)?.format !== 'polesketch-netlist') {
    return { ok: false, doc: emptyDocument(), messages: ['the text is not an engine netlist (expected "format": "polesketch-netlist")'] };
  }
  return netlistToDrawing(json, elk);
}
