// Shared pieces of the feedback analyses: the rank-one stamp of each controlled source and
// solves of the pencil (G + sC) at one complex frequency.
//
// A controlled source adds u·vᵀ to G, where vᵀx is its controlling variable v(cp) − v(cn) and u is
// its output stamp scaled by its gain:
//   VCCS (takes gm·vc out of p into n, types.ts): u = gm·(e_p − e_n)   (KCL rows: current leaving)
//   VCVS (branch row r: σ(v(p) − v(n)) − σ·gain·vc = 0): u = −σ·gain·e_r
// σ is read from the assembled row, so either sign of the branch row is handled.
// With the source removed (M⁰ = M − u vᵀ), a unit test value of its control makes it drive the
// network with the excitation −u; the returned control is −vᵀ(M⁰)⁻¹u, so Bode's return ratio is
//   T = vᵀ(M⁰)⁻¹u = a / (1 − a),  a = vᵀM⁻¹u   (Sherman–Morrison; 1 + T = det M / det M⁰).
import type { Element, MnaSystem } from '../types';
import { CIRCUIT_PIVOT_THRESHOLD, backwardComplex, backwardReal, complexInverseDiagonal, forwardComplex, forwardReal, luComplex, luReal, realInverseDiagonal, solveComplex, solveComplexAdjoint, solveReal, solveRealTransposed } from '../linalg/lu';
import type { ComplexLU, RealLU } from '../linalg/lu';

export interface SourceStamp {
  id: string;
  part: string;
  role: string;
  kind: 'vccs' | 'vcvs';
  /** gm (S) or gain (V/V) as assembled. */
  value: number;
  /** Output stamp rows and values (u, sparse). */
  uRows: number[];
  uVals: number[];
  /** Control pins as unknown indices (−1 = ground). */
  cp: number;
  cn: number;
  /** Output pins (node indices, −1 = ground) for drawing and naming. */
  p: number;
  n: number;
}

/** Rank-one stamps of every controlled source (vccs/vcvs elements with an id), in element order. */
export function sourceStamps(sys: MnaSystem): SourceStamp[] {
  const out: SourceStamp[] = [];
  for (const el of sys.elements) {
    const s = stampOf(sys, el);
    if (s) out.push(s);
  }
  return out;
}

function stampOf(sys: MnaSystem, el: Element): SourceStamp | null {
  if (el.type === 'vccs') {
    const uRows: number[] = [];
    const uVals: number[] = [];
    if (el.p >= 0) { uRows.push(el.p); uVals.push(el.gm); }
    if (el.n >= 0) { uRows.push(el.n); uVals.push(-el.gm); }
    return { id: el.id, part: el.part, role: el.role, kind: 'vccs', value: el.gm, uRows, uVals, cp: el.cp, cn: el.cn, p: el.p, n: el.n };
  }
  if (el.type === 'vcvs') {
    const n = sys.n;
    const r = sys.nodeCount + el.branch;
    const sigma = el.p >= 0 ? Math.sign(sys.G[r * n + el.p]) : el.n >= 0 ? -Math.sign(sys.G[r * n + el.n]) : 1;
    return { id: el.id, part: el.part, role: el.role, kind: 'vcvs', value: el.gain, uRows: [r], uVals: [-(sigma || 1) * el.gain], cp: el.cp, cn: el.cn, p: el.p, n: el.n };
  }
  return null;
}

/** True when the source's control is identically zero (both control pins on ground). */
export function controlIsGround(s: SourceStamp): boolean {
  return s.cp < 0 && s.cn < 0;
}

/** Copy of G with sources scaled: G + Σ (k_i − 1)·u_i v_iᵀ (k = 0 removes a source). */
export function scaledG(sys: MnaSystem, stamps: SourceStamp[], scale: Record<string, number>): Float64Array {
  const G = Float64Array.from(sys.G);
  for (const s of stamps) {
    const k = scale[s.id];
    if (k === undefined || k === 1) continue;
    addRankOne(G, sys.n, s, k - 1);
  }
  return G;
}

/** G += f·u vᵀ for one source. */
export function addRankOne(G: Float64Array, n: number, s: SourceStamp, f: number): void {
  for (let a = 0; a < s.uRows.length; a++) {
    const row = s.uRows[a] * n;
    const val = f * s.uVals[a];
    if (s.cp >= 0) G[row + s.cp] += val;
    if (s.cn >= 0) G[row + s.cn] -= val;
  }
}

/** Complex vector as two arrays. */
export interface CVec { re: Float64Array; im: Float64Array }

/** Factor of G + sC at s = jω (real LU at ω = 0). Above DC the circuit's own diagonal pivots are
 *  kept while their growth stays bounded (threshold pivoting, Duff, Erisman & Reid §5.4): far less
 *  fill than partial pivoting on MNA matrices, so the many solves per factor are cheaper. */
export class PencilAt {
  readonly n: number;
  readonly omega: number;
  private real?: RealLU;
  private cplx?: ComplexLU;
  readonly singular: boolean;

  /** `work`: two n × n buffers the factor is built in (overwritten; the caller keeps this factor
   *  only until it hands the buffers to the next one); else the factor has its own. */
  constructor(G: Float64Array, C: Float64Array, n: number, omega: number, work?: { re: Float64Array; im: Float64Array }) {
    this.n = n;
    this.omega = omega;
    if (omega === 0) {
      if (work) work.re.set(G);
      // at DC partial pivoting: it flags a network that is singular in double precision (a loop
      // gain beyond 1/ulp) where a threshold pivot would return figures without meaning
      this.real = work ? luReal(work.re, n, 1e-14, true) : luReal(G, n);
      this.singular = this.real.singularAt >= 0;
    } else {
      const Ai = work ? work.im : new Float64Array(n * n);
      for (let i = 0; i < n * n; i++) Ai[i] = omega * C[i];
      const Ar = work ? work.re : new Float64Array(n * n);
      Ar.set(G);
      // factored in place: Ar and Ai are this factor's own copies
      this.cplx = luComplex(Ar, Ai, n, 1e-14, true, CIRCUIT_PIVOT_THRESHOLD);
      this.singular = this.cplx.singularAt >= 0;
    }
  }

