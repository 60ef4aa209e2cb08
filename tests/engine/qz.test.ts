import { describe, it, expect } from 'vitest';
import { EigenvalueDecomposition } from 'ml-matrix';
import { finiteEigenvalues, generalizedEigenvalues } from '../../src/engine/linalg/qz';
import { dggev, splitFinite } from '../bench/emlapack';
import { randomNetworkPencil, standardForm, rng } from '../bench/eig-bench';

type C = { re: number; im: number };

function frob(M: Float64Array): number {
  let s = 0;
  for (const v of M) s += v * v;
  return Math.sqrt(s);
}

/** Largest relative distance from each reference value to its own partner in `ours`
 *  (greedy one-to-one nearest matching; sizes must agree). */
function worstRelativeMismatch(ref: C[], ours: C[]): number {
  if (ref.length !== ours.length) return Infinity;
  const used = new Array(ours.length).fill(false);
  let worst = 0;
  for (const p of ref) {
    let best = -1, bestD = Infinity;
    for (let k = 0; k < ours.length; k++) {
      if (used[k]) continue;
      const d = Math.hypot(p.re - ours[k].re, p.im - ours[k].im);
      if (d < bestD) { bestD = d; best = k; }
    }
    used[best] = true;
    worst = Math.max(worst, bestD / Math.hypot(p.re, p.im));
  }
  return worst;
}

describe('finite generalized eigenvalues against LAPACK dggev (emlapack)', () => {
  // Reference: LAPACK dggev (reference implementation compiled to wasm, independent library).
  for (const n of [4, 12, 30, 60, 120, 200]) {
    it(`random RC/gm network pencil with sources, n = ${n}`, () => {
      for (const seed of n >= 120 ? [1] : [1, 2, 3]) {
        const p = randomNetworkPencil(n, seed * 977 + n);
        const ref = splitFinite(dggev(p.A, p.B, n), frob(p.A), frob(p.B));
        const ours = finiteEigenvalues(p.A, p.B, n);
        expect(ours.status).toBe('ok');
        // Count of infinite eigenvalues: same as LAPACK's (zero rows of C and source branches).
        expect(ours.infiniteCount).toBe(ref.infinite);
        expect(ours.values.length).toBe(ref.finite.length);
        expect(ours.values.length + ours.infiniteCount).toBe(n);
        // Same finite eigenvalues to 1e-9 relative.
        expect(worstRelativeMismatch(ref.finite, ours.values)).toBeLessThan(1e-9);
      }
    });
  }

  it('an index-one network has at least as many infinite eigenvalues as bare nodes and sources', () => {
    // Fact of the trade: every unknown without a capacitor (node or source branch) removes one
    // finite pole; rank C = number of finite poles for an index-one pencil.
    const n = 40;
    const p = randomNetworkPencil(n, 4242);
    const ours = finiteEigenvalues(p.A, p.B, n);
    const bare = p.bareNodes.length + (n - p.nodeCount);
    expect(ours.infiniteCount).toBe(bare);
  });

  it('without refinement the raw QZ values also agree with dggev', () => {
    const n = 80;
    const p = randomNetworkPencil(n, 31337);
    const ref = splitFinite(dggev(p.A, p.B, n), frob(p.A), frob(p.B));
    const raw = finiteEigenvalues(p.A, p.B, n, { refine: false });
    expect(raw.infiniteCount).toBe(ref.infinite);
    expect(worstRelativeMismatch(ref.finite, raw.values)).toBeLessThan(1e-9);
  });

  it('dense random pencils (no structure): all eigenvalues finite and equal to dggev', () => {
    const r = rng(99);
    for (const n of [3, 17, 50]) {
      const A = new Float64Array(n * n).map(() => r() - 0.5);
      const B = new Float64Array(n * n).map(() => r() - 0.5);
      const ref = splitFinite(dggev(A, B, n), frob(A), frob(B));
      const ours = finiteEigenvalues(A, B, n, { refine: false });
      expect(ref.infinite).toBe(0);
      expect(ours.infiniteCount).toBe(0);
      expect(worstRelativeMismatch(ref.finite, ours.values)).toBeLessThan(1e-9);
    }
  });
});

describe('finite eigenvalues against ml-matrix EigenvalueDecomposition of −C⁻¹G', () => {
  // Reference: ml-matrix (independent library, Hessenberg QR of the standard matrix −C⁻¹G).
  for (const n of [8, 40, 100]) {
    it(`network with invertible C, n = ${n}`, () => {
      const p = randomNetworkPencil(n, 555 + n, { invertibleC: true });
      const e = new EigenvalueDecomposition(standardForm(p), { assumeSymmetric: false });
      const ref = e.realEigenvalues.map((re, k) => ({ re, im: e.imaginaryEigenvalues[k] }));
      const ours = finiteEigenvalues(p.A, p.B, n);
      expect(ours.infiniteCount).toBe(0);
      expect(worstRelativeMismatch(ref, ours.values)).toBeLessThan(1e-9);
    });
  }
});

describe('output conventions', () => {
  it('pairs are exact conjugates, positive imaginary part first, sorted by |λ|', () => {
    const n = 60;
    const p = randomNetworkPencil(n, 8080);
    const { values } = finiteEigenvalues(p.A, p.B, n);
    let pairs = 0;
    for (let k = 0; k < values.length; k++) {
      if (k > 0) expect(Math.hypot(values[k].re, values[k].im)).toBeGreaterThanOrEqual(Math.hypot(values[k - 1].re, values[k - 1].im));
      if (values[k].im > 0) {
        pairs++;
        expect(values[k + 1].re).toBe(values[k].re);
        expect(values[k + 1].im).toBe(-values[k].im);
      }
    }
    // This seeded network does have complex poles (so the checks above were exercised).
    expect(pairs).toBeGreaterThan(0);
  });

  it('generalizedEigenvalues: beta ≥ 0, pairs at (j, j+1) with alphaIm[j] > 0 (dggev layout)', () => {
    const n = 30;
    const p = randomNetworkPencil(n, 77);
    const g = generalizedEigenvalues(p.A, p.B, n);
    expect(g.status).toBe('ok');
    for (let j = 0; j < n; j++) {
      expect(g.beta[j]).toBeGreaterThanOrEqual(0);
      if (g.alphaIm[j] > 0) {
        expect(g.alphaIm[j + 1]).toBe(-g.alphaIm[j]);
        expect(g.beta[j + 1]).toBe(g.beta[j]);
        j++;
      } else {
        expect(g.alphaIm[j]).toBe(0);
      }
    }
  });

  it('works with balancing off, and with Ward scaling on', () => {
    const n = 50;
    const p = randomNetworkPencil(n, 2024);
    const ref = splitFinite(dggev(p.A, p.B, n), frob(p.A), frob(p.B));
    for (const opts of [{ balance: false }, { scale: true }]) {
      const ours = finiteEigenvalues(p.A, p.B, n, opts);
      expect(ours.infiniteCount).toBe(ref.infinite);
      expect(worstRelativeMismatch(ref.finite, ours.values)).toBeLessThan(1e-9);
    }
  });
});
