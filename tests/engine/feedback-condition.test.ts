// The pencil's condition estimate (feedback/condition.ts) against the exact 1-norm condition
// number of the same equilibrated matrix, inverted by mathjs (an independent library). Hager's
// estimator is a lower bound that is in practice within a factor of about 3 (Higham 1988); the
// equilibration makes the figure blind to a diagonal rescaling of rows and columns.
import { describe, expect, it } from 'vitest';
import { complex, inv, matrix, abs, type Complex, type Matrix } from 'mathjs';
import { PencilAt } from '../../src/engine/feedback/pencil';
import { pencilCondition } from '../../src/engine/feedback/condition';
import { rng } from '../seeded';

function exactCondition(G: Float64Array, C: Float64Array, n: number, omega: number): number {
  const mag = (i: number, j: number) => Math.hypot(G[i * n + j], omega * C[i * n + j]);
  const r = Array.from({ length: n }, (_, i) => 1 / Math.max(...Array.from({ length: n }, (_, j) => mag(i, j))));
  const s = Array.from({ length: n }, (_, j) => 1 / Math.max(...Array.from({ length: n }, (_, i) => r[i] * mag(i, j))));
  const rows = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => complex(G[i * n + j] * r[i] * s[j], omega * C[i * n + j] * r[i] * s[j])));
  const norm1 = (m: (Complex | number)[][]) => Math.max(...Array.from({ length: n }, (_, j) => m.reduce((t, row) => t + (abs(row[j]) as number), 0)));
  const A = matrix(rows);
  const Ai = (inv(A) as Matrix).toArray() as Complex[][];
  return norm1(rows) * norm1(Ai);
}

describe('pencil condition estimate', () => {
  it('is a lower bound within a factor 3 of the exact κ₁ (Higham 1988) on seeded pencils', () => {
    const rnd = rng(11);
    for (let trial = 0; trial < 8; trial++) {
      const n = 6 + trial;
      const G = Float64Array.from({ length: n * n }, () => (rnd() - 0.5) * 10 ** Math.floor(rnd() * 6 - 3));
      const C = Float64Array.from({ length: n * n }, () => (rnd() < 0.3 ? rnd() * 1e-12 : 0));
      for (const omega of [0, 2 * Math.PI * 1e9]) {
        const est = pencilCondition(G, C, n, omega, new PencilAt(G, C, n, omega));
        const exact = exactCondition(G, C, n, omega);
        expect(est).toBeLessThanOrEqual(exact * (1 + 1e-9));
        expect(est).toBeGreaterThanOrEqual(exact / 3);
      }
    }
  });

  it('ignores row and column scaling (a mix of mΩ and GΩ) but sees a near-singular matrix', () => {
    // [[1, 1], [1, 1 + δ]]: κ ≈ 4/δ whatever the scaling of its rows and columns (from memory)
    const delta = 1e-6;
    const base = [1, 1, 1, 1 + delta];
    const scaled = Float64Array.from(base.map((v, k) => v * [1e3, 1e-3][k >> 1] * [1e-3, 1e3][k & 1]));
    const C = new Float64Array(4);
    const plain = pencilCondition(Float64Array.from(base), C, 2, 0, new PencilAt(Float64Array.from(base), C, 2, 0));
    const rescaled = pencilCondition(scaled, C, 2, 0, new PencilAt(scaled, C, 2, 0));
    expect(plain).toBeGreaterThan(1e6);
    expect(plain).toBeLessThan(1e7);
    expect(rescaled / plain).toBeGreaterThan(0.3);
    expect(rescaled / plain).toBeLessThan(3);
    const wellScaled = Float64Array.from([1e6, 0, 0, 1e-6]);
    expect(pencilCondition(wellScaled, C, 2, 0, new PencilAt(wellScaled, C, 2, 0))).toBeLessThan(2);
  });
});
