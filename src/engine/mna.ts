// Modified nodal analysis: expand a netlist into primitive elements, then assemble (G + sC)·x = b·u,
// y = cᵀ·x (Ho, Ruehli & Brennan 1975; Vlach & Singhal, "Computer Methods for Circuit Analysis and
// Design", ch. 3). Unknowns: node voltages (ground excluded), then one current per vsource,
// inductor and vcvs branch. Row i of a node is the sum of element currents leaving node i.
import type { Element, EngineIssue, MnaSystem, Netlist, NetlistPart, OutputSpec } from './types';
import { FAMILIES, isPartKind } from './stamps/index';
import type { StampContext } from './stamps/common';
import { canonicalNode, parsePartValues, validateNetlist } from './netlist';
import { BUILTIN_PROCESSES, DEFAULT_PROCESS_NAME, resolveProcess } from './process';
import { checkStructure } from './structure';

/** One netlist pin and the node it lands on (−1 = ground); used by the unconnected-pin check. */
export interface PinUse {
  part: string;
  pin: string;
  node: number;
}

export interface ExpandedNetlist {
  nodeNames: string[];
  branchNames: string[];
  elements: Element[];
  issues: EngineIssue[];
  input?: string;
  output?: OutputSpec;
  pinUses: PinUse[];
}

export interface AssembleOptions {
  /** Element id → factor applied to its gm or gain (0 = switched off). */
  scale?: Record<string, number>;
  input?: string;
  output?: OutputSpec;
}

function partPins(p: NetlistPart): [string, string][] {
  const fam = FAMILIES[p.kind];
  const pins = (p.pins ?? {}) as Record<string, unknown>;
  const out: [string, string][] = [];
  for (const pin of [...fam.spec.pins, ...(fam.spec.optionalPins ?? [])]) {
    const node = pins[pin];
    if (typeof node === 'string' && node.trim() !== '') out.push([pin, canonicalNode(node)]);
  }
  return out;
}

/** Parse values and apply each part's stamp. Parts with errors are left out and their issues kept. */
export function expandNetlist(netlist: Netlist): ExpandedNetlist {
  const { issues } = validateNetlist(netlist);
  if (typeof netlist !== 'object' || netlist === null) {
    return { nodeNames: [], branchNames: [], elements: [], issues, pinUses: [] };
  }
  const nodeNames: string[] = [];
  const nodeIndex = new Map<string, number>();
  const branchNames: string[] = [];
  const elements: Element[] = [];
  const pinUses: PinUse[] = [];
  const process = resolveProcess(netlist.process).card ?? BUILTIN_PROCESSES[DEFAULT_PROCESS_NAME];
  const parts = Array.isArray(netlist.parts) ? netlist.parts : [];
  const usable: NetlistPart[] = [];
  const names = new Set<string>();
  for (const p of parts) {
    if (typeof p !== 'object' || p === null || typeof p.name !== 'string' || names.has(p.name) || !isPartKind(p.kind)) continue;
    names.add(p.name);
    const pins = partPins(p);
    if (pins.length < FAMILIES[p.kind].spec.pins.length) continue;
    // Nodes are numbered in order of first appearance; internal nodes come after all of them.
    for (const [, node] of pins) {
      if (node !== '0' && !nodeIndex.has(node)) { nodeIndex.set(node, nodeNames.length); nodeNames.push(node); }
    }
    usable.push(p);
  }
  for (const p of usable) {
    const parsed = parsePartValues(p);
    if (parsed.issues.some((i) => i.severity === 'error')) continue;
    const pins = new Map(partPins(p));
    for (const [pin, node] of pins) pinUses.push({ part: p.name, pin, node: node === '0' ? -1 : nodeIndex.get(node)! });
    const ctx: StampContext = {
      part: p.name,
      process,
      hasPin: (pin) => pins.has(pin),
      pin: (pin) => { const node = pins.get(pin); return node === undefined || node === '0' ? -1 : nodeIndex.get(node)!; },
      internal: (label) => {
        const name = `${p.name}#${label}`;
        if (!nodeIndex.has(name)) { nodeIndex.set(name, nodeNames.length); nodeNames.push(name); }
        return nodeIndex.get(name)!;
      },
      branch: (name) => branchNames.push(name) - 1,
    };
    elements.push(...FAMILIES[p.kind].stamp(parsed.values, ctx));
  }
  return { nodeNames, branchNames, elements, issues, input: netlist.input, output: netlist.output, pinUses };
}

