// Right and left eigenvectors of the pencil (A, B) for one finite eigenvalue λ, by inverse
// iteration (Wilkinson 1965; Golub & Van Loan §7.6.1) with one complex LU of A − σB, σ a hair
// off λ so the factor stays regular: x ← (A − σB)⁻¹·B·x, y ← (A − σB)⁻ᴴ·Bᴴ·y.
import { luComplex, solveComplex, solveComplexAdjoint, type ComplexLU } from './lu';
import { mulComplex, sparseRows, type SparseRows } from './sparse';

export interface EigenvectorPair {
  rightRe: Float64Array;
  rightIm: Float64Array;
  leftRe: Float64Array;
  leftIm: Float64Array;
  /** ‖(A − λB)x‖ / ((‖A‖ + |λ|‖B‖)·‖x‖), Frobenius norms; Infinity when no vector was found. */
  residual: number;
}

const OFFSETS = [1e-10, 1e-7, 1e-4];
const STEPS = 3;

function frob(M: Float64Array): number {
  let s = 0;
  for (let k = 0; k < M.length; k++) s += M[k] * M[k];
  return Math.sqrt(s);
}

function start(n: number, salt: number): Float64Array {
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) v[i] = 1 + 0.37 * (((i + 1) * 7919 + salt * 104729) % 61) / 61;
  return v;
}

/** (re, im) ← (re, im)/‖·‖₂; false if the vector is zero or not finite. */
function normalize(re: Float64Array, im: Float64Array): boolean {
  let s = 0;
  for (let i = 0; i < re.length; i++) s += re[i] * re[i] + im[i] * im[i];
  if (!(s > 0) || !Number.isFinite(s)) return false;
  const f = 1 / Math.sqrt(s);
  for (let i = 0; i < re.length; i++) { re[i] *= f; im[i] *= f; }
  return true;
}

/** Multiply by the unit phase that makes the largest entry real and positive. */
function rotateLargestReal(re: Float64Array, im: Float64Array): void {
  let best = -1, k = 0;
  for (let i = 0; i < re.length; i++) {
    const m = re[i] * re[i] + im[i] * im[i];
    if (m > best) { best = m; k = i; }
  }
  const mag = Math.sqrt(best);
  if (!(mag > 0)) return;
  const cr = re[k] / mag, ci = -im[k] / mag; // conj(phase)
  for (let i = 0; i < re.length; i++) {
    const r = re[i], m = im[i];
    re[i] = r * cr - m * ci; im[i] = r * ci + m * cr;
  }
  im[k] = 0;
}

function iterate(f: ComplexLU, B: SparseRows, n: number, adjoint: boolean): [Float64Array, Float64Array] | null {
  let xr = start(n, adjoint ? 2 : 1), xi = start(n, adjoint ? 4 : 3);
  const tr = new Float64Array(n), ti = new Float64Array(n);
  for (let step = 0; step < STEPS; step++) {
    if (step > 0) mulComplex(B, xr, xi, tr, ti, adjoint);
    const rhsR = step > 0 ? tr : xr, rhsI = step > 0 ? ti : xi;
    [xr, xi] = adjoint ? solveComplexAdjoint(f, rhsR, rhsI) : solveComplex(f, rhsR, rhsI);
    if (!normalize(xr, xi)) return null;
  }
  return [xr, xi];
}

/** Right x ((A − λB)x = 0) and left y (yᴴ(A − λB) = 0) eigenvectors for a finite λ, both of
 *  unit 2-norm, each rotated so its largest entry is real positive. */
export function eigenvectorPair(A: Float64Array, B: Float64Array, n: number,
  lambda: { re: number; im: number }, pattern?: { A: SparseRows; B: SparseRows }): EigenvectorPair {
  const none = (): EigenvectorPair => ({
    rightRe: new Float64Array(Math.max(0, n | 0)), rightIm: new Float64Array(Math.max(0, n | 0)),
    leftRe: new Float64Array(Math.max(0, n | 0)), leftIm: new Float64Array(Math.max(0, n | 0)), residual: Infinity,
  });
  if (!Number.isInteger(n) || n <= 0 || A.length !== n * n || B.length !== n * n) return none();
  if (!Number.isFinite(lambda.re) || !Number.isFinite(lambda.im)) return none();
  const nA = frob(A), nB = frob(B);
  if (!Number.isFinite(nA) || !Number.isFinite(nB)) return none();
  const mag = Math.hypot(lambda.re, lambda.im);
  const scale = mag > 0 ? mag : nA / Math.max(nB, 1e-300);
  const Mr = new Float64Array(n * n), Mi = new Float64Array(n * n);
  // `pattern`: the nonzeros of A and B when the caller asks for many eigenvalues of one pencil
  const As = pattern?.A ?? sparseRows(A, n), Bs = pattern?.B ?? sparseRows(B, n);
  for (const offset of OFFSETS) {
    // Off λ along a fixed slanted direction, so a real λ also gets a non-real shift.
    const sr = lambda.re + offset * scale * 0.6, si = lambda.im + offset * scale * 0.8;
    for (let k = 0; k < n * n; k++) { Mr[k] = A[k] - sr * B[k]; Mi[k] = -si * B[k]; }
    const f = luComplex(Mr, Mi, n, 0, true);
    const right = iterate(f, Bs, n, false);
    const left = right && iterate(f, Bs, n, true);
    if (!right || !left) continue;
    const [xr, xi] = right, [yr, yi] = left;
    rotateLargestReal(xr, xi);
    rotateLargestReal(yr, yi);
    return { rightRe: xr, rightIm: xi, leftRe: yr, leftIm: yi, residual: rightResidual(As, Bs, n, lambda, xr, xi, nA, nB) };
  }
  return none();
}

/** ‖(A − λB)x‖ / ((‖A‖ + |λ|‖B‖)‖x‖). */
function rightResidual(A: SparseRows, B: SparseRows, n: number, lambda: { re: number; im: number },
  xr: Float64Array, xi: Float64Array, nA: number, nB: number): number {
  const ar = new Float64Array(n), ai = new Float64Array(n), br = new Float64Array(n), bi = new Float64Array(n);
  mulComplex(A, xr, xi, ar, ai);
  mulComplex(B, xr, xi, br, bi);
  let s = 0, xn = 0;
  for (let i = 0; i < n; i++) {
    const rr = ar[i] - (lambda.re * br[i] - lambda.im * bi[i]);
    const ri = ai[i] - (lambda.re * bi[i] + lambda.im * br[i]);
    s += rr * rr + ri * ri;
    xn += xr[i] * xr[i] + xi[i] * xi[i];
  }
  const denom = (nA + Math.hypot(lambda.re, lambda.im) * nB) * Math.sqrt(xn);
  return denom > 0 ? Math.sqrt(s) / denom : Infinity;
}
