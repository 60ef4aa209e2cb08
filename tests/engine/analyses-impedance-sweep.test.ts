import { describe, it, expect } from 'vitest';
import { Hand } from './analyses-handmna';
import { computePoles } from '../../src/engine/analyses/poles';
import { impedanceSweep } from '../../src/engine/analyses/impedance-sweep';
import { impedancesAt } from '../../src/engine/analyses/impedance';
import { logGrid } from '../../src/engine/analyses/frequency';
import { complex, lusolve, matrix, type Complex } from 'mathjs';

const TWO_PI = 2 * Math.PI;

function compareToDirect(sys: ReturnType<Hand['build']>, grid: Float64Array) {
  const poles = computePoles(sys).poles;
  const sw = impedanceSweep(sys, grid, { poles });
  grid.forEach((f, i) => {
    const ref = impedancesAt(sys, { re: 0, im: TWO_PI * f }).values;
    const big = Math.max(...ref.map((z) => (z ? Math.hypot(z.re, z.im) : 0)));
    ref.forEach((z, k) => {
      const got = sw.values[k][i]!;
      expect(Math.hypot(got.re - z!.re, got.im - z!.im)).toBeLessThan(1e-7 * Math.max(Math.hypot(z!.re, z!.im), 1e-9 * big));
    });
  });
  return sw;
}

describe('node impedances over frequency', () => {
  it('modal form equals the direct solve (one LU per frequency) on a CS stage with source resistance (Kailath, partial fractions)', () => {
    const sys = new Hand().V('vin', 'src', '0').R('rs', 'src', 'g', 5e3)
      .G('m1', 'out', '0', 'g', '0', 3e-3).R('rd', 'out', '0', 12e3)
      .C('cgs', 'g', '0', 150e-15).C('cgd', 'g', 'out', 40e-15).C('cdb', 'out', '0', 300e-15)
      .build('vin', 'out');
    const sw = compareToDirect(sys, logGrid(1e3, 1e12, 10));
    expect(sw.method).toBe('modal');
  });

  it('RC node: Z = R/(1 + jωRC) at every grid point (common practice)', () => {
    const R = 1e3, C = 1e-9;
    const sys = new Hand().V('vin', 'in', '0').R('r1', 'in', 'out', R).C('c1', 'out', '0', C).build('vin', 'out');
    const grid = logGrid(1, 1e9, 10);
    const sw = impedanceSweep(sys, grid, { poles: computePoles(sys).poles });
    const k = sw.nodes.indexOf('out');
    grid.forEach((f, i) => {
      const w = TWO_PI * f * R * C;
      const z = sw.values[k][i]!;
      expect(z.re / (R / (1 + w * w))).toBeCloseTo(1, 8);
      expect(z.im / ((-R * w) / (1 + w * w))).toBeCloseTo(1, 8);
    });
  });

  it('repeated poles (two identical stages) stay exact, modal or not (common practice)', () => {
    const sys = new Hand().V('vin', 'in', '0')
      .G('g1', 'a', '0', 'in', '0', 1e-3).R('r1', 'a', '0', 1e4).C('c1', 'a', '0', 1e-12)
      .G('g2', 'b', '0', 'a', '0', 1e-3).R('r2', 'b', '0', 1e4).C('c2', 'b', '0', 1e-12)
      .build('vin', 'b');
    const sw = compareToDirect(sys, logGrid(1e4, 1e10, 5));
    // Node b: Z = R/(1 + jωRC) regardless of the method (its own RC only).
    const k = sw.nodes.indexOf('b');
    const w = TWO_PI * 1e7 * 1e4 * 1e-12;
    const i = sw.hz.findIndex((f) => Math.abs(f / 1e7 - 1) < 1e-9);
    expect(sw.values[k][i]!.re / (1e4 / (1 + w * w))).toBeCloseTo(1, 8);
  });

  it('an integrator node (pole at s = 0) is still swept correctly', () => {
    const sys = new Hand().V('vin', 'in', '0').G('g1', 'x', '0', 'in', '0', 1e-3).C('c1', 'x', '0', 1e-12)
      .R('r', 'in', 'y', 1e3).C('c2', 'y', '0', 2e-12).build('vin', 'x');
    const sw = compareToDirect(sys, logGrid(1e3, 1e11, 8));
    const k = sw.nodes.indexOf('x');
    // Z_x = 1/(jωC) (common practice)
    expect(sw.values[k][0]!.im * TWO_PI * 1e3 * 1e-12).toBeCloseTo(-1, 8);
  });
});

describe('node impedances over frequency on a clustered, non-normal chain', () => {
  // Fifty-eight inverting gm stages in a row with Miller and skip capacitors and weak overall feedback:
  // the poles crowd into a ring near 1 GHz (ill-conditioned eigenvalues), the hard case for a
  // partial-fraction sweep. Every grid point up to 1 THz must still match the direct solve.
  function chain() {
    const h = new Hand().V('vin', 'in', '0').R('rin', 'in', 'n0', 10e3);
    for (let k = 0; k < 58; k++) {
      const g = `n${k}`, d = `n${k + 1}`;
      h.G(`m${k}`, d, '0', g, '0', (0.8 + (k % 5) * 0.1) * 1e-3).R(`ro${k}`, d, '0', 50e3).R(`r${k}`, d, '0', 1e3 * (1 + (k % 3) * 0.1))
        .C(`cgs${k}`, g, '0', (100 + 7 * k) * 1e-15).C(`cgd${k}`, g, d, 15e-15).C(`cdb${k}`, d, '0', 30e-15);
      if (k >= 2) h.C(`cx${k}`, d, `n${k - 2}`, 3e-15);
    }
    h.R('rfb', 'n58', 'n0', 1e6);
    return h.build('vin', 'n58');
  }

  it('sweep equals the direct solve at every frequency, top of the grid included (Kailath, partial fractions)', () => {
    compareToDirect(chain(), logGrid(1e3, 1e12, 11));
  });

  it('the direct solve itself matches mathjs lusolve on complex matrices (independent library)', () => {
    const sys = chain();
    const { n, G, C } = sys;
    for (const f of [1e6, 3e9, 1e12]) {
      const w = TWO_PI * f;
      const rows = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => complex(G[i * n + j], w * C[i * n + j])));
      const ours = impedancesAt(sys, { re: 0, im: w }).values;
      for (const k of [1, 20, 40, 59]) { // n0, n19, n39, n58 (index 0 is the source node, Z = 0)
        const e = Array.from({ length: n }, (_, i) => [complex(i === k ? 1 : 0, 0)]);
        const x = complex(lusolve(matrix(rows), matrix(e)).get([k, 0]) as Complex);
        const z = ours[k]!;
        expect(Math.hypot(z.re - x.re, z.im - x.im)).toBeLessThan(1e-9 * Math.hypot(x.re, x.im));
      }
    }
  });
});
