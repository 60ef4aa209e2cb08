// How many digits a factor of the pencil can carry: the 1-norm condition number of the
// equilibrated matrix R·(G + jωC)·S (R, S: row then column scales to unit largest entry, so a
// circuit's mix of milliohms and gigaohms does not count against it), with ‖(R M S)⁻¹‖₁ from the
// factor by Hager's estimator (Hager 1984) in Higham's form with the extra alternating-sign probe
// (Higham 1988, "FORTRAN codes for estimating the one-norm of a real or complex matrix"). Above
// 1/ulp no figure read from the factor is determined in double precision (Higham & Higham 1998).
import type { CVec, PencilAt } from './pencil';

/** Condition numbers above this leave no correct digit in double precision (1/ulp). */
export const UNDETERMINED_CONDITION = 1 / Number.EPSILON;

export function pencilCondition(G: Float64Array, C: Float64Array, n: number, omega: number, pencil: PencilAt): number {
  if (pencil.singular) return Infinity;
  const mag = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) { const a = G[k], b = omega * C[k]; mag[k] = Math.sqrt(a * a + b * b); }
  const r = new Float64Array(n), s = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let m = 0;
    for (let j = 0; j < n; j++) if (mag[i * n + j] > m) m = mag[i * n + j];
    if (!(m > 0)) return Infinity;
    r[i] = 1 / m;
  }
  for (let j = 0; j < n; j++) {
    let m = 0;
    for (let i = 0; i < n; i++) { const v = r[i] * mag[i * n + j]; if (v > m) m = v; }
    if (!(m > 0)) return Infinity;
    s[j] = 1 / m;
  }
  let norm = 0;
  for (let j = 0; j < n; j++) {
    let sum = 0;
    for (let i = 0; i < n; i++) sum += r[i] * mag[i * n + j] * s[j];
    if (sum > norm) norm = sum;
  }
  // (RMS)⁻¹x = S⁻¹·M⁻¹·(R⁻¹x) and (RMS)⁻ᴴy = R⁻¹·M⁻ᴴ·(S⁻¹y): R and S are real
  const scaledSolve = (solve: (br: Float64Array, bi: Float64Array) => CVec, before: Float64Array, after: Float64Array) =>
    (xr: Float64Array, xi: Float64Array): CVec => {
      const br = new Float64Array(n), bi = new Float64Array(n);
      for (let i = 0; i < n; i++) { br[i] = xr[i] / before[i]; bi[i] = xi[i] / before[i]; }
      const y = solve(br, bi);
      for (let i = 0; i < n; i++) { y.re[i] /= after[i]; y.im[i] /= after[i]; }
      return y;
    };
  const inv = scaledSolve((br, bi) => pencil.solveFull(br, bi), r, s);
  const invH = scaledSolve((br, bi) => pencil.solveAdjoint(br, bi), s, r);
  const norm1 = (v: CVec) => { let t = 0; for (let i = 0; i < n; i++) t += Math.sqrt(v.re[i] * v.re[i] + v.im[i] * v.im[i]); return t; };
  let xr: Float64Array = new Float64Array(n).fill(1 / n);
  let xi: Float64Array = new Float64Array(n);
  let est = 0;
  let lastJ = -1;
  for (let iter = 0; iter < 5; iter++) {
    const y = inv(xr, xi);
    est = Math.max(est, norm1(y));
    const zr = new Float64Array(n), zi = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const a = Math.sqrt(y.re[i] * y.re[i] + y.im[i] * y.im[i]);
      if (a > 0) { zr[i] = y.re[i] / a; zi[i] = y.im[i] / a; } else zr[i] = 1;
    }
    const z = invH(zr, zi);
    let j = 0, best = -1, zx = 0;
    for (let i = 0; i < n; i++) {
      const a = Math.sqrt(z.re[i] * z.re[i] + z.im[i] * z.im[i]);
      if (a > best) { best = a; j = i; }
      zx += z.re[i] * xr[i] + z.im[i] * xi[i]; // Re(zᴴx)
    }
    if (iter > 0 && (best <= zx || j === lastJ)) break;
    lastJ = j;
    xr = new Float64Array(n); xi = new Float64Array(n); xr[j] = 1;
  }
  // alternating probe (Higham 1988): catches matrices the iteration underestimates
  const br = new Float64Array(n), bi = new Float64Array(n);
  for (let i = 0; i < n; i++) br[i] = (i % 2 === 0 ? 1 : -1) * (1 + (n > 1 ? i / (n - 1) : 0));
  est = Math.max(est, (2 * norm1(inv(br, bi))) / (3 * n));
  const k = norm * est;
  return Number.isFinite(k) ? k : Infinity;
}
