// Behaviour per symbol kind in one place: new parts with default parameters, pins, hit area,
// parameter checking and the mapping of a part's values onto the engine netlist.

import { parseGain, parseSi } from '../engine/units';
import type { DrawingDocument, PartId, PartRecord, Point, Rotation, SymbolKind } from './document';
import { freshId } from './document';
import { placedBounds, placedPins, symbolOf, type PlacedPin, type SymbolParam } from './symbols';

export const TRANSISTOR_KINDS: ReadonlySet<SymbolKind> = new Set(['nmos', 'pmos', 'npn', 'pnp']);
export const MOS_KINDS: ReadonlySet<SymbolKind> = new Set(['nmos', 'pmos']);

/** A part record with the symbol's default parameters. */
export function newPart(
  kind: SymbolKind,
  id: PartId,
  ref: string,
  at: Point,
  rotation: Rotation = 0,
  mirror = false,
): PartRecord {
  const sym = symbolOf(kind);
  const params: Record<string, string> = {};
  for (const p of sym.params) params[p.name] = p.default;
  const part: PartRecord = { id, kind, ref, x: at.x, y: at.y, rotation, mirror, params };
  if (MOS_KINDS.has(kind)) part.bulk = 'source';
  if (MOS_KINDS.has(kind)) part.mode = 'bias';
  if (kind === 'vsource' || kind === 'isource') part.isInput = false;
  return part;
}

/** Next free reference designator for a kind: prefix + (largest number in use + 1). */
export function nextRef(doc: Pick<DrawingDocument, 'parts'>, kind: SymbolKind, extraTaken: Iterable<string> = []): string {
  const prefix = symbolOf(kind).refPrefix;
  const taken = new Set<string>(extraTaken);
  for (const p of Object.values(doc.parts)) taken.add(p.ref);
  let max = 0;
  const re = new RegExp(`^${prefix}(\\d+)$`);
  for (const r of taken) {
    const m = re.exec(r);
    if (m) max = Math.max(max, Number(m[1]));
  }
  let n = max + 1;
  while (taken.has(`${prefix}${n}`)) n += 1;
  return `${prefix}${n}`;
}

export function newPartId(doc: Pick<DrawingDocument, 'parts'>, ref: string): PartId {
  return freshId('part', doc.parts, ref);
}

const REF_PATTERN = /^[A-Za-z][A-Za-z0-9_]*$/;

/** Check a reference designator typed by the user. */
export function checkRef(doc: Pick<DrawingDocument, 'parts'>, part: PartId, ref: string): { ok: true } | { ok: false; reason: string } {
  const r = ref.trim();
  if (r === '') return { ok: false, reason: 'A reference designator cannot be empty.' };
  if (!REF_PATTERN.test(r)) {
    return { ok: false, reason: `"${r}" is not a valid reference designator: use a letter, then letters, digits or _.` };
  }
  for (const p of Object.values(doc.parts)) {
    if (p.id !== part && p.ref === r) return { ok: false, reason: `"${r}" is already used by another part.` };
  }
  return { ok: true };
}

export function partPins(part: PartRecord): PlacedPin[] {
  return placedPins(part);
}

/** Is a world point on the part's body (its bounds grown by `tolerance`)? */
export function hitsPart(part: PartRecord, p: Point, tolerance = 2): boolean {
  const b = placedBounds(part);
  return p.x >= b.x - tolerance && p.x <= b.x + b.width + tolerance && p.y >= b.y - tolerance && p.y <= b.y + b.height + tolerance;
}

/** The parameter fields in use for a part (transistor fields of the other mode are left out). */
export function activeParams(part: PartRecord): SymbolParam[] {
  const mode = part.mode ?? 'bias';
  return symbolOf(part.kind).params.filter((p) => !p.mode || !MOS_KINDS.has(part.kind) || p.mode === mode);
}

export type ParamCheck = { ok: true; value: number | string | undefined } | { ok: false; reason: string };

/** Check one parameter text: empty optional → value undefined; text fields pass as text. */
export function checkParam(spec: SymbolParam, text: string | undefined): ParamCheck {
  const t = (text ?? '').trim();
  if (spec.text) {
    if (t === '') return { ok: false, reason: `${spec.label} is empty` };
    if (!/^[A-Za-z0-9_.+\-]+$/.test(t)) return { ok: false, reason: `${spec.label} "${t}" may hold only letters, digits and _ . + -` };
    return { ok: true, value: t };
  }
  if (t === '') return spec.required ? { ok: false, reason: `${spec.label} is required` } : { ok: true, value: undefined };
  const r = spec.unit === 'V/V' ? parseGain(t) : parseSi(t, spec.unit);
  if (!r.ok) return { ok: false, reason: `${spec.label} ${r.reason}` };
  if (spec.name === 'gain') return { ok: true, value: r.value }; // an inverting gain is fine
  if (spec.required && !(r.value > 0)) return { ok: false, reason: `${spec.label} must be positive (got ${t})` };
  if (r.value < 0) return { ok: false, reason: `${spec.label} cannot be negative (got ${t})` };
  return { ok: true, value: r.value };
}

export interface ParamProblem {
  field: string;
  message: string;
}

/** Checked engine values of a part, or the problems (each naming the part and the field). */
export function engineValues(part: PartRecord): { values: Record<string, number>; problems: ParamProblem[] } {
  // A frozen record (an editor revision's, via immer) never changes: its values are read once.
  // The result is shared between callers: they must not change it.
  const frozen = Object.isFrozen(part) && Object.isFrozen(part.params);
  const known = frozen ? valuesOfRecord.get(part) : undefined;
  if (known) return known;
  const made = readEngineValues(part);
  if (frozen) valuesOfRecord.set(part, made);
  return made;
}

const valuesOfRecord = new WeakMap<PartRecord, { values: Record<string, number>; problems: ParamProblem[] }>();

function readEngineValues(part: PartRecord): { values: Record<string, number>; problems: ParamProblem[] } {
  const values: Record<string, number> = {};
  const problems: ParamProblem[] = [];
  const given = new Map<string, string[]>();
  for (const spec of activeParams(part)) {
    if (spec.text) continue;
    const r = checkParam(spec, part.params[spec.name]);
    if (!r.ok) {
      problems.push({ field: spec.name, message: `${part.ref}: ${r.reason}.` });
      continue;
    }
    if (r.value === undefined || typeof r.value === 'string') continue;
    if (spec.oneOf) {
      const list = given.get(spec.oneOf) ?? [];
      list.push(spec.name);
      given.set(spec.oneOf, list);
    }
    values[spec.name] = r.value;
  }
  // gm/Id or Vov: exactly one of them.
  for (const spec of activeParams(part)) {
    if (!spec.oneOf) continue;
    const names = activeParams(part).filter((s) => s.oneOf === spec.oneOf).map((s) => s.name);
    const list = given.get(spec.oneOf) ?? [];
    if (list.length === 0 && !problems.some((p) => names.includes(p.field))) {
      problems.push({ field: names[0], message: `${part.ref}: give one of ${names.join(' or ')}.` });
    } else if (list.length > 1) {
      problems.push({ field: list[1], message: `${part.ref}: give only one of ${list.join(' or ')} (both are filled in).` });
    }
    break;
  }
  return { values, problems };
}

/** Net-name text of a netLabel or supply part (trimmed), or undefined. */
export function labelNet(part: PartRecord): string | undefined {
  const t = part.params.net?.trim();
  return t ? t : undefined;
}
