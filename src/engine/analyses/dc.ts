// DC (s → 0) solves on the MNA conductance matrix G, including the case where G is singular
// because some node reaches ground only through capacitors (an ideal integrator, a pole at s = 0).
//
// For a singular G with right null vectors W (G·W = 0) and left null vectors V (Vᵀ·G = 0) and a
// regular pencil with a semisimple eigenvalue at 0, the Laurent expansion
//   (G + sC)⁻¹ = W·K⁻¹·Vᵀ / s + R₀ + O(s),   K = Vᵀ·C·W
// holds (Kato, Perturbation Theory for Linear Operators; the index-1 case of matrix pencils).
// A DC quantity zᵀ(G + sC)⁻¹u is unbounded iff zᵀ·W·K⁻¹·Vᵀ·u ≠ 0; otherwise its limit is zᵀR₀u,
// found from the O(1) and O(s) equations: G·x₀ = u − C·W·a (a = K⁻¹Vᵀu), Vᵀ·C·x₀ = 0.

import type { MnaSystem } from '../types';
import { luReal, type RealLU } from '../linalg/lu';

/** 'degenerate': G is singular but the simple model above does not apply (K singular: a repeated
 *  pole at s = 0 such as cascaded integrators, or left/right null spaces of different size
 *  numerically); DC figures are then undefined rather than computed. */
export type DcStatus = 'regular' | 'integrating' | 'degenerate';

export interface DcFactor {
  n: number;
  lu: RealLU;
  status: DcStatus;
  /** Right / left null vectors of G (empty when G is regular). */
  right: Float64Array[];
  left: Float64Array[];
  /** K⁻¹ = (VᵀCW)⁻¹, m×m row-major (empty when G is regular). */
  kInv: Float64Array;
  /** Pivot tolerance used to tell a zero pivot. */
  pivotTol: number;
  C: Float64Array;
}

const REL_PIVOT = 1e-14;
/** A residue below this fraction of ‖z‖·‖W·a‖ is treated as exactly zero (bounded). */
const REL_RESIDUE = 1e-9;

function transpose(A: Float64Array, n: number): Float64Array {
  const T = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) T[j * n + i] = A[i * n + j];
  return T;
}

function maxAbs(A: Float64Array): number {
  let m = 0;
  for (let i = 0; i < A.length; i++) m = Math.max(m, Math.abs(A[i]));
  return m;
}

function zeroPivots(f: RealLU, tol: number): number[] {
  const out: number[] = [];
  for (let k = 0; k < f.n; k++) if (Math.abs(f.lu[k * f.n + k]) <= tol) out.push(k);
  return out;
}

/** Right null vector of PA = LU belonging to zero pivot k: U·w = 0 with w_k = 1, w_(j>k) = 0. */
function nullFromU(f: RealLU, k: number, zero: Set<number>): Float64Array {
  const { n, lu } = f;
  const w = new Float64Array(n);
  w[k] = 1;
  for (let i = k - 1; i >= 0; i--) {
    if (zero.has(i)) continue;
    let s = 0;
    for (let j = i + 1; j <= k; j++) s += lu[i * n + j] * w[j];
    w[i] = -s / lu[i * n + i];
  }
  let norm = 0;
  for (let i = 0; i < n; i++) norm = Math.max(norm, Math.abs(w[i]));
  for (let i = 0; i < n; i++) w[i] /= norm;
  return w;
}

/** Solve A·x = u where zero pivots are free variables set to 0 (a particular solution when u is
 *  in the range of A). */
export function solveFree(f: RealLU, u: Float64Array, tol: number): Float64Array {
  const { n, lu, perm } = f;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = u[perm[i]];
  for (let i = 0; i < n; i++) {
    let s = x[i];
    for (let j = 0; j < i; j++) s -= lu[i * n + j] * x[j];
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    const d = lu[i * n + i];
    if (Math.abs(d) <= tol) { x[i] = 0; continue; }
    let s = x[i];
    for (let j = i + 1; j < n; j++) s -= lu[i * n + j] * x[j];
    x[i] = s / d;
  }
  return x;
}

function matVec(A: Float64Array, n: number, x: Float64Array): Float64Array {
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += A[i * n + j] * x[j];
    y[i] = s;
  }
  return y;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

function invertSmall(K: Float64Array, m: number): Float64Array | null {
  const f = luReal(K, m);
  if (f.singularAt >= 0 || f.minPivotRatio < 1e-12) return null;
  const inv = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    const e = new Float64Array(m);
    e[j] = 1;
    const x = solveFree(f, e, 0);
    for (let i = 0; i < m; i++) inv[i * m + j] = x[i];
  }
  return inv;
}

