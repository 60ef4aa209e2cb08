// Generalized eigenvalues of a real pencil (A, B), A·x = λ·B·x, by the QZ algorithm
// (Moler & Stewart 1973): balancing (LAPACK dggbal), QR of B, Hessenberg–triangular reduction,
// double-shift QZ iteration with deflation of infinite eigenvalues.
// Balancing permutes by default but does not scale unless asked (opts.scale): like LAPACK's
// dggev driver, which calls dggbal with job 'P'. On MNA pencils Ward's scaling grades the
// matrices so that the orthogonal transformations lost up to ~1e-9 relative accuracy on the
// random network pencils of the tests (measured against dggev while writing this).
// For circuit poles use A = −G, B = C of the MNA system (G + sC)·x = 0.
import { balancePencil } from './balance';
import { triangularizeB, hessenbergTriangular } from './hessenberg';
import { qzIterate } from './qz-iteration';
import { refineRealEigenvalue, refineComplexEigenvalue } from './refine';

const ULP = 2.220446049250313e-16;
/** A-priori relative error above which a finite eigenvalue is polished (see finiteEigenvalues). */
export const REFINE_ABOVE = 1e-11;

export interface GenEigResult {
  alphaRe: Float64Array;
  alphaIm: Float64Array;
  beta: Float64Array;
  status: 'ok' | 'no-convergence';
  iterations: number;
  /** Set when the input was rejected or the iteration stopped early; says what and where. */
  message?: string;
}

export interface FiniteEigenvalues {
  values: { re: number; im: number }[];
  infiniteCount: number;
  status: 'ok' | 'no-convergence';
  message?: string;
}

interface Internal extends GenEigResult {
  normA: number;
  normB: number;
  /** Active block of the balanced pencil and its Frobenius norms (positions outside it hold
   *  eigenvalues isolated by the permutation, which are exact ratios of entries). */
  ilo: number;
  ihi: number;
  activeNormA: number;
  activeNormB: number;
}

function frob(M: Float64Array): number {
  let s = 0;
  for (let k = 0; k < M.length; k++) s += M[k] * M[k];
  return Math.sqrt(s);
}

/** Clear message for malformed input, or null when the pencil can be processed. */
function checkInput(A: Float64Array, B: Float64Array, n: number): string | null {
  if (!Number.isInteger(n) || n < 0) return `pencil size n = ${n} is not a non-negative integer`;
  if (A.length !== n * n) return `matrix A has ${A.length} entries, expected n·n = ${n * n}`;
  if (B.length !== n * n) return `matrix B has ${B.length} entries, expected n·n = ${n * n}`;
  for (let k = 0; k < n * n; k++) {
    if (!Number.isFinite(A[k])) return `entry (${Math.floor(k / n)}, ${k % n}) of A is not finite (${A[k]})`;
    if (!Number.isFinite(B[k])) return `entry (${Math.floor(k / n)}, ${k % n}) of B is not finite (${B[k]})`;
  }
  return null;
}

function solve(A: Float64Array, B: Float64Array, n: number, balance: boolean, scale: boolean): Internal {
  const empty = () => new Float64Array(Math.max(0, n | 0));
  const bad = checkInput(A, B, n);
  if (bad) {
    return { alphaRe: empty(), alphaIm: empty(), beta: empty(), status: 'no-convergence', iterations: 0, message: bad, normA: 0, normB: 0, ilo: 0, ihi: -1, activeNormA: 0, activeNormB: 0 };
  }
  const bal = balancePencil(A, B, n, { permute: balance, scale });
  const alphaRe = new Float64Array(n), alphaIm = new Float64Array(n), beta = new Float64Array(n);
  // Eigenvalues isolated by the permutation: 1×1 diagonal blocks outside [ilo, ihi].
  for (let i = 0; i < n; i++) {
    if (i >= bal.ilo && i <= bal.ihi) continue;
    let a = bal.A[i * n + i], b = bal.B[i * n + i];
    if (b < 0) { a = -a; b = -b; }
    alphaRe[i] = a; beta[i] = b;
  }
  const { ilo, ihi } = bal;
  const m = ihi - ilo + 1;
  let status: 'ok' | 'no-convergence' = 'ok';
  let iterations = 0;
  let message: string | undefined;
  let activeNormA = 0, activeNormB = 0;
  if (m > 0) {
    const H = new Float64Array(m * m), T = new Float64Array(m * m);
    for (let i = 0; i < m; i++) {
      H.set(bal.A.subarray((i + ilo) * n + ilo, (i + ilo) * n + ihi + 1), i * m);
      T.set(bal.B.subarray((i + ilo) * n + ilo, (i + ilo) * n + ihi + 1), i * m);
    }
    activeNormA = frob(H); activeNormB = frob(T);
    triangularizeB(H, T, m);
    hessenbergTriangular(H, T, m);
    const out = qzIterate(H, T, m);
    iterations = out.iterations;
    alphaRe.set(out.alphaRe, ilo); alphaIm.set(out.alphaIm, ilo); beta.set(out.beta, ilo);
    if (!out.converged) {
      status = 'no-convergence';
      message = `QZ iteration did not converge after ${out.iterations} steps (pencil of size ${n})`;
    }
  }
  return { alphaRe, alphaIm, beta, status, iterations, message, normA: frob(bal.A), normB: frob(bal.B), ilo, ihi, activeNormA, activeNormB };
}

