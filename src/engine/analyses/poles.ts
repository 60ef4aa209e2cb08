// Poles: finite generalized eigenvalues λ of (−G)·x = λ·C·x, i.e. det(G + λC) = 0 (QZ, Moler &
// Stewart 1973, via linalg/qz). Infinite eigenvalues (algebraic constraints: voltage sources,
// nodes without capacitance) are dropped and counted. A node whose only path to ground is
// capacitive makes G singular; each such null direction is a pole at exactly s = 0 (an ideal
// integrator), so the nullity of G tells how many of the smallest eigenvalues are that pole.

import type { MnaSystem } from '../types';
import { finiteEigenvalues } from '../linalg/qz';
import { factorDc, type DcFactor } from './dc';

export interface Pole {
  /** λ in rad/s. */
  re: number;
  im: number;
  /** |λ|/2π. */
  hz: number;
  /** Natural frequency |λ| in rad/s. */
  omegaN: number;
  /** ωn/(2·|re|) for a complex pair; null for real poles and for undamped pairs (|re| at
   *  roundoff level, reported as re = 0). */
  q: number | null;
  kind: 'origin' | 'real' | 'complex';
  /** Right half plane (re > 0): the small-signal model is unstable about this bias point. */
  rhp: boolean;
}

export interface PoleResult {
  poles: Pole[];
  infiniteCount: number;
  /** Number of poles at s = 0 (ideal integrators). */
  originCount: number;
  status: 'ok' | 'no-convergence' | 'empty';
  reason?: string;
}

/** Relative size below which an imaginary part is treated as zero (QZ roundoff on real poles). */
const REAL_TOL = 1e-12;
const UNDAMPED_TOL = 1e-11;

export function describePole(re: number, im: number, origin = false): Pole {
  if (origin || (re === 0 && im === 0)) return { re: 0, im: 0, hz: 0, omegaN: 0, q: null, kind: 'origin', rhp: false };
  const w = Math.hypot(re, im);
  const complex = Math.abs(im) > REAL_TOL * w;
  // A pair whose real part is at roundoff level is undamped (lossless LC): Q unbounded → null.
  const undamped = complex && Math.abs(re) <= UNDAMPED_TOL * w;
  const q = complex && !undamped ? w / (2 * Math.abs(re)) : null;
  return { re: undamped ? 0 : re, im: complex ? im : 0, hz: w / (2 * Math.PI), omegaN: w, q, kind: complex ? 'complex' : 'real', rhp: !undamped && re > 0 };
}

/** Polishing each eigenvalue on the original pencil costs one LU per eigenvalue (O(n⁴) in all);
 *  by default it is done for small systems only, where it is cheap. */
export const REFINE_UP_TO = 30;

export function computePoles(sys: Pick<MnaSystem, 'n' | 'G' | 'C'>, dc: DcFactor = factorDc(sys), opts: { refine?: boolean } = {}): PoleResult {
  const { n, G, C } = sys;
  if (n === 0) return { poles: [], infiniteCount: 0, originCount: 0, status: 'empty', reason: 'no unknowns' };
  const A = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) A[i] = -G[i];
  const eig = finiteEigenvalues(A, C, n, { refine: opts.refine ?? n <= REFINE_UP_TO });
  if (eig.status !== 'ok') {
    return { poles: [], infiniteCount: eig.infiniteCount, originCount: 0, status: 'no-convergence', reason: 'the eigenvalue iteration did not converge' };
  }
  const origin = dc.status !== 'regular' ? Math.min(dc.right.length, eig.values.length) : 0;
  // Values come sorted by |λ|: the first `origin` ones are the integrators.
  const poles = eig.values.map((v, i) => describePole(v.re, v.im, i < origin));
  const originCount = poles.filter((p) => p.kind === 'origin').length;
  return { poles, infiniteCount: eig.infiniteCount, originCount, status: 'ok' };
}