/** Factor G once and find its null spaces (if any). */
export function factorDc(sys: Pick<MnaSystem, 'n' | 'G' | 'C'>): DcFactor {
  const { n, G, C } = sys;
  const scale = maxAbs(G);
  const pivotTol = Math.max(1e-300, REL_PIVOT * scale);
  const lu = luReal(G, n, REL_PIVOT);
  const zr = zeroPivots(lu, pivotTol);
  if (zr.length === 0) return { n, lu, status: 'regular', right: [], left: [], kInv: new Float64Array(0), pivotTol, C };
  const luT = luReal(transpose(G, n), n, REL_PIVOT);
  const zl = zeroPivots(luT, pivotTol);
  const zrSet = new Set(zr);
  const zlSet = new Set(zl);
  const right = zr.map((k) => nullFromU(lu, k, zrSet));
  const left = zl.map((k) => nullFromU(luT, k, zlSet));
  const m = right.length;
  let status: DcStatus = 'integrating';
  let kInv: Float64Array = new Float64Array(0);
  if (left.length !== m) {
    status = 'degenerate';
  } else {
    const K = new Float64Array(m * m);
    for (let j = 0; j < m; j++) {
      const cw = matVec(C, n, right[j]);
      for (let i = 0; i < m; i++) K[i * m + j] = dot(left[i], cw);
    }
    const inv = invertSmall(K, m);
    if (inv) kInv = inv; else status = 'degenerate';
  }
  return { n, lu, status, right, left, kInv, pivotTol, C };
}

export interface DcSolution {
  /** Bounded part x₀ of the response (the DC value when `pole` is zero). */
  x: Float64Array;
  /** Coefficient of 1/s: W·a. All zeros when the response is bounded. */
  pole: Float64Array;
}

/** Response to u at s → 0. Returns null when the DC behaviour is degenerate (see DcStatus). */
export function dcSolve(f: DcFactor, u: Float64Array): DcSolution | null {
  const { n } = f;
  if (f.status === 'regular') return { x: solveFree(f.lu, u, f.pivotTol), pole: new Float64Array(n) };
  if (f.status === 'degenerate') return null;
  const m = f.right.length;
  const vu = f.left.map((v) => dot(v, u));
  const a = new Float64Array(m);
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) a[i] += f.kInv[i * m + j] * vu[j];
  const pole = new Float64Array(n);
  for (let j = 0; j < m; j++) for (let i = 0; i < n; i++) pole[i] += f.right[j][i] * a[j];
  const cwa = matVec(f.C, n, pole);
  const rhs = new Float64Array(n);
  for (let i = 0; i < n; i++) rhs[i] = u[i] - cwa[i];
  const xp = solveFree(f.lu, rhs, f.pivotTol);
  // β = −K⁻¹·Vᵀ·C·x_p fixes the null-space component of x₀ (O(s) equation).
  const cxp = matVec(f.C, n, xp);
  const vc = f.left.map((v) => dot(v, cxp));
  for (let i = 0; i < m; i++) {
    let beta = 0;
    for (let j = 0; j < m; j++) beta -= f.kInv[i * m + j] * vc[j];
    for (let r = 0; r < n; r++) xp[r] += f.right[i][r] * beta;
  }
  return { x: xp, pole };
}

export type DcValue =
  | { value: number; unbounded: false }
  | { value: null; unbounded: true }
  | { value: null; unbounded: false; singular: true };

/** zᵀ·(G + sC)⁻¹·u at s → 0: a number, or unbounded (a pole at s = 0 reaches z from u). */
export function dcBilinear(f: DcFactor, z: Float64Array, u: Float64Array): DcValue {
  const sol = dcSolve(f, u);
  if (!sol) return { value: null, unbounded: false, singular: true };
  const residue = dot(z, sol.pole);
  let zn = 0, pn = 0;
  for (let i = 0; i < z.length; i++) { zn = Math.max(zn, Math.abs(z[i])); pn = Math.max(pn, Math.abs(sol.pole[i])); }
  if (pn > 0 && Math.abs(residue) > REL_RESIDUE * zn * pn) return { value: null, unbounded: true };
  const v = dot(z, sol.x);
  if (!Number.isFinite(v)) return { value: null, unbounded: false, singular: true };
  return { value: v, unbounded: false };
}
