// Structural checks run before solving, each naming its node or part:
//  - floating node: no path to ground through any element (union-find over all element terminals);
//  - loop of voltage sources / vcvs outputs (error) or one closed by an inductor (warning: short at DC);
//  - cut-set of current sources: a group joined to the rest only by ideal current sources, so that
//    its KCL rows sum to zero and G + sC is singular for every s;
//  - a node touched by only one pin (warning: harmless numerically, almost surely a drawing slip);
//  - an output with no input;
//  - numerically, LU of G + s0·C at generic complex s0 (scaled to the circuit's time constants):
//    a zero pivot names the unknown of its column (det(G + sC) ≡ 0 is then almost surely true).
// A node whose only path to ground is capacitive is fine: it gives a pole at s = 0.
import type { Element, EngineIssue } from './types';
import { luComplex } from './linalg/lu';
import { assembleMna, currentBranchOf, nodeUnknown, type ExpandedNetlist } from './mna';

class UnionFind {
  parent: Int32Array;
  constructor(n: number) { this.parent = Int32Array.from({ length: n }, (_, i) => i); }
  find(i: number): number {
    while (this.parent[i] !== i) { this.parent[i] = this.parent[this.parent[i]]; i = this.parent[i]; }
    return i;
  }
  /** Join two sets; false when they were already one (the edge closes a cycle). */
  union(a: number, b: number): boolean {
    const ra = this.find(a), rb = this.find(b);
    if (ra === rb) return false;
    this.parent[ra] = rb;
    return true;
  }
}

function terminals(e: Element): [number, number] {
  switch (e.type) {
    case 'conductance': case 'capacitance': case 'inductance': return [e.a, e.b];
    default: return [e.p, e.n];
  }
}

function listNodes(names: string[], max = 6): string {
  const shown = names.slice(0, max).map((s) => `"${s}"`).join(', ');
  return names.length > max ? `${shown} and ${names.length - max} more` : shown;
}

/** Groups of nodes (by union-find over `edges`) that do not contain ground. */
function ungroundedGroups(nc: number, els: Element[]): { uf: UnionFind; groups: Map<number, number[]> } {
  const uf = new UnionFind(nc + 1);
  const g = (i: number) => (i < 0 ? nc : i);
  for (const e of els) { const [a, b] = terminals(e); uf.union(g(a), g(b)); }
  const groups = new Map<number, number[]>();
  const ground = uf.find(nc);
  for (let i = 0; i < nc; i++) {
    const r = uf.find(i);
    if (r === ground) continue;
    if (!groups.has(r)) groups.set(r, []);
    groups.get(r)!.push(i);
  }
  return { uf, groups };
}

export function checkStructure(x: ExpandedNetlist): EngineIssue[] {
  const out: EngineIssue[] = [];
  const nc = x.nodeNames.length;
  const gnd = (i: number) => (i < 0 ? nc : i);
  const names = (idx: number[]) => idx.map((i) => x.nodeNames[i]);

  // Floating groups: no element at all links them to ground.
  const full = ungroundedGroups(nc, x.elements);
  for (const idx of full.groups.values()) {
    out.push({ severity: 'error', code: 'floating-node', node: x.nodeNames[idx[0]],
      message: `node ${listNodes(names(idx))}: no path to ground through any element (floating); connect it or remove it` });
  }

  // Loops of voltage-defined branches: vsources and vcvs first (error), then inductors (warning).
  const loops = new UnionFind(nc + 1);
  for (const pass of ['source', 'inductor'] as const) {
    for (const e of x.elements) {
      const isSource = e.type === 'vsource' || e.type === 'vcvs';
      if (pass === 'source' ? !isSource : e.type !== 'inductance') continue;
      const [a, b] = terminals(e);
      if (loops.union(gnd(a), gnd(b))) continue;
      const where = `between ${a < 0 ? 'ground' : `"${x.nodeNames[a]}"`} and ${b < 0 ? 'ground' : `"${x.nodeNames[b]}"`}`;
      if (pass === 'source') {
        out.push({ severity: 'error', code: 'vsource-loop', part: e.part, node: a >= 0 ? x.nodeNames[a] : undefined,
          message: `${e.part}: closes a loop of voltage sources${e.type === 'vcvs' ? ' (its output is a voltage source)' : ''} ${where}; two ideal voltage sources cannot share a loop` });
      } else {
        out.push({ severity: 'warning', code: 'vsource-loop', part: e.part, node: a >= 0 ? x.nodeNames[a] : undefined,
          message: `${e.part}: closes a loop of inductors/voltage sources ${where}; at DC (s = 0) the loop is a short, so expect a pole or zero at s = 0` });
      }
    }
  }

  // Cut-sets of current sources: grouped without isources, the group has no tie to ground, yet it is
  // not floating, so only isources link it to the rest.
  const cut = ungroundedGroups(nc, x.elements.filter((e) => e.type !== 'isource'));
  for (const idx of cut.groups.values()) {
    if (full.uf.find(idx[0]) !== full.uf.find(nc)) continue; // already reported as floating
    const root = cut.uf.find(idx[0]);
    const crossing = x.elements.filter((e) => e.type === 'isource' && (cut.uf.find(gnd(e.p)) === root) !== (cut.uf.find(gnd(e.n)) === root));
    const parts = [...new Set(crossing.map((e) => e.part))];
    out.push({ severity: 'error', code: 'isource-cutset', node: x.nodeNames[idx[0]], part: parts[0],
      message: `node ${listNodes(names(idx))}: joined to the rest only through current source${parts.length > 1 ? 's' : ''} ${parts.join(', ')}, so its voltage is not determined; add a resistance to ground` });
  }

  // Pins that share their node with no other pin.
  const uses = new Map<number, { part: string; pin: string }[]>();
  for (const u of x.pinUses) {
    if (u.node < 0) continue;
    if (!uses.has(u.node)) uses.set(u.node, []);
    uses.get(u.node)!.push(u);
  }
  for (const [node, list] of uses) {
    if (list.length !== 1) continue;
    out.push({ severity: 'warning', code: 'unconnected-pin', part: list[0].part, field: `pins.${list[0].pin}`, node: x.nodeNames[node],
      message: `${list[0].part}.${list[0].pin}: node "${x.nodeNames[node]}" is not connected to anything else` });
  }

  out.push(...checkInputOutput(x));
  if (out.some((i) => i.severity === 'error')) return out;
  const singular = numericSingularity(x);
  if (singular) out.push(singular);
  return out;
}

