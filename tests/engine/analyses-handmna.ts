// Hand MNA assembly for the analyses tests, written from the textbook stamps (Ho, Ruehli & Brennan
// 1975, modified nodal analysis) and the conventions in src/engine/types.ts — deliberately not
// the engine's own assembler, so the analyses are checked against an independent build.
import type { Element, MnaSystem } from '../../src/engine/types';

type Part =
  | { k: 'R'; name: string; a: string; b: string; v: number }
  | { k: 'C'; name: string; a: string; b: string; v: number }
  | { k: 'L'; name: string; a: string; b: string; v: number }
  | { k: 'G'; name: string; p: string; n: string; cp: string; cn: string; v: number }
  | { k: 'E'; name: string; p: string; n: string; cp: string; cn: string; v: number }
  | { k: 'V'; name: string; a: string; b: string }
  | { k: 'I'; name: string; a: string; b: string };

export class Hand {
  parts: Part[] = [];
  R(name: string, a: string, b: string, v: number) { this.parts.push({ k: 'R', name, a, b, v }); return this; }
  C(name: string, a: string, b: string, v: number) { this.parts.push({ k: 'C', name, a, b, v }); return this; }
  L(name: string, a: string, b: string, v: number) { this.parts.push({ k: 'L', name, a, b, v }); return this; }
  /** VCCS: gm·(v(cp) − v(cn)) out of p into n (types.ts convention). */
  G(name: string, p: string, n: string, cp: string, cn: string, v: number) { this.parts.push({ k: 'G', name, p, n, cp, cn, v }); return this; }
  E(name: string, p: string, n: string, cp: string, cn: string, v: number) { this.parts.push({ k: 'E', name, p, n, cp, cn, v }); return this; }
  V(name: string, a: string, b: string) { this.parts.push({ k: 'V', name, a, b }); return this; }
  I(name: string, a: string, b: string) { this.parts.push({ k: 'I', name, a, b }); return this; }

  build(input?: string, outNode?: string): MnaSystem {
    const nodes: string[] = [];
    const id = (s: string) => {
      if (s === '0' || s === 'gnd') return -1;
      let i = nodes.indexOf(s);
      if (i < 0) { nodes.push(s); i = nodes.length - 1; }
      return i;
    };
    for (const p of this.parts) {
      if ('a' in p) { id(p.a); id(p.b); } else { id(p.p); id(p.n); id(p.cp); id(p.cn); }
    }
    const branchNames = this.parts.filter((p) => p.k === 'V' || p.k === 'L' || p.k === 'E').map((p) => p.name);
    const nc = nodes.length;
    const n = nc + branchNames.length;
    const G = new Float64Array(n * n);
    const C = new Float64Array(n * n);
    const b = new Float64Array(n);
    const c = new Float64Array(n);
    const elements: Element[] = [];
    const add = (M: Float64Array, i: number, j: number, v: number) => { if (i >= 0 && j >= 0) M[i * n + j] += v; };
    const two = (M: Float64Array, a: number, bb: number, v: number) => { add(M, a, a, v); add(M, bb, bb, v); add(M, a, bb, -v); add(M, bb, a, -v); };
    for (const p of this.parts) {
      const br = nc + branchNames.indexOf(p.name);
      switch (p.k) {
        case 'R': two(G, id(p.a), id(p.b), 1 / p.v); elements.push({ type: 'conductance', part: p.name, role: 'value', a: id(p.a), b: id(p.b), g: 1 / p.v }); break;
        case 'C': two(C, id(p.a), id(p.b), p.v); elements.push({ type: 'capacitance', part: p.name, role: 'value', a: id(p.a), b: id(p.b), c: p.v }); break;
        case 'G': {
          const [pp, nn, cp, cn] = [id(p.p), id(p.n), id(p.cp), id(p.cn)];
          add(G, pp, cp, p.v); add(G, pp, cn, -p.v); add(G, nn, cp, -p.v); add(G, nn, cn, p.v);
          elements.push({ type: 'vccs', id: `${p.name}.gm`, part: p.name, role: 'gm', p: pp, n: nn, cp, cn, gm: p.v });
          break;
        }
        case 'L': case 'V': case 'E': {
          const [a, bb] = 'a' in p ? [id(p.a), id(p.b)] : [id(p.p), id(p.n)];
          add(G, a, br, 1); add(G, bb, br, -1);
          add(G, br, a, 1); add(G, br, bb, -1);
          if (p.k === 'L') { C[br * n + br] = -p.v; elements.push({ type: 'inductance', part: p.name, role: 'value', a, b: bb, l: p.v, branch: br }); }
          if (p.k === 'E') { add(G, br, id(p.cp), -p.v); add(G, br, id(p.cn), p.v); }
          if (p.k === 'V') { elements.push({ type: 'vsource', part: p.name, role: 'value', p: a, n: bb, branch: br }); if (input === p.name) b[br] = 1; }
          break;
        }
        case 'I': {
          const [a, bb] = [id(p.a), id(p.b)];
          elements.push({ type: 'isource', part: p.name, role: 'value', p: a, n: bb });
          if (input === p.name) { if (a >= 0) b[a] += 1; if (bb >= 0) b[bb] -= 1; }
          break;
        }
      }
    }
    if (outNode !== undefined) c[id(outNode)] = 1;
    return { n, nodeCount: nc, nodeNames: nodes, branchNames, G, C, b, c, elements, input, output: outNode ? { kind: 'voltage', node: outNode } : undefined };
  }
}
