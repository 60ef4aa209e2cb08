import { describe, it, expect } from 'vitest';
import { Matrix, QrDecomposition } from 'ml-matrix';
import { finiteEigenvalues, generalizedEigenvalues } from '../../src/engine/linalg/qz';
import { rng } from '../bench/eig-bench';

type C = { re: number; im: number };
const rel = (a: C, b: C) => Math.hypot(a.re - b.re, a.im - b.im) / Math.hypot(b.re, b.im);

function sortedByMagnitude(v: C[]): C[] {
  return [...v].sort((p, q) => Math.hypot(p.re, p.im) - Math.hypot(q.re, q.im) || q.im - p.im);
}

/** Random orthogonal n×n (Q factor of a random matrix, ml-matrix QR), row-major. */
function randomOrthogonal(n: number, r: () => number): Float64Array {
  const M = new Matrix(Array.from({ length: n }, () => Array.from({ length: n }, () => r() - 0.5)));
  return Float64Array.from(new QrDecomposition(M).orthogonalMatrix.to1DArray());
}

function mul(X: Float64Array, Y: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) {
    const x = X[i * n + k];
    for (let j = 0; j < n; j++) out[i * n + j] += x * Y[k * n + j];
  }
  return out;
}

describe('closed forms', () => {
  it('diagonal pencil: λ_i = a_i/b_i exactly, b_i = 0 gives an infinite eigenvalue', () => {
    // Closed form: det(diag(a) − λ·diag(b)) = Π (a_i − λ b_i) (common practice).
    const a = [-3, 5e6, -1e-3, 2, 7, -11, 4];
    const b = [1, 0, 2e-9, 0.5, 0, 1e-6, 3];
    const n = a.length;
    const A = new Float64Array(n * n), B = new Float64Array(n * n);
    for (let i = 0; i < n; i++) { A[i * n + i] = a[i]; B[i * n + i] = b[i]; }
    const res = finiteEigenvalues(A, B, n);
    expect(res.infiniteCount).toBe(2);
    const expected = sortedByMagnitude(a.map((x, i) => ({ re: x / b[i], im: 0 })).filter((_, i) => b[i] !== 0));
    expect(res.values.length).toBe(expected.length);
    res.values.forEach((v, k) => { expect(v.re).toBe(expected[k].re); expect(v.im).toBe(0); });
  });

  it('orthogonally mixed diagonal pencil: same finite values and a known number of infinite ones', () => {
    // Q·(A − λB)·Z with Q, Z orthogonal has the eigenvalues of (A, B) (Golub & Van Loan §7.7);
    // the mixing makes every matrix dense so the QZ deflation of zero T diagonals is exercised.
    const r = rng(12);
    const n = 24;
    const diagA = Array.from({ length: n }, () => (r() < 0.5 ? -1 : 1) * (0.5 + r()));
    const diagB = Array.from({ length: n }, (_, i) => (i % 4 === 1 ? 0 : 0.5 + r()));
    const A0 = new Float64Array(n * n), B0 = new Float64Array(n * n);
    for (let i = 0; i < n; i++) { A0[i * n + i] = diagA[i]; B0[i * n + i] = diagB[i]; }
    const Q = randomOrthogonal(n, r), Z = randomOrthogonal(n, r);
    const A = mul(mul(Q, A0, n), Z, n), B = mul(mul(Q, B0, n), Z, n);
    for (const refine of [true, false]) {
      const res = finiteEigenvalues(A, B, n, { refine });
      expect(res.infiniteCount).toBe(6);
      const expected = sortedByMagnitude(diagA.map((x, i) => ({ re: x / diagB[i], im: 0 })).filter((_, i) => diagB[i] !== 0));
      expect(res.values.length).toBe(expected.length);
      res.values.forEach((v, k) => expect(rel(v, expected[k])).toBeLessThan(1e-9));
    }
    const g = generalizedEigenvalues(A, B, n);
    // The infinite ones come out with beta at rounding level, not as huge finite numbers.
    const tiny = Array.from(g.beta).filter((b, k) => Math.abs(b) < 1e-12 * Math.hypot(g.alphaRe[k], g.alphaIm[k]));
    expect(tiny.length).toBe(6);
  });

  it('stiff chain of buffered RC stages, τ from 1 ps to 1 s: every pole −1/(RC) to 1e-9', () => {
    // Closed form: a unity buffer isolates each RC section, so the poles are −1/(R_k C_k)
    // (common practice). MNA with the buffers as VCVS (branch currents, singular C).
    const stages = 13;
    const R = Array.from({ length: stages }, (_, k) => 10 ** (2 + (k % 4)));
    const tau = Array.from({ length: stages }, (_, k) => 10 ** (-12 + k));
    // Unknowns: u_k (buffer output), y_k (capacitor node), i_k (buffer branch), then scrambled.
    const n = 3 * stages;
    const order = Array.from({ length: n }, (_, i) => (i * 17) % n);
    const idx = (slot: number) => order[slot];
    const u = (k: number) => idx(3 * k), y = (k: number) => idx(3 * k + 1), br = (k: number) => idx(3 * k + 2);
    const G = new Float64Array(n * n), Cm = new Float64Array(n * n);
    const add = (M: Float64Array, i: number, j: number, v: number) => { M[i * n + j] += v; };
    for (let k = 0; k < stages; k++) {
      const g = 1 / R[k];
      add(G, u(k), u(k), g); add(G, y(k), y(k), g); add(G, u(k), y(k), -g); add(G, y(k), u(k), -g);
      add(Cm, y(k), y(k), tau[k] / R[k]);
      // VCVS, gain 1, output u_k to ground, controlled by y_{k−1} (stage 0: by ground).
      add(G, u(k), br(k), 1); add(G, br(k), u(k), 1);
      if (k > 0) add(G, br(k), y(k - 1), -1);
    }
    const A = G.map((v) => -v);
    const expected = sortedByMagnitude(tau.map((t) => ({ re: -1 / t, im: 0 })));
    for (const balance of [true, false]) {
      const res = finiteEigenvalues(A, Cm, n, { balance });
      expect(res.status).toBe('ok');
      expect(res.infiniteCount).toBe(2 * stages);
      expect(res.values.length).toBe(stages);
      res.values.forEach((v, k) => expect(rel(v, expected[k])).toBeLessThan(1e-9));
    }
  });

  it('series RLC: complex pair at ωn, Q (second-order section)', () => {
    // Closed form: s² + (R/L)s + 1/(LC) = 0, ωn = 1/√(LC), Q = √(L/C)/R (common practice).
    // Unknowns v1 (R–L node), v2 (L–C node), iL; inductor row: v1 − v2 − sL·iL = 0.
    const Rv = 10, L = 1e-6, Cv = 1e-9;
    const G = new Float64Array([1 / Rv, 0, 1, 0, 0, -1, 1, -1, 0]);
    const Cm = new Float64Array([0, 0, 0, 0, Cv, 0, 0, 0, -L]);
    const wn = 1 / Math.sqrt(L * Cv), Q = Math.sqrt(L / Cv) / Rv;
    const re = -wn / (2 * Q), im = wn * Math.sqrt(1 - 1 / (4 * Q * Q));
    const res = finiteEigenvalues(G.map((v) => -v), Cm, 3);
    expect(res.infiniteCount).toBe(1);
    expect(res.values.length).toBe(2);
    expect(rel(res.values[0], { re, im })).toBeLessThan(1e-12);
    expect(rel(res.values[1], { re, im: -im })).toBeLessThan(1e-12);
  });

  it('gm-C biquad: poles of s² + (G1/C1)s + gm1·gm2/(C1·C2), complex and overdamped', () => {
    // Closed form: two-integrator loop, ωn² = gm1·gm2/(C1·C2), Q = C1·ωn/G1 (common practice).
    for (const [gm1, gm2, G1, C1, C2] of [[1e-3, 2e-3, 1e-5, 1e-12, 2e-12], [1e-4, 1e-4, 3e-3, 1e-12, 1e-12]]) {
      const A = new Float64Array([-G1, -gm2, gm1, 0]);
      const B = new Float64Array([C1, 0, 0, C2]);
      const p = G1 / C1 / 2, q = (gm1 * gm2) / (C1 * C2);
      const disc = p * p - q;
      const expected = disc < 0
        ? [{ re: -p, im: Math.sqrt(-disc) }, { re: -p, im: -Math.sqrt(-disc) }]
        : [{ re: -q / (p + Math.sqrt(disc)), im: 0 }, { re: -(p + Math.sqrt(disc)), im: 0 }];
      const res = finiteEigenvalues(A, B, 2);
      expect(res.values.length).toBe(2);
      res.values.forEach((v, k) => expect(rel(v, expected[k])).toBeLessThan(1e-12));
    }
  });

  it('larger stiff network: third-order sections spread over 11 decades keep full accuracy', () => {
    // Block-diagonal pencil of gm-C biquads and RC poles, hidden by a fixed permutation and a
    // weak one-way coupling (lower block triangular), so each block's closed form still holds.
    const blocks: { A: number[]; B: number[]; poles: C[] }[] = [];
    for (let k = 0; k < 12; k++) {
      const w = 10 ** (0.8 + k), C1 = 1e-12, gm = w * C1;
      const G1 = (C1 * w) / 2; // Q = 2
      const p = G1 / C1 / 2, q = w * w;
      blocks.push({ A: [-G1, -gm, gm, 0], B: [C1, 0, 0, C1], poles: [{ re: -p, im: Math.sqrt(q - p * p) }, { re: -p, im: -Math.sqrt(q - p * p) }] });
    }
    const n = 2 * blocks.length;
    const perm = Array.from({ length: n }, (_, i) => (i * 7) % n);
    const A = new Float64Array(n * n), B = new Float64Array(n * n);
    blocks.forEach((b, k) => {
      for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) {
        A[perm[2 * k + i] * n + perm[2 * k + j]] = b.A[2 * i + j];
        B[perm[2 * k + i] * n + perm[2 * k + j]] = b.B[2 * i + j];
      }
      if (k > 0) A[perm[2 * k] * n + perm[2 * k - 1]] = 1e-4 * b.A[0]; // one-way coupling
    });
    const expected = sortedByMagnitude(blocks.flatMap((b) => b.poles));
    const res = finiteEigenvalues(A, B, n, { balance: false });
    expect(res.values.length).toBe(n);
    res.values.forEach((v, k) => expect(rel(v, expected[k])).toBeLessThan(1e-9));
  });
});

