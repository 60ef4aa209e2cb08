// How far each computed pole can be trusted: the relative condition number of a simple eigenvalue
// λ of the pencil (G + λC)x = 0 with right/left vectors x, y (Higham & Higham 1998, "Structured
// backward error and condition of generalized eigenvalue problems"):
//   κ(λ) = ‖x‖·‖y‖·(‖G‖ + |λ|·‖C‖) / (|λ|·|yᴴCx|),
// so a backward-stable solver's relative error is about κ·ulp. A cascade of very high gain with
// feedback capacitors makes κ huge: in double precision such poles are not determined at all
// (any solver, LAPACK's included, returns different values, some in the right half-plane).

import type { ModalVectors } from './modal';
import { bilinear, sparseRows } from '../linalg/sparse';

const ULP = 2.220446049250313e-16;

/** Relative condition number of each pole (Infinity where the vectors are missing or yᴴCx = 0). */
export function poleConditions(sys: { n: number; G: Float64Array; C: Float64Array },
  poles: { re: number; im: number }[], vectors: ModalVectors[]): Float64Array {
  const { n, G, C } = sys;
  let nG = 0, nC = 0;
  for (let k = 0; k < n * n; k++) { nG += G[k] * G[k]; nC += C[k] * C[k]; }
  nG = Math.sqrt(nG); nC = Math.sqrt(nC);
  const out = new Float64Array(poles.length);
  const Cs = sparseRows(C, n);
  poles.forEach((p, i) => {
    const v = vectors[i];
    const mag = Math.hypot(p.re, p.im);
    if (!v || !(mag > 0)) { out[i] = mag > 0 ? Infinity : 0; return; }
    const [dr, di] = bilinear(Cs, v.leftRe, v.leftIm, v.rightRe, v.rightIm);
    let xs = 0, ys = 0;
    for (let r = 0; r < n; r++) { xs += v.rightRe[r] ** 2 + v.rightIm[r] ** 2; ys += v.leftRe[r] ** 2 + v.leftIm[r] ** 2; }
    const k = (Math.sqrt(xs * ys) * (nG + mag * nC)) / (mag * Math.hypot(dr, di));
    out[i] = Number.isFinite(k) ? k : Infinity;
  });
  return out;
}

/** Poles whose error bound κ·ulp exceeds `tol` (default 1: the bound is loose, often by many
 *  decades, so only poles it cannot place at all are named). */
export function unreliablePoles(kappa: Float64Array, tol = 1): number[] {
  const out: number[] = [];
  kappa.forEach((k, i) => { if (k * ULP > tol) out.push(i); });
  return out;
}
