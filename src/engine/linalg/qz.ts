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
export const REFINE_ABOVE = 1e-13;

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
 *  a-priori QZ error estimate ulp·(‖A‖ + |λ|‖B‖)/(|λ|‖B‖) of the active block exceeds
 *  REFINE_ABOVE, i.e. when |λ| is small against the pencil's own scale ‖A‖/‖B‖ (stiff
 *  networks); the others are already at that accuracy times their condition number. */
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
    return b === 0 || Math.abs(b) * r.normA <= tol * Math.hypot(r.alphaRe[k], r.alphaIm[k]) * r.normB;
  };
  const scale = { normA: frob(A), normB: frob(B) };
  const wantsPolish = (k: number, mag: number) => opts.refine !== false && k >= r.ilo && k <= r.ihi &&
    ULP * (r.activeNormA + mag * r.activeNormB) > REFINE_ABOVE * mag * r.activeNormB;
  for (let k = 0; k < n; k++) {
    if (isInfinite(k)) { infiniteCount++; continue; }
    const re = r.alphaRe[k] / r.beta[k];
    const im = r.alphaIm[k] / r.beta[k];
    const refine = wantsPolish(k, Math.hypot(re, im));
    if (im === 0) {
      const v = refine ? refineRealEigenvalue(A, B, n, re, scale) : null;
      values.push({ re: v !== null && accept(v, 0, re, 0) ? v : re, im: 0 });
    } else if (im > 0) {
      const v = refine ? refineComplexEigenvalue(A, B, n, re, im, scale) : null;
      const ok = v !== null && v.im > 0 && accept(v.re, v.im, re, im);
      const vr = ok ? v.re : re, vi = ok ? v.im : im;
      values.push({ re: vr, im: vi }, { re: vr, im: -vi });
    }
    // im < 0: the conjugate of the preceding positive member, already pushed.
  }
  values.sort(byMagnitude);
  return { values, infiniteCount, status: r.status, message: r.message };
}

/** A polished value is kept only if it stayed near the QZ value (it did not jump to another
 *  eigenvalue); 1e-6 relative is far above the QZ error of any λ worth polishing. */
function accept(re: number, im: number, re0: number, im0: number): boolean {
  return Math.hypot(re - re0, im - im0) <= 1e-6 * Math.hypot(re0, im0);
}