  solve(bRe: Float64Array, bIm?: Float64Array): CVec {
    if (this.real) {
      const re = solveReal(this.real, bRe);
      if (!bIm) return { re, im: new Float64Array(this.n) };
      return { re, im: solveReal(this.real, bIm) };
    }
    const [re, im] = solveComplex(this.cplx!, bRe, bIm ?? new Float64Array(this.n));
    return { re, im };
  }

  /** Solves M x = b for a complex b (new arrays). */
  solveFull(bRe: Float64Array, bIm: Float64Array): CVec {
    if (this.real) return { re: solveReal(this.real, bRe), im: solveReal(this.real, bIm) };
    const [re, im] = solveComplex(this.cplx!, bRe, bIm);
    return { re, im };
  }

  /** Solves Mᴴ x = b (conjugate transpose) for a complex b (new arrays). */
  solveAdjoint(bRe: Float64Array, bIm: Float64Array): CVec {
    if (this.real) return { re: solveRealTransposed(this.real, bRe), im: solveRealTransposed(this.real, bIm) };
    const [re, im] = solveComplexAdjoint(this.cplx!, bRe, bIm);
    return { re, im };
  }

  /** Solves M x = b for a real b with few non-zeros (a source's u vector): forward substitution
   *  starts at the first row the permuted b reaches, since L's rows above it only carry zeros
   *  (the factor's nonzero-pattern kernels of linalg/lu.ts). */
  solveSparse(rows: ArrayLike<number>, vals: ArrayLike<number>, out?: CVec): CVec {
    const n = this.n;
    // `out`: the caller's buffers, overwritten (for many solves in a row)
    const xr = out ? out.re.fill(0) : new Float64Array(n);
    const xi = out ? out.im.fill(0) : new Float64Array(n);
    const perm = this.real ? this.real.perm : this.cplx!.perm;
    let first = n;
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < rows.length; k++) {
        if (rows[k] !== perm[i]) continue;
        xr[i] += vals[k]; // repeated rows add up
        if (i < first) first = i;
      }
    }
    if (first === n) return { re: xr, im: xi };
    if (this.real) {
      forwardReal(this.real, xr, first);
      backwardReal(this.real, xr);
      return { re: xr, im: xi };
    }
    forwardComplex(this.cplx!, xr, xi, first);
    backwardComplex(this.cplx!, xr, xi);
    return { re: xr, im: xi };
  }

  /** [M⁻¹]_kk for k < count: per k one solve with e_k that starts forward substitution at e_k's
   *  permuted row and stops back substitution at row k (the same sums as a full solve, for x_k). */
  inverseDiagonal(count: number): CVec {
    if (this.cplx) {
      const [re, im] = complexInverseDiagonal(this.cplx, count);
      return { re, im };
    }
    return { re: realInverseDiagonal(this.real!, count), im: new Float64Array(count) };
  }

  /** Solves Mᵀ w = b (plain transpose, not conjugate): wᵀ = bᵀ M⁻¹ for row vectors. */
  solveTransposed(bRe: Float64Array): CVec {
    if (this.real) return { re: solveRealTransposed(this.real, bRe), im: new Float64Array(this.n) };
    // (Mᵀ)w = b ⇔ conj(M)ᴴ w = b ⇔ Mᴴ conj(w) = conj(b) = b for real b.
    const [re, im] = solveComplexAdjoint(this.cplx!, bRe, new Float64Array(this.n));
    for (let i = 0; i < this.n; i++) im[i] = -im[i];
    return { re, im };
  }
}

/** Dense u vector of a source. */
export function uVector(s: SourceStamp, n: number): Float64Array {
  const u = new Float64Array(n);
  for (let a = 0; a < s.uRows.length; a++) u[s.uRows[a]] += s.uVals[a];
  return u;
}

/** Dense v vector of a source (control selector). */
export function vVector(s: SourceStamp, n: number): Float64Array {
  const v = new Float64Array(n);
  if (s.cp >= 0) v[s.cp] += 1;
  if (s.cn >= 0) v[s.cn] -= 1;
  return v;
}

/** vᵀx (complex) for a source's control. */
export function controlOf(s: SourceStamp, x: CVec): { re: number; im: number } {
  let re = 0;
  let im = 0;
  if (s.cp >= 0) { re += x.re[s.cp]; im += x.im[s.cp]; }
  if (s.cn >= 0) { re -= x.re[s.cn]; im -= x.im[s.cn]; }
  return { re, im };
}

/** Node name or "ground". */
export function nodeLabel(sys: MnaSystem, i: number): string {
  return i < 0 ? 'ground' : i < sys.nodeCount ? sys.nodeNames[i] : sys.branchNames[i - sys.nodeCount];
}

/** Log-spaced frequency grid (Hz), endpoints included. */
export function logSpace(fMin: number, fMax: number, perDecade: number): number[] {
  const decades = Math.log10(fMax / fMin);
  const count = Math.max(2, Math.round(decades * perDecade) + 1);
  const out: number[] = [];
  for (let i = 0; i < count; i++) out.push(fMin * Math.pow(10, (decades * i) / (count - 1)));
  return out;
}
