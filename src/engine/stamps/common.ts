// Shared shape of a part family: which pins and values a kind has, how values are checked, and the
// stamp that turns parsed values into primitive small-signal elements (see Element in ../types).
import type { Element, ProcessCard } from '../types';

/** How one value field of a kind is read and checked. */
export interface ValueSpec {
  /** Canonical unit expected by parseSi ('Ω', 'F', 'S', ...); 'gain' = V/V or dB. */
  unit: string;
  /** What the value is, for messages: "a capacitance cannot be negative". */
  quantity: string;
  sign: 'positive' | 'nonnegative' | 'any';
  required?: boolean;
}

export type Values = Record<string, number | undefined>;

export interface FieldProblem {
  field: string;
  message: string;
  severity?: 'error' | 'warning';
}

export interface KindSpec {
  pins: string[];
  optionalPins?: string[];
  values: Record<string, ValueSpec>;
  /** Value fields that are accepted and ignored by the small-signal model (e.g. a source's "ac"). */
  ignored?: string[];
  /** Checks that involve several fields (e.g. "give gm, or id with gmid"); run after parsing. */
  check?: (v: Values) => FieldProblem[];
}

/** What a stamp may ask of the expansion: node indices (−1 = ground), internal nodes, branches. */
export interface StampContext {
  part: string;
  /** Node index on a pin; for an absent optional pin the stamp decides the fallback. */
  pin(name: string): number;
  hasPin(name: string): boolean;
  /** A node private to the part, named "<part>#<label>". */
  internal(label: string): number;
  /** A new branch-current unknown; returns its index in branchNames. */
  branch(name: string): number;
  process: ProcessCard;
}

export type StampFn = (v: Values, ctx: StampContext) => Element[];

export interface PartFamily {
  spec: KindSpec;
  stamp: StampFn;
}

/** Element builders; zero-valued passive and controlled elements are omitted (empty list). */
export function conductance(part: string, role: string, a: number, b: number, g: number): Element[] {
  return g === 0 || a === b ? [] : [{ type: 'conductance', part, role, a, b, g }];
}

export function capacitance(part: string, role: string, a: number, b: number, c: number): Element[] {
  return c === 0 || a === b ? [] : [{ type: 'capacitance', part, role, a, b, c }];
}

export function vccs(part: string, role: string, p: number, n: number, cp: number, cn: number, gm: number): Element[] {
  return gm === 0 || p === n || cp === cn ? [] : [{ type: 'vccs', id: `${part}.${role}`, part, role, p, n, cp, cn, gm }];
}
