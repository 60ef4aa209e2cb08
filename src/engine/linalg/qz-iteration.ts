// QZ iteration on a Hessenberg–triangular pair (H, T), eigenvalues only (Moler & Stewart 1973;
// the deflation logic follows LAPACK dhgeqz): implicit Francis double-shift steps with Householder
// reflectors (Golub & Van Loan, Alg. 7.7.2), deflation on negligible subdiagonals of H, and
// deflation of infinite eigenvalues when a diagonal entry of T is negligible (the zero is chased
// to the bottom, or split off at the top, by plane rotations). Because only eigenvalues are
// wanted, every transformation is applied to the active block only. Row-major m×m, in place.
import { givens, rotateRows, rotateCols } from './hessenberg';
import { pencil2x2 } from './pencil2x2';

const ULP = 2.220446049250313e-16;
const SAFMIN = 2.2250738585072014e-308;

export interface QzOutput {
  alphaRe: Float64Array;
  alphaIm: Float64Array;
  beta: Float64Array;
  converged: boolean;
  iterations: number;
}

export function qzIterate(H: Float64Array, T: Float64Array, m: number): QzOutput {
  const alphaRe = new Float64Array(m);
  const alphaIm = new Float64Array(m);
  const beta = new Float64Array(m);
  let tnorm = 0;
  for (let i = 0; i < m; i++) for (let j = i; j < m; j++) tnorm += T[i * m + j] * T[i * m + j];
  const btol = Math.max(SAFMIN, ULP * Math.sqrt(tnorm));
  const g = new Float64Array(3);
  const scratch = new Float64Array(8);
  const negligibleSub = (j: number) =>
    Math.abs(H[j * m + j - 1]) <= Math.max(SAFMIN, ULP * (Math.abs(H[j * m + j]) + Math.abs(H[(j - 1) * m + j - 1])));

  let ilast = m - 1;
  let top = 0; // first row/column that transformations must still update
  let iterations = 0;
  let sinceDeflation = 0;
  const maxIterations = 40 * Math.max(m, 1);

  const deflateOne = () => {
    let a = H[ilast * m + ilast], b = T[ilast * m + ilast];
    if (b < 0) { a = -a; b = -b; }
    alphaRe[ilast] = a; alphaIm[ilast] = 0; beta[ilast] = b;
    ilast--;
    sinceDeflation = 0;
    if (top > ilast) top = 0;
  };
  // T(ilast, ilast) = 0: rotate columns ilast−1, ilast to zero H(ilast, ilast−1), then deflate.
  const deflateInfiniteAtBottom = () => {
    const sub = H[ilast * m + ilast - 1];
    if (sub !== 0) {
      givens(H[ilast * m + ilast], sub, g);
      H[ilast * m + ilast] = g[2];
      H[ilast * m + ilast - 1] = 0;
      rotateCols(H, m, ilast - 1, ilast, g[0], g[1], top, ilast);
      rotateCols(T, m, ilast - 1, ilast, g[0], g[1], top, ilast);
    }
    T[ilast * m + ilast] = 0;
    deflateOne();
  };

  while (ilast >= 0) {
    if (ilast === 0) { deflateOne(); continue; }
    if (negligibleSub(ilast)) { H[ilast * m + ilast - 1] = 0; deflateOne(); continue; }
    if (Math.abs(T[ilast * m + ilast]) < btol) { deflateInfiniteAtBottom(); continue; }
    if (iterations >= maxIterations) break;

    // Scan upward for the top of the unreduced block and for negligible T diagonals.
    let ifirst = -1;
    let action: 'step' | 'one' | 'infinite' = 'step';
    for (let j = ilast - 1; j >= 0; j--) {
      const zeroSub = j === 0 || negligibleSub(j);
      if (zeroSub && j > 0) H[j * m + j - 1] = 0;
      if (Math.abs(T[j * m + j]) < btol) {
        T[j * m + j] = 0;
        if (zeroSub) {
          // Split the infinite eigenvalue off at the top: rotate rows to zero H(jch+1, jch).
          action = 'infinite';
          for (let jch = j; jch < ilast; jch++) {
            givens(H[jch * m + jch], H[(jch + 1) * m + jch], g);
            H[jch * m + jch] = g[2];
            H[(jch + 1) * m + jch] = 0;
            rotateRows(H, m, jch, jch + 1, g[0], g[1], jch + 1, ilast + 1);
            rotateRows(T, m, jch, jch + 1, g[0], g[1], jch + 1, ilast + 1);
            if (Math.abs(T[(jch + 1) * m + jch + 1]) >= btol) {
              if (jch + 1 >= ilast) action = 'one';
              else { ifirst = jch + 1; action = 'step'; }
              break;
            }
            T[(jch + 1) * m + jch + 1] = 0;
          }
        } else {
          // Chase the zero of T down to T(ilast, ilast).
          for (let jch = j; jch < ilast; jch++) {
            givens(T[jch * m + jch + 1], T[(jch + 1) * m + jch + 1], g);
            T[jch * m + jch + 1] = g[2];
            T[(jch + 1) * m + jch + 1] = 0;
            rotateRows(T, m, jch, jch + 1, g[0], g[1], jch + 2, ilast + 1);
            rotateRows(H, m, jch, jch + 1, g[0], g[1], jch - 1, ilast + 1);
            const fill = H[(jch + 1) * m + jch - 1];
            if (fill !== 0) {
              givens(H[(jch + 1) * m + jch], fill, g);
              H[(jch + 1) * m + jch] = g[2];
              H[(jch + 1) * m + jch - 1] = 0;
              // columns (jch−1, jch): new col jch−1 = c·x − s·y with x = col jch−1, y = col jch
              rotateCols(H, m, jch - 1, jch, g[0], g[1], top, jch + 1);
              rotateCols(T, m, jch - 1, jch, g[0], g[1], top, jch);
            }
          }
          action = 'infinite';
        }
        break;
      }
      if (zeroSub) { ifirst = j; break; }
    }
    if (action === 'infinite') { deflateInfiniteAtBottom(); continue; }
    if (action === 'one') { H[ilast * m + ilast - 1] = 0; deflateOne(); continue; }

    iterations++;
    sinceDeflation++;
    top = ifirst;
    if (ilast - ifirst === 1) {
      // A 2×2 block: its two eigenvalues in closed form.
      pencil2x2(H, T, m, ifirst, scratch);
      alphaRe[ifirst] = scratch[0]; alphaIm[ifirst] = scratch[1]; beta[ifirst] = scratch[2];
      alphaRe[ilast] = scratch[3]; alphaIm[ilast] = scratch[4]; beta[ilast] = scratch[5];
      ilast -= 2;
      sinceDeflation = 0;
      if (top > ilast) top = 0;
      continue;
    }
    if (!doubleShiftStep(H, T, m, ifirst, ilast, sinceDeflation % 10 === 0, scratch)) break;
  }
  return { alphaRe, alphaIm, beta, converged: ilast < 0, iterations };
}

