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
import { equilibrate, type Scales } from './scaling';
import { luRealCircuit } from '../linalg/lu';
import { leftNullVectors, rightNullVectors, rrlu, solveParticular, type RankRevealingLU } from './rrlu';

/** 'degenerate': G is singular but the simple model above does not apply (K singular: a repeated
 *  pole at s = 0 such as cascaded integrators); DC figures are then undefined rather than computed. */
export type DcStatus = 'regular' | 'integrating' | 'degenerate';

export interface DcFactor {
  n: number;
  /** Rank-revealing LU of the equilibrated R·G·S. */
  lu: RankRevealingLU;
  status: DcStatus;
  /** Right / left null vectors of G (empty when G is regular). */
  right: Float64Array[];
  left: Float64Array[];
  /** K⁻¹ = (VᵀCW)⁻¹, m×m row-major (empty when G is regular). */
  kInv: Float64Array;
  C: Float64Array;
  /** Equilibration of G: the factor is of R·G·S. */
  sc: Scales;
}

/** Pivots below this fraction of the (equilibrated) largest entry end the factorisation. */
const REL_PIVOT = 1e-14;
/** A residue below this fraction of ‖z‖·‖W·a‖ is treated as exactly zero (bounded). */
const REL_RESIDUE = 1e-9;

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
  let big = 0;
  for (let i = 0; i < m * m; i++) big = Math.max(big, Math.abs(K[i]));
  const f = rrlu(K, m, 1e-12 * big);
  if (f.rank < m) return null;
  const inv = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    const e = new Float64Array(m);
    e[j] = 1;
    const x = solveParticular(f, e);
    for (let i = 0; i < m; i++) inv[i * m + j] = x[i];
  }
  return inv;
}

function rescale(v: Float64Array, d: Float64Array): Float64Array {
  let m = 0;
  for (let i = 0; i < v.length; i++) { v[i] *= d[i]; m = Math.max(m, Math.abs(v[i])); }
  if (m > 0) for (let i = 0; i < v.length; i++) v[i] /= m;
  return v;
}

/** Factor G once and find its null spaces (if any). G is equilibrated first (scaling.ts), so the
 *  rank decision is relative to each row's and column's own size. */
export function factorDc(sys: Pick<MnaSystem, 'n' | 'G' | 'C'>): DcFactor {
  const { n, G, C } = sys;
  const mag = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) mag[k] = Math.abs(G[k]);
  const sc = equilibrate(mag, n);
  const Gs = new Float64Array(n * n);
  let big = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = sc.r[i] * G[i * n + j] * sc.c[j];
      Gs[i * n + j] = v;
      big = Math.max(big, Math.abs(v));
    }
  }
  const tol = Math.max(1e-300, REL_PIVOT * big);
  const empty = { C, sc, right: [] as Float64Array[], left: [] as Float64Array[], kInv: new Float64Array(0) as Float64Array };
  // The circuit-order LU first (source branch beside its node, growth-bounded diagonal pivots,
  // lu.ts): it proves G regular where complete pivoting would take a high-gain cascade's gm
  // entries as pivots and leave one as small as 1/(product of the stage gains). The
  // rank-revealing factor is needed only when it fails.
  const direct = luRealCircuit(Gs, n, REL_PIVOT);
  if (direct.singularAt < 0) {
    return { n, lu: { n, rank: n, lu: direct.lu, rowPerm: direct.perm, colPerm: direct.cols! }, status: 'regular', ...empty };
  }
  const lu = rrlu(Gs, n, tol);
  const base = { n, lu, ...empty };
  if (lu.rank === n) return { ...base, status: 'regular' };
  // Null vectors of R·G·S map back as w = S·w', v = R·v'.
  const right = rightNullVectors(lu).map((w) => rescale(w, sc.c));
  const left = leftNullVectors(lu).map((v) => rescale(v, sc.r));
  const m = right.length;
  const K = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    const cw = matVec(C, n, right[j]);
    for (let i = 0; i < m; i++) K[i * m + j] = dot(left[i], cw);
  }
  const inv = invertSmall(K, m);
  return { ...base, right, left, kInv: inv ?? new Float64Array(0), status: inv ? 'integrating' : 'degenerate' };
}

/** G·x = u with the equilibrated factor: (R·G·S)·y = R·u, x = S·y (free variables 0). */
function solveG(f: DcFactor, u: Float64Array): Float64Array {
  const ru = new Float64Array(f.n);
  for (let i = 0; i < f.n; i++) ru[i] = f.sc.r[i] * u[i];
  const y = solveParticular(f.lu, ru);
  for (let i = 0; i < f.n; i++) y[i] *= f.sc.c[i];
  return y;
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
  if (f.status === 'regular') return { x: solveG(f, u), pole: new Float64Array(n) };
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
  const xp = solveG(f, rhs);
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
