import { describe, it, expect } from 'vitest';
import { assign, matchPoles } from '../../src/engine/feedback/matching';
import { rng } from '../seeded'; // mulberry32, common practice


function permutations(n: number): number[][] {
  if (n === 1) return [[0]];
  return permutations(n - 1).flatMap((p) => Array.from({ length: n }, (_, k) => [...p.slice(0, k), n - 1, ...p.slice(k)]));
}

describe('assignment (Kuhn 1955)', () => {
  it('equals the brute-force optimum over all permutations', () => {
    const r = rng(3);
    for (let trial = 0; trial < 20; trial++) {
      const n = 2 + (trial % 5);
      const cost = new Float64Array(n * n).map(() => r());
      const m = assign(cost, n, n);
      const got = Array.from(m).reduce((s, j, i) => s + cost[i * n + j], 0);
      const best = Math.min(...permutations(n).map((p) => p.reduce((s, j, i) => s + cost[i * n + j], 0)));
      expect(got).toBeCloseTo(best, 12);
      expect(new Set(m).size).toBe(n);
    }
  });

  it('rectangular: extra rows get −1 (engine contract, matching.ts)', () => {
    const m = assign(Float64Array.from([1, 9, 9, 1, 5, 5]), 3, 2);
    expect(Array.from(m)).toEqual([0, 1, -1]);
  });

  it('poles are matched by nearest continuation on a log scale, not by list order', () => {
    // Expected by hand: each pole keeps its decade and angle (common practice for continuation).
    const before = [{ re: -1e3, im: 0 }, { re: -1e9, im: 0 }, { re: -2e6, im: 3e6 }];
    const after = [{ re: -1.1e9, im: 0 }, { re: -2.2e6, im: 2.9e6 }, { re: -0.5e3, im: 0 }];
    expect(Array.from(matchPoles(before, after))).toEqual([2, 0, 1]);
  });
});