/** One implicit double-shift QZ step on the block [f, l] (size ≥ 3), Golub & Van Loan Alg. 7.7.2.
 *  Returns false if the shift polynomial is not finite. */
const gg = new Float64Array(3); // rotation scratch of doubleShiftStep (no allocation per step)

function doubleShiftStep(H: Float64Array, T: Float64Array, m: number, f: number, l: number,
  exceptional: boolean, v: Float64Array): boolean {
  // Shifts: eigenvalues of the trailing 2×2 of M = H·T⁻¹ (entries from the trailing 3×3 of T⁻¹).
  const k3 = l - 2, k2 = l - 1;
  const t33 = T[k3 * m + k3], t34 = T[k3 * m + k2], t35 = T[k3 * m + l];
  const t44 = T[k2 * m + k2], t45 = T[k2 * m + l], t55 = T[l * m + l];
  const i55 = 1 / t55, i44 = 1 / t44;
  const i45 = -t45 * i44 * i55, i34 = -t34 / (t33 * t44);
  const i35 = (t34 * t45 - t35 * t44) / (t33 * t44 * t55);
  const h43 = H[k2 * m + k3], h44 = H[k2 * m + k2], h45 = H[k2 * m + l];
  const h54 = H[l * m + k2], h55 = H[l * m + l];
  const m11 = h43 * i34 + h44 * i44;
  const m12 = h43 * i35 + h44 * i45 + h45 * i55;
  const m21 = h54 * i44;
  const m22 = h54 * i45 + h55 * i55;
  let s = m11 + m22;
  let t = m11 * m22 - m12 * m21;
  if (exceptional) {
    // Ad hoc shift to break a stagnating cycle (as in the exceptional shifts of dlahqr).
    const e = Math.abs(m21) + Math.abs(h43 / t33);
    const d = 0.75 * e + m22;
    s = 2 * d;
    t = d * d + 0.4375 * e * e;
  }
  // First column of (M² − sM + tI) at rows f, f+1, f+2.
  const a11 = H[f * m + f], a12 = H[f * m + f + 1], a21 = H[(f + 1) * m + f];
  const a22 = H[(f + 1) * m + f + 1], a32 = H[(f + 2) * m + f + 1];
  const b11 = T[f * m + f], b12 = T[f * m + f + 1], b22 = T[(f + 1) * m + f + 1];
  const m1 = a11 / b11, m2 = a21 / b11;
  const z2 = m2 / b22, z1 = (m1 - b12 * z2) / b11;
  let x = a11 * z1 + a12 * z2 - s * m1 + t;
  let y = a21 * z1 + a22 * z2 - s * m2;
  let z = a32 * z2;
  if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) return false;
  for (let k = f; k <= l - 2; k++) {
    // Left reflector on rows k..k+2 mapping (x, y, z) to (*, 0, 0).
    reflector3(x, y, z, v);
    const c0 = k > f ? k - 1 : f;
    applyLeft3(H, m, k, v, c0, l + 1);
    applyLeft3(T, m, k, v, k, l + 1);
    if (k > f) { H[(k + 1) * m + k - 1] = 0; H[(k + 2) * m + k - 1] = 0; }
    // Right reflector on columns k..k+2 zeroing T(k+2, k), T(k+2, k+1).
    reflector3(T[(k + 2) * m + k + 2], T[(k + 2) * m + k + 1], T[(k + 2) * m + k], v);
    const rEnd = Math.min(k + 4, l + 1);
    applyRight3Reversed(H, m, k, v, f, rEnd);
    applyRight3Reversed(T, m, k, v, f, k + 3);
    T[(k + 2) * m + k] = 0; T[(k + 2) * m + k + 1] = 0;
    // Right rotation on columns k, k+1 zeroing T(k+1, k).
    const fill = T[(k + 1) * m + k];
    if (fill !== 0) {
      givens(T[(k + 1) * m + k + 1], fill, gg);
      T[(k + 1) * m + k + 1] = gg[2];
      T[(k + 1) * m + k] = 0;
      rotateCols(T, m, k, k + 1, gg[0], gg[1], f, k + 1);
      rotateCols(H, m, k, k + 1, gg[0], gg[1], f, rEnd);
    }
    x = H[(k + 1) * m + k];
    y = H[(k + 2) * m + k];
    z = k + 3 <= l ? H[(k + 3) * m + k] : 0;
  }
  // Final 2-vector: rotation on rows l−1, l, then columns l−1, l.
  givens(x, y, gg);
  H[(l - 1) * m + l - 2] = gg[2];
  H[l * m + l - 2] = 0;
  rotateRows(H, m, l - 1, l, gg[0], gg[1], l - 1, l + 1);
  rotateRows(T, m, l - 1, l, gg[0], gg[1], l - 1, l + 1);
  const fill = T[l * m + l - 1];
  if (fill !== 0) {
    givens(T[l * m + l], fill, gg);
    T[l * m + l] = gg[2];
    T[l * m + l - 1] = 0;
    rotateCols(T, m, l - 1, l, gg[0], gg[1], f, l);
    rotateCols(H, m, l - 1, l, gg[0], gg[1], f, l + 1);
  }
  return true;
}