/** Index of a named node among the unknowns, −1 for ground, undefined when there is no such node. */
export function nodeUnknown(x: { nodeNames: string[] }, name: string): number | undefined {
  const c = canonicalNode(name);
  if (c === '0') return -1;
  const i = x.nodeNames.indexOf(c);
  return i < 0 ? undefined : i;
}

/** Branch unknown (index into branchNames) whose current a 'current' output of `part` observes. */
export function currentBranchOf(elements: Element[], part: string): number | undefined {
  for (const e of elements) {
    if (e.part === part && (e.type === 'vsource' || e.type === 'inductance' || e.type === 'vcvs')) return e.branch;
  }
  return undefined;
}

/** Assemble G, C, b, c (row-major, see types.ts). Unknown input/output names leave b/c zero. */
export function assembleMna(x: ExpandedNetlist, opts: AssembleOptions = {}): MnaSystem {
  const nc = x.nodeNames.length;
  const n = nc + x.branchNames.length;
  const G = new Float64Array(n * n);
  const C = new Float64Array(n * n);
  const b = new Float64Array(n);
  const c = new Float64Array(n);
  const input = opts.input ?? x.input;
  const output = opts.output ?? x.output;
  const add = (M: Float64Array, i: number, j: number, v: number) => { if (i >= 0 && j >= 0) M[i * n + j] += v; };
  const twoTerminal = (M: Float64Array, a: number, bb: number, v: number) => {
    add(M, a, a, v); add(M, bb, bb, v); add(M, a, bb, -v); add(M, bb, a, -v);
  };
  // Branch current r leaves node p into the element and enters node n; its row holds v(p) − v(n).
  const branchIncidence = (p: number, m: number, r: number) => {
    add(G, p, r, 1); add(G, m, r, -1); add(G, r, p, 1); add(G, r, m, -1);
  };
  for (const e of x.elements) {
    switch (e.type) {
      case 'conductance': twoTerminal(G, e.a, e.b, e.g); break;
      case 'capacitance': twoTerminal(C, e.a, e.b, e.c); break;
      case 'inductance': {
        const r = nc + e.branch;
        branchIncidence(e.a, e.b, r);
        C[r * n + r] -= e.l; // v(a) − v(b) − s·L·i = 0
        break;
      }
      case 'vccs': {
        const g = e.gm * (opts.scale?.[e.id] ?? 1);
        add(G, e.p, e.cp, g); add(G, e.p, e.cn, -g); add(G, e.n, e.cp, -g); add(G, e.n, e.cn, g);
        break;
      }
      case 'vcvs': {
        const r = nc + e.branch;
        const k = e.gain * (opts.scale?.[e.id] ?? 1);
        branchIncidence(e.p, e.n, r);
        add(G, r, e.cp, -k); add(G, r, e.cn, k); // v(p) − v(n) − k·(v(cp) − v(cn)) = 0
        break;
      }
      case 'vsource': {
        const r = nc + e.branch;
        branchIncidence(e.p, e.n, r);
        if (e.part === input) b[r] = 1;
        break;
      }
      case 'isource':
        if (e.part === input) { if (e.p >= 0) b[e.p] += 1; if (e.n >= 0) b[e.n] -= 1; }
        break;
    }
  }
  if (output?.kind === 'voltage') {
    const i = nodeUnknown(x, output.node);
    const j = output.ref === undefined ? -1 : nodeUnknown(x, output.ref);
    if (i !== undefined && j !== undefined) { if (i >= 0) c[i] += 1; if (j >= 0) c[j] -= 1; }
  } else if (output?.kind === 'current') {
    const br = currentBranchOf(x.elements, output.part);
    if (br !== undefined) c[nc + br] = 1;
  }
  return { n, nodeCount: nc, nodeNames: x.nodeNames, branchNames: x.branchNames, G, C, b, c, elements: x.elements, input, output };
}

/** Expand, check structure, assemble. No system is returned while any error stands. */
export function buildMna(netlist: Netlist, opts: AssembleOptions = {}): { system?: MnaSystem; issues: EngineIssue[] } {
  const x = expandNetlist(netlist);
  const issues = [...x.issues];
  if (issues.some((i) => i.severity === 'error')) return { issues };
  issues.push(...checkStructure({ ...x, input: opts.input ?? x.input, output: opts.output ?? x.output }));
  if (issues.some((i) => i.severity === 'error')) return { issues };
  return { system: assembleMna(x, opts), issues };
}
