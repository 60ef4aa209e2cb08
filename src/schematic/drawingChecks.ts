// Drawing errors with the place they occur, for marks on the canvas: unconnected pin, floating
// net, two outputs shorted, no ground, plus bad values, duplicate references, open wire ends and
// label conflicts. Pure: document + connectivity in, issues out.

import type { DrawingDocument, PartId, PartRecord, WireId } from './document';
import { pinKey } from './document';
import { GROUND_NET, type Connectivity } from './connectivity';
import { engineValues, labelNet } from './kinds';
import { symbolOf } from './symbols';

export type DrawingIssueCode =
  | 'unconnected-pin'
  | 'floating-net'
  | 'outputs-shorted'
  | 'no-ground'
  | 'bad-value'
  | 'duplicate-ref'
  | 'open-wire-end'
  | 'label-conflict'
  | 'no-input'
  | 'no-output'
  | 'several-inputs'
  | 'several-outputs';

export interface DrawingIssue {
  severity: 'error' | 'warning';
  code: DrawingIssueCode;
  message: string;
  /** World position to mark on the canvas. */
  x: number;
  y: number;
  part?: PartId;
  pin?: string;
  wire?: WireId;
  net?: string;
  field?: string;
}

/** A pin that drives its net against ground (an ideal voltage output). */
function drivenPins(part: PartRecord, netOf: (pin: string) => string | undefined): string[] {
  switch (part.kind) {
    case 'amplifier': return ['out'];
    case 'input': return ['p'];
    case 'vcvs':
    case 'vsource':
      if (netOf('n') === GROUND_NET) return ['p'];
      if (netOf('p') === GROUND_NET) return ['n'];
      return [];
    default: return [];
  }
}