/** Householder reflector I − τuuᵀ with u = (1, u1, u2) mapping (x, y, z) to (β, 0, 0).
 *  Stores u1, u2, τ in v[0..2] (τ = 0 when there is nothing to annihilate). */
function reflector3(x: number, y: number, z: number, v: Float64Array): void {
  const scale = Math.abs(x) + Math.abs(y) + Math.abs(z);
  if (scale === 0 || (y === 0 && z === 0)) { v[0] = 0; v[1] = 0; v[2] = 0; return; }
  const xs = x / scale, ys = y / scale, zs = z / scale;
  const norm = Math.sqrt(xs * xs + ys * ys + zs * zs);
  const beta = xs >= 0 ? -norm : norm;
  const u0 = xs - beta;
  v[0] = ys / u0; v[1] = zs / u0; v[2] = (beta - xs) / beta;
}

function applyLeft3(M: Float64Array, m: number, k: number, v: Float64Array, c0: number, c1: number): void {
  const u1 = v[0], u2 = v[1], tau = v[2];
  if (tau === 0) return;
  const r0 = k * m, r1 = r0 + m, r2 = r1 + m;
  for (let j = c0; j < c1; j++) {
    const d = tau * (M[r0 + j] + u1 * M[r1 + j] + u2 * M[r2 + j]);
    M[r0 + j] -= d; M[r1 + j] -= d * u1; M[r2 + j] -= d * u2;
  }
}

/** Apply the reflector built from the reversed row (k+2, k+1, k) on the right: the leading
 *  component of u sits at column k+2, so the row (…, k, k+1, k+2) maps to (0, 0, *). */
function applyRight3Reversed(M: Float64Array, m: number, k: number, v: Float64Array, r0: number, r1: number): void {
  const u1 = v[0], u2 = v[1], tau = v[2];
  if (tau === 0) return;
  for (let r = r0; r < r1; r++) {
    const o = r * m + k;
    const d = tau * (M[o + 2] + u1 * M[o + 1] + u2 * M[o]);
    M[o + 2] -= d; M[o + 1] -= d * u1; M[o] -= d * u2;
  }
}
