// Netlist validation: shape of the JSON, part kinds, pins, values (SI strings), names, input/output.
// Every issue names the part and field ("R3.value: ...") or the netlist field it is about.
import type { EngineIssue, Netlist, NetlistPart, PartKind } from './types';
import { parseGain, parseSi } from './units';
import { FAMILIES, isPartKind } from './stamps/index';
import type { Values } from './stamps/common';
import { resolveProcess } from './process';

/** Ground is node "0" or "gnd" (any letter case): both are the same node. */
export function isGroundName(node: string): boolean {
  return node === '0' || node.toLowerCase() === 'gnd';
}

/** Canonical spelling of a node name (ground → "0", others trimmed). */
export function canonicalNode(node: string): string {
  const t = node.trim();
  return isGroundName(t) ? '0' : t;
}

const KIND_LIST = Object.keys(FAMILIES).join(', ');
const CURRENT_OUTPUT_KINDS: PartKind[] = ['vsource', 'inductor', 'vcvs'];

function issue(severity: EngineIssue['severity'], code: EngineIssue['code'], message: string, extra: Partial<EngineIssue> = {}): EngineIssue {
  return { severity, code, message, ...extra };
}

/** Parse and check the values of one part whose kind is known. Missing optional values stay undefined. */
export function parsePartValues(part: NetlistPart): { values: Values; issues: EngineIssue[] } {
  const fam = FAMILIES[part.kind];
  const issues: EngineIssue[] = [];
  const values: Values = {};
  const given = (typeof part.values === 'object' && part.values !== null ? part.values : {}) as Record<string, unknown>;
  const name = part.name;
  for (const [field, vs] of Object.entries(fam.spec.values)) {
    const raw = given[field];
    if (raw === undefined || raw === null || raw === '') {
      if (vs.required) {
        issues.push(issue('error', 'bad-value', `${name}.${field}: ${vs.quantity} is required for a ${part.kind}`, { part: name, field }));
      }
      continue;
    }
    if (typeof raw !== 'string' && typeof raw !== 'number') {
      issues.push(issue('error', 'bad-value', `${name}.${field}: must be a number or an SI text such as "4.7k"`, { part: name, field }));
      continue;
    }
    const r = vs.unit === 'gain' ? parseGain(raw) : parseSi(raw, vs.unit);
    if (!r.ok) {
      issues.push(issue('error', 'bad-value', `${name}.${field}: ${r.reason}`, { part: name, field }));
      continue;
    }
    if (vs.sign === 'nonnegative' && r.value < 0) {
      issues.push(issue('error', 'bad-value', `${name}.${field}: ${vs.quantity} cannot be negative`, { part: name, field }));
      continue;
    }
    if (vs.sign === 'positive' && r.value <= 0) {
      issues.push(issue('error', 'bad-value', `${name}.${field}: ${vs.quantity} must be greater than zero`, { part: name, field }));
      continue;
    }
    values[field] = r.value;
  }
  for (const field of Object.keys(given)) {
    if (field in fam.spec.values || fam.spec.ignored?.includes(field)) continue;
    const known = Object.keys(fam.spec.values).join(', ') || 'none';
    issues.push(issue('warning', 'bad-value', `${name}.${field}: not a value of a ${part.kind} (known: ${known}); ignored`, { part: name, field }));
  }
  if (!issues.some((i) => i.severity === 'error') && fam.spec.check) {
    for (const p of fam.spec.check(values)) {
      issues.push(issue(p.severity ?? 'error', 'bad-value', `${name}.${p.field}: ${p.message}`, { part: name, field: p.field }));
    }
  }
  return { values, issues };
}

/** Check the pins of one part: every required pin present and a non-empty node name. */
function checkPins(part: NetlistPart): EngineIssue[] {
  const fam = FAMILIES[part.kind];
  const out: EngineIssue[] = [];
  const pins = (typeof part.pins === 'object' && part.pins !== null ? part.pins : {}) as Record<string, unknown>;
  for (const pin of fam.spec.pins) {
    const node = pins[pin];
    if (typeof node !== 'string' || node.trim() === '') {
      out.push(issue('error', 'missing-pin', `${part.name}.${pin}: the pin is not connected to a node (a ${part.kind} has pins ${fam.spec.pins.join(', ')})`, { part: part.name, field: `pins.${pin}` }));
    }
  }
  for (const pin of fam.spec.optionalPins ?? []) {
    const node = pins[pin];
    if (node !== undefined && (typeof node !== 'string' || node.trim() === '')) {
      out.push(issue('error', 'missing-pin', `${part.name}.${pin}: must name a node, or be left out`, { part: part.name, field: `pins.${pin}` }));
    }
  }
  for (const [pin, node] of Object.entries(pins)) {
    if (typeof node === 'string' && node.includes('#')) {
      out.push(issue('error', 'bad-value', `${part.name}.${pin}: node name "${node}" may not contain "#" (kept for nodes inside a part)`, { part: part.name, field: `pins.${pin}` }));
    }
    if (fam.spec.pins.includes(pin) || fam.spec.optionalPins?.includes(pin)) continue;
    out.push(issue('warning', 'bad-value', `${part.name}.${pin}: a ${part.kind} has no pin "${pin}"; ignored`, { part: part.name, field: `pins.${pin}` }));
  }
  return out;
}