/** All n generalized eigenvalues as (alphaRe + i·alphaIm)/beta, beta ≥ 0, like LAPACK dggev.
 *  A complex pair occupies positions j, j+1 with alphaIm[j] > 0. */
export function generalizedEigenvalues(A: Float64Array, B: Float64Array, n: number,
  opts: { balance?: boolean; scale?: boolean } = {}): GenEigResult {
  const { normA: _a, normB: _b, ilo: _l, ihi: _h, activeNormA: _na, activeNormB: _nb, ...res } = solve(A, B, n, opts.balance !== false, opts.scale === true);
  return res;
}

/** |λ| order, conjugate pairs adjacent with the positive imaginary part first. */
function byMagnitude(p: { re: number; im: number }, q: { re: number; im: number }): number {
  return Math.hypot(p.re, p.im) - Math.hypot(q.re, q.im) || p.re - q.re || Math.abs(p.im) - Math.abs(q.im) || q.im - p.im;
}

/** Finite eigenvalues λ = alpha/beta, infinite ones dropped and counted. Infinite means
 *  |beta|/‖B‖ ≤ tol·|alpha|/‖A‖ (norms of the balanced pencil, tol = 100·n·ulp).
 *  With refine (default) a finite λ is polished on the original pencil (see refine.ts) when the
 *  a-priori QZ error estimate ulp·(S + |λ|)/|λ| exceeds REFINE_ABOVE, S being the scale of the
 *  active block (max of ‖A‖/‖B‖ and its largest finite |λ|): i.e. when |λ| lies more than
 *  ~4.7 decades below the block's scale (stiff networks). The others are at that accuracy times
 *  their condition number; polishing every λ would cost one LU each. */
export function finiteEigenvalues(A: Float64Array, B: Float64Array, n: number,
  opts: { refine?: boolean; balance?: boolean; scale?: boolean } = {}): FiniteEigenvalues {
  const r = solve(A, B, n, opts.balance !== false, opts.scale === true);
  const values: { re: number; im: number }[] = [];
  let infiniteCount = 0;
  if (r.message && r.iterations === 0 && r.status !== 'ok') {
    return { values, infiniteCount, status: r.status, message: r.message };
  }
  const tol = 100 * Math.max(n, 1) * ULP;
  const isInfinite = (k: number) => {
    const b = r.beta[k];
    // strict: with A = 0 (e.g. a lone capacitor, G = 0) both sides are 0 and λ = 0 is finite
    return b === 0 || Math.abs(b) * r.normA < tol * Math.hypot(r.alphaRe[k], r.alphaIm[k]) * r.normB;
  };
  const scale = { normA: frob(A), normB: frob(B) };
  // Raw QZ values first: the polish of one must stay closer to it than to any other.
  const raw: { k: number; re: number; im: number }[] = [];
  for (let k = 0; k < n; k++) {
    if (isInfinite(k)) { infiniteCount++; continue; }
    raw.push({ k, re: r.alphaRe[k] / r.beta[k], im: r.alphaIm[k] / r.beta[k] });
  }
  // Scale of the active block: its norm ratio or its largest finite eigenvalue, whichever is
  // larger; QZ's absolute error is about ulp times that scale.
  let blockScale = r.activeNormB > 0 ? r.activeNormA / r.activeNormB : 0;
  for (const v of raw) if (v.k >= r.ilo && v.k <= r.ihi) blockScale = Math.max(blockScale, Math.hypot(v.re, v.im));
  const wantsPolish = (k: number, mag: number) => opts.refine !== false && k >= r.ilo && k <= r.ihi &&
    ULP * (blockScale + mag) > REFINE_ABOVE * mag;
  // Polish the members with im ≥ 0 (a pair's other member is its exact conjugate).
  const heads = raw.filter((v) => v.im >= 0);
  const final = heads.map((v) => {
    if (!wantsPolish(v.k, Math.hypot(v.re, v.im))) return { re: v.re, im: v.im, moved: 0 };
    const p = v.im === 0
      ? (() => { const x = refineRealEigenvalue(A, B, n, v.re, scale); return x === null ? null : { re: x, im: 0 }; })()
      : refineComplexEigenvalue(A, B, n, v.re, v.im, scale);
    if (p === null || (v.im > 0 && !(p.im > 0))) return { re: v.re, im: v.im, moved: 0 };
    return { re: p.re, im: p.im, moved: Math.hypot(p.re - v.re, p.im - v.im) };
  });
  // Two QZ values polished onto the same eigenvalue: the one that moved farther reverts.
  for (let i = 0; i < final.length; i++) {
    if (final[i].moved === 0) continue;
    for (let j = 0; j < final.length; j++) {
      if (j === i) continue;
      const d = Math.hypot(final[i].re - final[j].re, final[i].im - final[j].im);
      if (d <= 1e-6 * Math.hypot(final[i].re, final[i].im) && final[i].moved >= final[j].moved) {
        final[i] = { re: heads[i].re, im: heads[i].im, moved: 0 };
        break;
      }
    }
  }
  for (const v of final) {
    values.push({ re: v.re, im: v.im });
    if (v.im > 0) values.push({ re: v.re, im: -v.im });
  }
  values.sort(byMagnitude);
  return { values, infiniteCount, status: r.status, message: r.message };
}