function checkInputOutput(x: ExpandedNetlist): EngineIssue[] {
  const out: EngineIssue[] = [];
  if (x.output && x.input === undefined) {
    out.push({ severity: 'error', code: 'no-input', field: 'input', message: 'input: an output is requested but no input source is named' });
  }
  if (x.input !== undefined && !x.elements.some((e) => (e.type === 'vsource' || e.type === 'isource') && e.part === x.input)) {
    out.push({ severity: 'error', code: 'unknown-part', field: 'input', message: `input: "${x.input}" is not a vsource or isource of this netlist` });
  }
  if (x.output?.kind === 'voltage') {
    for (const name of [x.output.node, x.output.ref]) {
      if (name !== undefined && nodeUnknown(x, name) === undefined) {
        out.push({ severity: 'error', code: 'unknown-node', field: 'output', node: name, message: `output: "${name}" is not a node of this netlist` });
      }
    }
  } else if (x.output?.kind === 'current' && currentBranchOf(x.elements, x.output.part) === undefined) {
    out.push({ severity: 'error', code: 'unknown-part', field: 'output', part: x.output.part, message: `output: "${x.output.part}" has no branch current (use a vsource, inductor or vcvs)` });
  }
  return out;
}

const geoMean = (v: number[]) => Math.exp(v.reduce((s, a) => s + Math.log(a), 0) / v.length);

/** Typical |s| of the circuit: g/C and R/L from geometric means of element values (1 if none). */
function typicalRate(els: Element[]): number {
  const g: number[] = [], c: number[] = [], l: number[] = [];
  for (const e of els) {
    if (e.type === 'conductance' && e.g !== 0) g.push(Math.abs(e.g));
    if (e.type === 'vccs' && e.gm !== 0) g.push(Math.abs(e.gm));
    if (e.type === 'capacitance' && e.c > 0) c.push(e.c);
    if (e.type === 'inductance' && e.l > 0) l.push(e.l);
  }
  const gt = g.length ? geoMean(g) : 1;
  const rates: number[] = [];
  if (c.length) rates.push(gt / geoMean(c));
  if (l.length) rates.push(1 / (gt * geoMean(l)));
  return rates.length ? geoMean(rates) : 1;
}

/** First zero-pivot column of G + s0·C (rows and columns equilibrated), or −1. */
function singularColumn(G: Float64Array, C: Float64Array, n: number, sr: number, si: number): number {
  const re = new Float64Array(n * n), im = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) { re[k] = G[k] + sr * C[k]; im[k] = si * C[k]; }
  // Scale each row, then each column, to unit largest modulus so the pivot test is relative.
  for (const byRow of [true, false]) {
    for (let i = 0; i < n; i++) {
      let m = 0;
      for (let j = 0; j < n; j++) { const k = byRow ? i * n + j : j * n + i; m = Math.max(m, Math.hypot(re[k], im[k])); }
      if (m === 0) return i;
      for (let j = 0; j < n; j++) { const k = byRow ? i * n + j : j * n + i; re[k] /= m; im[k] /= m; }
    }
  }
  return luComplex(re, im, n, 1e-12).singularAt;
}

function numericSingularity(x: ExpandedNetlist): EngineIssue | undefined {
  const sys = assembleMna(x);
  if (sys.n === 0) return undefined;
  const w = typicalRate(x.elements);
  // Two generic points off the real axis; singular at both means singular for every s.
  const a = singularColumn(sys.G, sys.C, sys.n, w * Math.cos(1.1), w * Math.sin(1.1));
  if (a < 0) return undefined;
  const b = singularColumn(sys.G, sys.C, sys.n, 0.37 * w * Math.cos(0.6), 0.37 * w * Math.sin(0.6));
  if (b < 0) return undefined;
  const tail = 'the small-signal equations are singular at every frequency (numeric check); look for an ideal current into a node with no load, or a node nothing depends on';
  if (a < sys.nodeCount) {
    return { severity: 'error', code: 'singular', node: sys.nodeNames[a], message: `node "${sys.nodeNames[a]}": its voltage is not determined: ${tail}` };
  }
  const branch = sys.branchNames[a - sys.nodeCount];
  const el = x.elements.find((e) => (e.type === 'vsource' || e.type === 'inductance' || e.type === 'vcvs') && e.branch === a - sys.nodeCount);
  return { severity: 'error', code: 'singular', part: el?.part ?? branch, message: `${el?.part ?? branch}: its branch current is not determined: ${tail}` };
}