describe('bad input and edge sizes', () => {
  it('a non-finite entry gives a status and a message naming the matrix and the entry', () => {
    const A = new Float64Array([1, 0, 0, NaN]);
    const B = new Float64Array([1, 0, 0, 1]);
    const res = finiteEigenvalues(A, B, 2);
    expect(res.status).toBe('no-convergence');
    expect(res.message).toMatch(/entry \(1, 1\) of A/);
    expect(res.values).toEqual([]);
    const g = generalizedEigenvalues(B, new Float64Array([1, Infinity, 0, 1]), 2);
    expect(g.message).toMatch(/entry \(0, 1\) of B/);
  });

  it('a size mismatch is reported, not thrown', () => {
    const res = finiteEigenvalues(new Float64Array(3), new Float64Array(4), 2);
    expect(res.message).toMatch(/A has 3 entries, expected n·n = 4/);
  });

  it('n = 0 and n = 1', () => {
    expect(finiteEigenvalues(new Float64Array(0), new Float64Array(0), 0)).toMatchObject({ values: [], infiniteCount: 0, status: 'ok' });
    expect(finiteEigenvalues(new Float64Array([-2]), new Float64Array([4]), 1).values).toEqual([{ re: -0.5, im: 0 }]);
    expect(finiteEigenvalues(new Float64Array([-2]), new Float64Array([0]), 1).infiniteCount).toBe(1);
  });
});