export function checkDrawing(doc: DrawingDocument, conn: Connectivity): DrawingIssue[] {
  const issues: DrawingIssue[] = [];
  const parts = Object.values(doc.parts).sort((a, b) => (a.ref < b.ref ? -1 : a.ref > b.ref ? 1 : 0));
  const pinsOfNet = new Map<string, number>();
  for (const n of conn.nets) pinsOfNet.set(n.name, n.pins.length);
  const pinPlace = new Map(conn.pins.map((p) => [pinKey({ part: p.part, pin: p.name }), p]));

  // Duplicate references.
  const byRef = new Map<string, PartRecord>();
  for (const p of parts) {
    const role = symbolOf(p.kind).role;
    if (role === 'ground' || role === 'supply' || role === 'netLabel') continue;
    const other = byRef.get(p.ref);
    if (other) issues.push({ severity: 'error', code: 'duplicate-ref', message: `Two parts are named ${p.ref}; rename one.`, x: p.x, y: p.y, part: p.id });
    else byRef.set(p.ref, p);
  }

  // Values.
  for (const p of parts) {
    for (const prob of engineValues(p).problems) {
      issues.push({ severity: 'error', code: 'bad-value', message: prob.message, x: p.x, y: p.y, part: p.id, field: prob.field });
    }
    const role = symbolOf(p.kind).role;
    if ((role === 'netLabel' || role === 'supply') && !labelNet(p)) {
      issues.push({ severity: 'error', code: 'bad-value', message: `${p.ref}: the net name is empty.`, x: p.x, y: p.y, part: p.id, field: 'net' });
    }
  }

  // Unconnected pins: the only pin on its net.
  for (const pin of conn.pins) {
    const part = doc.parts[pin.part];
    const role = symbolOf(part.kind).role;
    if (role === 'ground' || role === 'supply') continue;
    const net = conn.netOfPin[pinKey({ part: pin.part, pin: pin.name })];
    if ((pinsOfNet.get(net) ?? 0) > 1) continue;
    const device = role === 'device' || role === 'input';
    issues.push({
      severity: device ? 'error' : 'warning', code: 'unconnected-pin',
      message: device ? `Pin ${pin.name} of ${part.ref} is not connected.` : `${part.ref} is not connected to anything.`,
      x: pin.x, y: pin.y, part: pin.part, pin: pin.name, net,
    });
  }

  // Wires joining no pin, and open wire ends.
  for (const net of conn.nets) {
    if (net.pins.length === 0 && net.wires.length > 0) {
      issues.push({ severity: 'warning', code: 'floating-net', message: `These wires connect to no pin (net ${net.name}).`, x: net.anchor.x, y: net.anchor.y, wire: net.wires[0], net: net.name });
    }
    if (net.labels.length > 1) {
      issues.push({ severity: 'warning', code: 'label-conflict', message: `Labels ${net.labels.join(', ')} are on one net; it is named ${net.name}.`, x: net.anchor.x, y: net.anchor.y, net: net.name });
    }
  }
  for (const e of conn.openEnds) {
    issues.push({ severity: 'warning', code: 'open-wire-end', message: 'This wire end is not connected.', x: e.x, y: e.y, wire: e.wire });
  }

  // Islands: nets joined through engine parts that never reach ground.
  const adj = new Map<string, Set<string>>();
  const link = (a: string, b: string) => {
    if (!adj.has(a)) adj.set(a, new Set());
    if (!adj.has(b)) adj.set(b, new Set());
    adj.get(a)!.add(b);
    adj.get(b)!.add(a);
  };
  let hasEngineParts = false;
  const pinsOfPart = new Map<PartId, string[]>();
  for (const q of conn.pins) pinsOfPart.set(q.part, [...(pinsOfPart.get(q.part) ?? []), q.name]);
  for (const p of parts) {
    const sym = symbolOf(p.kind);
    if (!sym.engine) continue;
    hasEngineParts = true;
    const nets = (pinsOfPart.get(p.id) ?? []).map((name) => conn.netOfPin[pinKey({ part: p.id, pin: name })]);
    if (sym.role === 'input') nets.push(GROUND_NET);
    for (let i = 1; i < nets.length; i++) link(nets[0], nets[i]);
    if (nets.length === 1) link(nets[0], nets[0]);
  }
  const groundPresent = conn.nets.some((n) => n.name === GROUND_NET);
  if (hasEngineParts && !groundPresent) {
    const first = parts.find((p) => symbolOf(p.kind).engine) ?? parts[0];
    issues.push({ severity: 'error', code: 'no-ground', message: 'The drawing has no ground: place a ground (or supply rail) symbol.', x: first.x, y: first.y });
  } else if (hasEngineParts) {
    const reached = new Set<string>([GROUND_NET]);
    const stack = [GROUND_NET];
    while (stack.length) for (const m of adj.get(stack.pop()!) ?? []) if (!reached.has(m)) { reached.add(m); stack.push(m); }
    const reported = new Set<string>();
    for (const net of conn.nets) {
      if (reached.has(net.name) || !adj.has(net.name) || reported.has(net.name)) continue;
      // report the island once, at its first net
      const island = [net.name];
      const st = [net.name];
      reported.add(net.name);
      while (st.length) for (const m of adj.get(st.pop()!) ?? []) if (!reported.has(m)) { reported.add(m); island.push(m); st.push(m); }
      issues.push({ severity: 'error', code: 'floating-net', message: `Net ${island.join(', ')} has no path to ground through any part.`, x: net.anchor.x, y: net.anchor.y, net: net.name });
    }
  }

  // Outputs shorted: two ground-referred outputs on one net, or one tied to ground.
  const drivers = new Map<string, { part: PartRecord; pin: string }[]>();
  for (const p of parts) {
    const netOf = (pin: string) => conn.netOfPin[pinKey({ part: p.id, pin })];
    if ((p.kind === 'vsource' || p.kind === 'vcvs') && netOf('p') !== undefined && netOf('p') === netOf('n')) {
      const at = pinPlace.get(pinKey({ part: p.id, pin: 'p' }))!;
      issues.push({ severity: 'error', code: 'outputs-shorted', message: `The output of ${p.ref} is shorted (both ends on net ${netOf('p')}).`, x: at.x, y: at.y, part: p.id, pin: 'p', net: netOf('p') });
      continue;
    }
    for (const pin of drivenPins(p, netOf)) {
      const net = netOf(pin);
      if (net === undefined) continue;
      const list = drivers.get(net) ?? [];
      list.push({ part: p, pin });
      drivers.set(net, list);
    }
  }
  for (const [net, list] of drivers) {
    const tooMany = net === GROUND_NET ? list : list.slice(1);
    if (net !== GROUND_NET && list.length < 2) continue;
    for (const d of tooMany) {
      const at = pinPlace.get(pinKey({ part: d.part.id, pin: d.pin }))!;
      const others = list.filter((o) => o !== d).map((o) => o.part.ref);
      const message = net === GROUND_NET
        ? `The output of ${d.part.ref} is shorted to ground.`
        : `The outputs of ${d.part.ref} and ${others.join(', ')} are shorted together (net ${net}).`;
      issues.push({ severity: 'error', code: 'outputs-shorted', message, x: at.x, y: at.y, part: d.part.id, pin: d.pin, net });
    }
  }

  // Input and output markers.
  const inputs = parts.filter((p) => p.kind === 'input' || ((p.kind === 'vsource' || p.kind === 'isource') && p.isInput));
  const outputs = parts.filter((p) => p.kind === 'output');
  if (hasEngineParts && inputs.length === 0) {
    const at = parts[0];
    issues.push({ severity: 'warning', code: 'no-input', message: 'No input: place an input marker or mark a source as the input (linear small-signal analysis needs one).', x: at.x, y: at.y });
  }
  for (const p of inputs.slice(1)) {
    issues.push({ severity: 'error', code: 'several-inputs', message: `${p.ref} is a second input; keep one (the first is ${inputs[0].ref}).`, x: p.x, y: p.y, part: p.id });
  }
  if (hasEngineParts && outputs.length === 0) {
    const at = parts[0];
    issues.push({ severity: 'warning', code: 'no-output', message: 'No output: place an output marker on the node to observe.', x: at.x, y: at.y });
  }
  for (const p of outputs.slice(1)) {
    issues.push({ severity: 'warning', code: 'several-outputs', message: `${p.ref} is a second output marker; ${outputs[0].ref} is used.`, x: p.x, y: p.y, part: p.id });
  }
  return issues;
}
