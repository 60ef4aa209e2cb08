import { describe, it, expect } from 'vitest';
import { stronglyConnected, elementaryCycles } from '../../src/engine/feedback/cycles';
import { rng } from '../seeded'; // mulberry32, common practice


/** Brute force: every simple cycle as the canonical vertex list (smallest vertex first). */
function bruteCycles(count: number, adj: number[][]): Set<string> {
  const out = new Set<string>();
  const walk = (start: number, path: number[]) => {
    const v = path[path.length - 1];
    for (const w of adj[v]) {
      if (w === start) out.add(path.join(','));
      else if (w > start && !path.includes(w)) walk(start, [...path, w]);
    }
  };
  for (let s = 0; s < count; s++) walk(s, [s]);
  return out;
}

describe('strongly connected components (Tarjan 1972)', () => {
  it('finds the textbook example components', () => {
    // Cormen et al., Introduction to Algorithms, Fig. 22.9 graph (a..h → 0..7): SCCs {a,b,e} {c,d} {f,g} {h}
    const adj = [[1], [2, 4, 5], [3, 6], [2, 7], [0, 5], [6], [5, 7], [7]];
    const { components, of } = stronglyConnected(8, adj);
    const sets = components.map((c) => c.join(',')).sort();
    expect(sets).toEqual(['0,1,4', '2,3', '5,6', '7']);
    expect(of[0]).toBe(of[4]);
    expect(of[2]).not.toBe(of[5]);
  });
});

describe('elementary cycles (Johnson 1975)', () => {
  it('complete digraph K4 has 20 and K5 has 84 cycles (Σ C(n,k)(k−1)!, combinatorics from memory)', () => {
    for (const [n, expected] of [[4, 20], [5, 84]] as const) {
      const adj = Array.from({ length: n }, (_, v) => Array.from({ length: n }, (_, w) => w).filter((w) => w !== v));
      const r = elementaryCycles(n, adj);
      expect(r.cycles.length).toBe(expected);
      expect(r.truncated).toBe(false);
    }
  });

  it('self-loops are one-vertex cycles', () => {
    const r = elementaryCycles(3, [[0, 1], [0], [2]]);
    const keys = r.cycles.map((c) => c.join(',')).sort();
    expect(keys).toEqual(['0', '0,1', '2']);
  });

  it('matches brute-force enumeration on random graphs (independent check)', () => {
    const r = rng(11);
    for (let trial = 0; trial < 30; trial++) {
      const n = 3 + Math.floor(r() * 5);
      const adj = Array.from({ length: n }, () => [] as number[]);
      for (let v = 0; v < n; v++) for (let w = 0; w < n; w++) if (r() < 0.35) adj[v].push(w);
      const got = new Set(elementaryCycles(n, adj).cycles.map((c) => c.join(',')));
      expect(got).toEqual(bruteCycles(n, adj));
    }
  });

  it('says when it stopped at the cap', () => {
    const n = 5;
    const adj = Array.from({ length: n }, (_, v) => Array.from({ length: n }, (_, w) => w).filter((w) => w !== v));
    const r = elementaryCycles(n, adj, 10);
    expect(r.cycles.length).toBe(10);
    expect(r.truncated).toBe(true);
    expect(elementaryCycles(n, adj, 84).truncated).toBe(false);
  });
});