export function validateNetlist(json: unknown): { netlist?: Netlist; issues: EngineIssue[] } {
  const issues: EngineIssue[] = [];
  if (typeof json !== 'object' || json === null || Array.isArray(json)) {
    return { issues: [issue('error', 'bad-value', 'netlist: expected a JSON object', { field: 'netlist' })] };
  }
  const obj = json as Record<string, unknown>;
  if (obj.format !== 'polesketch-netlist') {
    issues.push(issue('error', 'bad-value', `format: expected "polesketch-netlist", got ${JSON.stringify(obj.format)}`, { field: 'format' }));
  }
  if (obj.version !== 1) {
    issues.push(issue('error', 'bad-value', `version: expected 1, got ${JSON.stringify(obj.version)}`, { field: 'version' }));
  }
  if (!Array.isArray(obj.parts)) {
    issues.push(issue('error', 'bad-value', 'parts: expected a list of parts', { field: 'parts' }));
    return { issues };
  }
  const seen = new Map<string, number>();
  const nodes = new Set<string>();
  const byName = new Map<string, NetlistPart>();
  obj.parts.forEach((raw: unknown, index: number) => {
    if (typeof raw !== 'object' || raw === null) {
      issues.push(issue('error', 'bad-value', `parts[${index}]: expected a part object`, { field: `parts[${index}]` }));
      return;
    }
    const p = raw as NetlistPart;
    if (typeof p.name !== 'string' || p.name.trim() === '') {
      issues.push(issue('error', 'bad-value', `parts[${index}].name: every part needs a name`, { field: `parts[${index}].name` }));
      return;
    }
    const name = p.name;
    if (seen.has(name)) {
      issues.push(issue('error', 'duplicate-name', `${name}: the name is used by parts ${seen.get(name)! + 1} and ${index + 1}`, { part: name, field: 'name' }));
    } else {
      seen.set(name, index);
      byName.set(name, p);
    }
    if (!isPartKind(p.kind)) {
      issues.push(issue('error', 'unknown-kind', `${name}.kind: "${String(p.kind)}" is not a known kind (known: ${KIND_LIST})`, { part: name, field: 'kind' }));
      return;
    }
    issues.push(...checkPins(p));
    for (const node of Object.values((p.pins ?? {}) as Record<string, unknown>)) {
      if (typeof node === 'string' && node.trim() !== '') nodes.add(canonicalNode(node));
    }
    issues.push(...parsePartValues(p).issues);
  });
  if (obj.input !== undefined) {
    const src = typeof obj.input === 'string' ? byName.get(obj.input) : undefined;
    if (!src) {
      issues.push(issue('error', 'unknown-part', `input: "${String(obj.input)}" is not a part of this netlist`, { field: 'input' }));
    } else if (src.kind !== 'vsource' && src.kind !== 'isource') {
      issues.push(issue('error', 'unknown-part', `input: ${src.name} is a ${src.kind}; the input must be a vsource or an isource`, { part: src.name, field: 'input' }));
    }
  }
  if (obj.output !== undefined) issues.push(...checkOutput(obj.output, nodes, byName));
  if (obj.process !== undefined) {
    const r = resolveProcess(obj.process);
    if (r.problem) issues.push(issue('error', 'bad-value', r.problem.message, { field: r.problem.field }));
  }
  if (issues.some((i) => i.severity === 'error')) return { issues };
  return { netlist: obj as unknown as Netlist, issues };
}

function checkOutput(out: unknown, nodes: Set<string>, byName: Map<string, NetlistPart>): EngineIssue[] {
  const o = out as Record<string, unknown>;
  if (typeof o !== 'object' || o === null) return [issue('error', 'bad-value', 'output: expected an object', { field: 'output' })];
  if (o.kind === 'voltage') {
    const res: EngineIssue[] = [];
    for (const f of ['node', 'ref'] as const) {
      const v = o[f];
      if (v === undefined && f === 'ref') continue;
      if (typeof v !== 'string' || !(nodes.has(canonicalNode(v)) || isGroundName(v.trim()))) {
        res.push(issue('error', 'unknown-node', `output.${f}: "${String(v)}" is not a node of this netlist`, { field: `output.${f}`, node: typeof v === 'string' ? v : undefined }));
      } else if (f === 'node' && isGroundName(v.trim())) {
        res.push(issue('error', 'unknown-node', 'output.node: the output is ground, whose voltage is always zero', { field: 'output.node', node: v }));
      }
    }
    return res;
  }
  if (o.kind === 'current') {
    const p = typeof o.part === 'string' ? byName.get(o.part) : undefined;
    if (!p) return [issue('error', 'unknown-part', `output.part: "${String(o.part)}" is not a part of this netlist`, { field: 'output.part' })];
    if (!CURRENT_OUTPUT_KINDS.includes(p.kind)) {
      return [issue('error', 'unknown-part', `output.part: the current of ${p.name} (a ${p.kind}) is not an unknown; use a vsource, inductor or vcvs (a 0 V vsource in series measures any current)`, { part: p.name, field: 'output.part' })];
    }
    return [];
  }
  return [issue('error', 'bad-value', `output.kind: expected "voltage" or "current", got ${JSON.stringify(o.kind)}`, { field: 'output.kind' })];
}
