// Shared engine types: the contract between netlist, MNA assembly and the analyses.
//
// Storage order (used by every routine in src/engine): a dense n×n matrix is a Float64Array of
// length n*n in ROW-MAJOR order, entry (i, j) at index i*n + j. Complex vectors and matrices are
// kept as two Float64Arrays (re, im) of the same layout.
//
// Sign convention of a transconductance (VCCS) with output pins (p, n) and control pins (cp, cn):
// it takes gm·(v(cp) − v(cn)) out of node p, through itself, into node n. An nMOS is therefore a
// VCCS from d to s controlled by g − s; the small-signal pMOS model is the same.

/** Part kinds the engine understands (engine netlist `kind` field). */
export type PartKind =
  | 'resistor'
  | 'capacitor'
  | 'inductor'
  | 'vccs'
  | 'vcvs'
  | 'amplifier'
  | 'vsource'
  | 'isource'
  | 'nmos'
  | 'pmos'
  | 'npn'
  | 'pnp';

/** A part of the engine netlist. Pin names per kind:
 *  resistor/capacitor/inductor/vsource/isource: p, n
 *  vccs/vcvs: p, n, cp, cn
 *  amplifier: out, inp, inn   (output referred to ground)
 *  nmos/pmos: d, g, s, b      (b optional: tied to s when absent)
 *  npn/pnp: c, b, e
 *  Values are SI strings ("4.7k", "2pF") or plain numbers in SI units. */
export interface NetlistPart {
  name: string;
  kind: PartKind;
  pins: Record<string, string>;
  values: Record<string, string | number>;
}

/** What the transfer function observes. */
export type OutputSpec =
  | { kind: 'voltage'; node: string; ref?: string }
  | { kind: 'current'; part: string };

export interface ProcessCard {
  name: string;
  /** Per device polarity: mobility·Cox (A/V²), Cox (F/m²), λ·L (m/V: λ = lambdaL / L), overlap
   *  capacitance per width (F/m), junction capacitance per width (F/m), body-effect ratio gmb/gm. */
  n: DeviceCard;
  p: DeviceCard;
}
export interface DeviceCard {
  kPrime: number;
  cox: number;
  lambdaL: number;
  cov: number;
  cj: number;
  eta: number;
}

/** The engine netlist: the JSON the CLI reads and the canvas produces. */
export interface Netlist {
  format: 'polesketch-netlist';
  version: 1;
  title?: string;
  parts: NetlistPart[];
  /** Name of the independent source that drives the transfer function. */
  input?: string;
  output?: OutputSpec;
  /** A process card name from the built-in set, or a card given inline. */
  process?: string | ProcessCard;
}

/** A problem found in the netlist or its structure; always names where it is. */
export interface EngineIssue {
  severity: 'error' | 'warning';
  code:
    | 'bad-value'
    | 'unknown-kind'
    | 'missing-pin'
    | 'duplicate-name'
    | 'floating-node'
    | 'vsource-loop'
    | 'isource-cutset'
    | 'unconnected-pin'
    | 'no-input'
    | 'no-output'
    | 'unknown-part'
    | 'unknown-node'
    | 'singular'
    | 'ill-conditioned';
  message: string;
  part?: string;
  field?: string;
  node?: string;
}

/** Primitive small-signal elements a part expands into. Node indices: 0..nodeCount-1, −1 = ground.
 *  `part` is the netlist part it came from; `role` tells which piece of the part it is
 *  (e.g. 'gm', 'gmb', 'gds', 'cgs', 'A0', 'pole1'). Controlled-source elements carry `id`,
 *  a stable key "<part>.<role>" that the feedback analyses use to name and switch a source. */
export type Element =
  | { type: 'conductance'; part: string; role: string; a: number; b: number; g: number }
  | { type: 'capacitance'; part: string; role: string; a: number; b: number; c: number }
  | { type: 'inductance'; part: string; role: string; a: number; b: number; l: number; branch: number }
  | { type: 'vccs'; id: string; part: string; role: string; p: number; n: number; cp: number; cn: number; gm: number }
  | { type: 'vcvs'; id: string; part: string; role: string; p: number; n: number; cp: number; cn: number; gain: number; branch: number }
  | { type: 'vsource'; part: string; role: string; p: number; n: number; branch: number }
  | { type: 'isource'; part: string; role: string; p: number; n: number };

/** Assembled MNA system: (G + sC)·x = b·u, y = cᵀ·x.
 *  Unknowns: node voltages 0..nodeCount-1, then branch currents nodeCount..n-1
 *  (one per vsource, inductor, vcvs, in `branchNames` order). A branch current flows from the
 *  element's p pin through the element to its n pin. Independent sources are zeroed in G, C
 *  (vsource = short, isource = open) except as the input vector b. */
export interface MnaSystem {
  n: number;
  nodeCount: number;
  nodeNames: string[];
  branchNames: string[];
  G: Float64Array;
  C: Float64Array;
  /** Input vector (zero when there is no input); for a vsource input, 1 in its branch row; for an
   *  isource input, current pushed out of its p pin into node p and drawn from node n. */
  b: Float64Array;
  /** Output selector (zero when there is no output). */
  c: Float64Array;
  elements: Element[];
  input?: string;
  output?: OutputSpec;
}

/** Complex number as a plain pair (engine-internal; mathjs Complex is used only at the edges). */
export interface Cx {
  re: number;
  im: number;
}
