// Hand-assembled MNA systems for the feedback tests (standard modified nodal analysis, Ho, Ruehli &
// Brennan 1975), written independently of src/engine/mna.ts so the feedback engine is checked on
// matrices built from the textbook stamps and the conventions of src/engine/types.ts.
import type { Element, MnaSystem, OutputSpec } from '../../src/engine/types';

type El =
  | { t: 'R'; name: string; a: string; b: string; r: number }
  | { t: 'C'; name: string; a: string; b: string; c: number }
  | { t: 'L'; name: string; p: string; n: string; l: number }
  | { t: 'G'; name: string; role?: string; p: string; n: string; cp: string; cn: string; gm: number }
  | { t: 'E'; name: string; role?: string; p: string; n: string; cp: string; cn: string; gain: number }
  | { t: 'V'; name: string; p: string; n: string }
  | { t: 'I'; name: string; p: string; n: string };

export const R = (name: string, a: string, b: string, r: number): El => ({ t: 'R', name, a, b, r });
export const Cap = (name: string, a: string, b: string, c: number): El => ({ t: 'C', name, a, b, c });
export const Ind = (name: string, a: string, b: string, l: number): El => ({ t: 'L', name, p: a, n: b, l });
export const Gm = (name: string, p: string, n: string, cp: string, cn: string, gm: number, role = 'gm'): El =>
  ({ t: 'G', name, role, p, n, cp, cn, gm });
export const Vcvs = (name: string, p: string, n: string, cp: string, cn: string, gain: number, role = 'gain'): El =>
  ({ t: 'E', name, role, p, n, cp, cn, gain });
export const Vsrc = (name: string, p: string, n: string): El => ({ t: 'V', name, p, n });
export const Isrc = (name: string, p: string, n: string): El => ({ t: 'I', name, p, n });

/** nMOS small-signal model: gm (d→s, controlled by g−s), gmb (controlled by b−s), ro d–s. */
export function nmos(name: string, d: string, g: string, s: string, gm: number, ro: number, gmb = 0, b = '0'): El[] {
  const out: El[] = [Gm(name, d, s, g, s, gm, 'gm'), R(`${name}.ro`, d, s, ro)];
  if (gmb !== 0) out.push(Gm(name, d, s, b, s, gmb, 'gmb'));
  return out;
}

export function build(els: El[], opts: { input?: string; output?: OutputSpec } = {}): MnaSystem {
  const nodeNames: string[] = [];
  const node = (x: string) => {
    if (x === '0' || x === 'gnd') return -1;
    let i = nodeNames.indexOf(x);
    if (i < 0) { nodeNames.push(x); i = nodeNames.length - 1; }
    return i;
  };
  for (const e of els) {
    if (e.t === 'R' || e.t === 'C') { node(e.a); node(e.b); } else { node(e.p); node(e.n); }
    if (e.t === 'G' || e.t === 'E') { node(e.cp); node(e.cn); }
  }
  const branchNames = els.filter((e) => e.t === 'V' || e.t === 'E' || e.t === 'L').map((e) => e.name);
  const nodeCount = nodeNames.length;
  const n = nodeCount + branchNames.length;
  const G = new Float64Array(n * n);
  const C = new Float64Array(n * n);
  const b = new Float64Array(n);
  const c = new Float64Array(n);
  const add = (M: Float64Array, i: number, j: number, v: number) => { if (i >= 0 && j >= 0) M[i * n + j] += v; };
  const elements: Element[] = [];
  for (const e of els) {
    if (e.t === 'R' || e.t === 'C') {
      const a = node(e.a), bb = node(e.b);
      const M = e.t === 'R' ? G : C;
      const v = e.t === 'R' ? 1 / e.r : e.c;
      add(M, a, a, v); add(M, bb, bb, v); add(M, a, bb, -v); add(M, bb, a, -v);
      elements.push(e.t === 'R'
        ? { type: 'conductance', part: e.name, role: 'r', a, b: bb, g: v }
        : { type: 'capacitance', part: e.name, role: 'c', a, b: bb, c: v });
    } else if (e.t === 'G') {
      const p = node(e.p), q = node(e.n), cp = node(e.cp), cn = node(e.cn);
      add(G, p, cp, e.gm); add(G, p, cn, -e.gm); add(G, q, cp, -e.gm); add(G, q, cn, e.gm);
      elements.push({ type: 'vccs', id: `${e.name}.${e.role}`, part: e.name, role: e.role ?? 'gm', p, n: q, cp, cn, gm: e.gm });
    } else if (e.t === 'I') {
      const p = node(e.p), q = node(e.n);
      elements.push({ type: 'isource', part: e.name, role: 'i', p, n: q });
      if (opts.input === e.name) { if (p >= 0) b[p] += 1; if (q >= 0) b[q] -= 1; }
    } else {
      const p = node(e.p), q = node(e.n);
      const branch = branchNames.indexOf(e.name);
      const r = nodeCount + branch;
      add(G, r, p, 1); add(G, r, q, -1); add(G, p, r, 1); add(G, q, r, -1);
      if (e.t === 'E') {
        const cp = node(e.cp), cn = node(e.cn);
        add(G, r, cp, -e.gain); add(G, r, cn, e.gain);
        elements.push({ type: 'vcvs', id: `${e.name}.${e.role}`, part: e.name, role: e.role ?? 'gain', p, n: q, cp, cn, gain: e.gain, branch });
      } else if (e.t === 'L') {
        C[r * n + r] -= e.l;
        elements.push({ type: 'inductance', part: e.name, role: 'l', a: p, b: q, l: e.l, branch });
      } else {
        elements.push({ type: 'vsource', part: e.name, role: 'v', p, n: q, branch });
        if (opts.input === e.name) b[r] = 1;
      }
    }
  }
  if (opts.output?.kind === 'voltage') {
    c[node(opts.output.node)] = 1;
    if (opts.output.ref) c[node(opts.output.ref)] -= 1;
  }
  return { n, nodeCount, nodeNames, branchNames, G, C, b, c, elements, input: opts.input, output: opts.output };
}

// Regulated cascode (Razavi, Design of Analog CMOS ICs, regulated cascode; Gray, Hurst, Lewis & Meyer):
// M1 lower device (gate at AC ground), M2 cascode, error amplifier A1 (macro: transconductance into
// its output resistance, DC gain A) senses x = M1's drain and drives M2's gate.
export function regulatedCascode(A: number, load: number | null) {
  const Ra = 10e3;
  return build([
    ...nmos('M1', 'x', '0', '0', 1e-3, 100e3),
    ...nmos('M2', 'out', 'gx', 'x', 1e-3, 100e3),
    Gm('A1', '0', 'gx', '0', 'x', A / Ra, 'A0'), R('A1.ro', 'gx', '0', Ra),
    ...(load === null ? [] : [R('RL', 'out', '0', load)]),
    Cap('Cx', 'x', '0', 50e-15), Cap('Cg', 'gx', '0', 100e-15), Cap('Co', 'out', '0', 200e-15),
  ]);
}

