// Transmission zeros of the chosen transfer H(s) = cᵀ(G + sC)⁻¹b as the finite eigenvalues of the
// Rosenbrock system pencil (Rosenbrock 1970, State-space and Multivariable Theory):
//   A = −[[G, b], [cᵀ, 0]],  B = [[C, 0], [0, 0]],  det(A − λB) = −det(G + λC)·H(λ) (Schur complement).
// The pencil is singular (det ≡ 0) when H ≡ 0 (no path from input to output) or when G + sC is
// singular for every s; both are detected at probe points and reported instead of returning
// arbitrary eigenvalues. Zeros that sit on a pole are flagged (pole-zero cancellation).

import type { Cx, MnaSystem } from '../types';
import { finiteEigenvalues } from '../linalg/qz';
import { factorPencilAt, solveScaledComplex } from './scaling';
import { isZeroVector } from './transfer';
import { REFINE_UP_TO, type Pole } from './poles';

export interface Zero {
  re: number;
  im: number;
  hz: number;
  /** Right half plane zero (re > 0), e.g. the feedforward zero gm/Cgd of a CS stage. */
  rhp: boolean;
  /** The zero coincides with a pole (an uncontrollable or unobservable mode); it cancels in H. */
  cancelsPole: boolean;
}

export interface ZeroResult {
  zeros: Zero[];
  /** Zeros at infinity, as counted by the eigenvalue routine. */
  infiniteCount: number;
  status: 'ok' | 'no-input' | 'no-output' | 'identically-zero' | 'singular-pencil' | 'no-convergence';
  reason?: string;
}

type ZeroSys = Pick<MnaSystem, 'n' | 'G' | 'C' | 'b' | 'c'>;

function maxAbs(v: Float64Array): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) m = Math.max(m, Math.abs(v[i]));
  return m;
}

/** H at a probe s, with how much cancellation it took: |H| / (‖c‖·‖x‖). Null if G + sC is singular. */
function probe(sys: ZeroSys, s: Cx): { rel: number } | null {
  const { n, G, C, b, c } = sys;
  const f = factorPencilAt(G, C, n, s);
  if (f.singular) return null;
  const [xr, xi] = solveScaledComplex(f, b);
  let hr = 0, hi = 0, xs = 0, cs = 0;
  for (let i = 0; i < n; i++) {
    hr += c[i] * xr[i]; hi += c[i] * xi[i];
    xs += Math.abs(xr[i]) + Math.abs(xi[i]);
    cs += Math.abs(c[i]);
  }
  const rel = Math.hypot(hr, hi) / Math.max(cs * xs, 1e-300);
  return Number.isFinite(rel) ? { rel } : null;
}

export function computeZeros(sys: ZeroSys, poles: Pole[] = [], opts: { refine?: boolean } = {}): ZeroResult {
  const { n, G, C, b, c } = sys;
  if (isZeroVector(b)) return { zeros: [], infiniteCount: 0, status: 'no-input', reason: 'no input source chosen' };
  if (isZeroVector(c)) return { zeros: [], infiniteCount: 0, status: 'no-output', reason: 'no output chosen' };
  // Probe points of pole-like size, off the axes so they miss poles and zeros of a real circuit.
  const gMax = maxAbs(G);
  const cMax = maxAbs(C);
  const w0 = cMax > 0 && gMax > 0 ? gMax / cMax : 1;
  // Also far below w0: a high-order low-pass (a long amplifier chain) is attenuated below
  // roundoff at w0 without being identically zero.
  const probes = [{ re: -0.3719 * w0, im: 0.8713 * w0 }, { re: 0.5521 * w0, im: -1.9273 * w0 }, { re: -2.71e-3 * w0, im: 3.1e-3 * w0 },
    { re: -2.9e-7 * w0, im: 4.1e-7 * w0 }, { re: -3.3e-11 * w0, im: 2.3e-11 * w0 }];
  const results = probes.map((s) => probe(sys, s));
  if (results.every((r) => r === null)) {
    return { zeros: [], infiniteCount: 0, status: 'singular-pencil', reason: 'G + sC is singular at every probe point: the circuit equations have no unique solution' };
  }
  if (results.every((r) => r === null || r.rel < 1e-13)) {
    return { zeros: [], infiniteCount: 0, status: 'identically-zero', reason: 'the output does not respond to the input (H(s) ≡ 0), so zeros are undefined' };
  }
  // Scaling b and c by the size of G does not move the zeros and keeps the pencil balanced.
  const k = gMax > 0 ? gMax : 1;
  const m = n + 1;
  const A = new Float64Array(m * m);
  const B = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      A[i * m + j] = -G[i * n + j];
      B[i * m + j] = C[i * n + j];
    }
    A[i * m + n] = -k * b[i];
    A[n * m + i] = -k * c[i];
  }
  const eig = finiteEigenvalues(A, B, m, { refine: opts.refine ?? m <= REFINE_UP_TO });
  if (eig.status !== 'ok') return { zeros: [], infiniteCount: eig.infiniteCount, status: 'no-convergence', reason: 'the eigenvalue iteration did not converge' };
  const zeros = eig.values.map((v) => {
    const w = Math.hypot(v.re, v.im);
    const im = Math.abs(v.im) > 1e-12 * w ? v.im : 0;
    const cancelsPole = poles.some((p) => Math.hypot(p.re - v.re, p.im - v.im) <= 1e-7 * Math.max(w, p.omegaN, 1e-300));
    return { re: v.re, im, hz: w / (2 * Math.PI), rhp: v.re > 0, cancelsPole };
  });
  return { zeros, infiniteCount: eig.infiniteCount, status: 'ok' };
}
