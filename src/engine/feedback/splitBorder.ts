// The split network of portInto.ts worked from the factor of the full network instead of a factor
// of its own. With X′ the split-off copy of node X (last unknown), the split matrix is bordered,
//   S = [[A, b], [cᵀ, d]],
// and joining X′ back into X (adding row X′ to row X and column X′ to column X) gives the full
// matrix M = A + b·e_Xᵀ + e_X·cᵀ + d·e_X·e_Xᵀ, so A = M − U·Wᵀ with U = [b, e_X], W = [e_X, c + d·e_X].
// A⁻¹ follows from M⁻¹ by Woodbury's identity, A⁻¹ = M⁻¹ + M⁻¹U·(I − WᵀM⁻¹U)⁻¹·WᵀM⁻¹
// (Golub & Van Loan 2.1.4), and S⁻¹ by the Schur complement σ = d − cᵀA⁻¹b (block elimination):
//   [S⁻¹]_{X′X′} = 1/σ,   S⁻¹[r; r′]: x′ = (r′ − cᵀA⁻¹r)/σ, x = A⁻¹(r − b·x′).
// Two solves with the full factor per split and one per key replace a new factor per split. Where
// the 2 × 2 capacitance matrix or σ is too small to trust, the caller factors the split network.
import type { Cx } from '../types';
import type { CVec, PencilAt, SourceStamp } from './pencil';
import { hypot2 } from './cx';

export interface BorderEntries { gb: Float64Array; cb: Float64Array; gc: Float64Array; cc: Float64Array; gd: number; cd: number }

/** Relative size below which a pivot of the bordered update is not trusted (common practice). */
const TRUST = 1e-10;

export class SplitBorder {
  private constructor(
    private readonly n: number,
    private readonly full: PencilAt,
    private readonly node: number,
    /** Row X′ of the split matrix (its first n entries) and the corner d. */
    private readonly cRe: Float64Array, private readonly cIm: Float64Array, private readonly d: Cx,
    /** M⁻¹b and M⁻¹e_X. */
    private readonly y1: CVec, private readonly y2: CVec,
    /** K = (I − WᵀM⁻¹U)⁻¹, row-major 2 × 2 (re, im). */
    private readonly kRe: Float64Array, private readonly kIm: Float64Array,
    /** A⁻¹b and 1/σ. */
    private readonly aInvB: CVec, readonly z: Cx,
  ) {}

  /** `bd`: the split network's border, column X′ (gb, cb) and row X′ (gc, cc) of G and C over the
   *  first n unknowns, and the corner (gd, cd); null when not trusted. */
  static of(bd: BorderEntries, n: number, node: number, omega: number, full: PencilAt): SplitBorder | null {
    const bRe = new Float64Array(n), bIm = new Float64Array(n), cRe = new Float64Array(n), cIm = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      bRe[i] = bd.gb[i]; bIm[i] = omega * bd.cb[i];
      cRe[i] = bd.gc[i]; cIm[i] = omega * bd.cc[i];
    }
    const d = { re: bd.gd, im: omega * bd.cd };
    const y1 = full.solve(bRe, bIm);
    const ex = new Float64Array(n);
    ex[node] = 1;
    const y2 = full.solve(ex);
    // WᵀM⁻¹U: rows W1 = e_X, W2 = c + d·e_X; columns y1, y2
    const w2 = (y: CVec) => { const t = dotC(cRe, cIm, y); return { re: t.re + d.re * y.re[node] - d.im * y.im[node], im: t.im + d.re * y.im[node] + d.im * y.re[node] }; };
    const g11 = { re: y1.re[node], im: y1.im[node] }, g12 = { re: y2.re[node], im: y2.im[node] };
    const g21 = w2(y1), g22 = w2(y2);
    // K = (I − G)⁻¹ for the 2 × 2 G
    const a11 = { re: 1 - g11.re, im: -g11.im }, a12 = { re: -g12.re, im: -g12.im };
    const a21 = { re: -g21.re, im: -g21.im }, a22 = { re: 1 - g22.re, im: -g22.im };
    const det = sub(mul(a11, a22), mul(a12, a21));
    const scale = Math.max(abs(mul(a11, a22)), abs(mul(a12, a21)), 1e-300);
    if (!(abs(det) > TRUST * scale)) return null;
    const inv = (x: Cx) => div(x, det);
    const k11 = inv(a22), k12 = inv({ re: -a12.re, im: -a12.im }), k21 = inv({ re: -a21.re, im: -a21.im }), k22 = inv(a11);
    const kRe = Float64Array.of(k11.re, k12.re, k21.re, k22.re), kIm = Float64Array.of(k11.im, k12.im, k21.im, k22.im);
    // A⁻¹b = y1 + [y1 y2]·K·[g11; g21]
    const c1 = add(mul(k11, g11), mul(k12, g21)), c2 = add(mul(k21, g11), mul(k22, g21));
    const aInvB = combine(y1, y1, y2, c1, c2);
    const cAb = dotC(cRe, cIm, aInvB);
    const sigma = sub(d, cAb);
    const sigmaScale = Math.max(abs(d), abs(cAb), 1e-300);
    if (!(abs(sigma) > TRUST * sigmaScale)) return null;
    const z = div({ re: 1, im: 0 }, sigma);
    for (const v of [z.re, z.im]) if (!Number.isFinite(v)) return null;
    return new SplitBorder(n, full, node, cRe, cIm, d, y1, y2, kRe, kIm, aInvB, z);
  }

  /** For a source already written in split coordinates (rows and control pins may be X′ = n):
   *  a = vᵀS⁻¹u, p_X′ = [S⁻¹u]_X′ and q_X′ = [S⁻ᵀv]_X′. */
  keyTerms(s: SourceStamp): { a: Cx; px: Cx; qx: Cx } {
    const { n, node } = this;
    const rows: number[] = [], vals: number[] = [];
    let uX = 0;
    s.uRows.forEach((r, k) => { if (r === n) uX += s.uVals[k]; else { rows.push(r); vals.push(s.uVals[k]); } });
    // t = A⁻¹u_top = r + [y1 y2]·K·Wᵀr, r = M⁻¹u_top (the same for every split at this frequency
    // while the source's rows are not moved: kept with the full factor)
    const memo = `${rows.join(',')}|${vals.join(',')}`;
    let r = solvedOf(this.full).get(memo);
    if (!r) {
      r = rows.length ? this.full.solveSparse(rows, vals) : { re: new Float64Array(n), im: new Float64Array(n) };
      solvedOf(this.full).set(memo, r);
    }
    const w1 = { re: r.re[node], im: r.im[node] };
    const cr = dotC(this.cRe, this.cIm, r);
    const w2 = add(cr, mul(this.d, w1));
    const { kRe, kIm } = this;
    const k = (i: number) => ({ re: kRe[i], im: kIm[i] });
    const c1 = add(mul(k(0), w1), mul(k(1), w2)), c2 = add(mul(k(2), w1), mul(k(3), w2));
    const at = (v: CVec, i: number) => ({ re: v.re[i], im: v.im[i] });
    const tAt = (i: number) => add(at(r, i), add(mul(c1, at(this.y1, i)), mul(c2, at(this.y2, i))));
    // cᵀt = cᵀr + c1·cᵀy1 + c2·cᵀy2
    const ct = add(cr, add(mul(c1, dotC(this.cRe, this.cIm, this.y1)), mul(c2, dotC(this.cRe, this.cIm, this.y2))));
    const px = mul(sub({ re: uX, im: 0 }, ct), this.z);
    // control: vᵀp with p_top = t − A⁻¹b·p_X′; column X′ of S⁻¹: w_top = −A⁻¹b/σ, w_X′ = 1/σ
    let a = { re: 0, im: 0 }, qx = { re: 0, im: 0 };
    for (const [pin, sign] of [[s.cp, 1], [s.cn, -1]] as const) {
      if (pin < 0) continue;
      const p = pin === n ? px : sub(tAt(pin), mul(at(this.aInvB, pin), px));
      const w = pin === n ? this.z : mul({ re: -this.aInvB.re[pin], im: -this.aInvB.im[pin] }, this.z);
      a = { re: a.re + sign * p.re, im: a.im + sign * p.im };
      qx = { re: qx.re + sign * w.re, im: qx.im + sign * w.im };
    }
    return { a, px, qx };
  }
}

/** M⁻¹u by right-hand side (rows|values), per full factor. */
const solved = new WeakMap<PencilAt, Map<string, CVec>>();
function solvedOf(full: PencilAt): Map<string, CVec> {
  let m = solved.get(full);
  if (!m) { m = new Map(); solved.set(full, m); }
  return m;
}

function combine(base: CVec, y1: CVec, y2: CVec, c1: Cx, c2: Cx): CVec {
  const n = base.re.length;
  const re = new Float64Array(n), im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    re[i] = base.re[i] + c1.re * y1.re[i] - c1.im * y1.im[i] + c2.re * y2.re[i] - c2.im * y2.im[i];
    im[i] = base.im[i] + c1.re * y1.im[i] + c1.im * y1.re[i] + c2.re * y2.im[i] + c2.im * y2.re[i];
  }
  return { re, im };
}

/** Σ c_i·y_i (plain, not conjugated). */
function dotC(cRe: Float64Array, cIm: Float64Array, y: CVec): Cx {
  let re = 0, im = 0;
  for (let i = 0; i < cRe.length; i++) {
    const a = cRe[i], b = cIm[i];
    if (a === 0 && b === 0) continue;
    re += a * y.re[i] - b * y.im[i];
    im += a * y.im[i] + b * y.re[i];
  }
  return { re, im };
}

const add = (a: Cx, b: Cx): Cx => ({ re: a.re + b.re, im: a.im + b.im });
const sub = (a: Cx, b: Cx): Cx => ({ re: a.re - b.re, im: a.im - b.im });
const mul = (a: Cx, b: Cx): Cx => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const abs = (a: Cx): number => hypot2(a.re, a.im);
function div(a: Cx, b: Cx): Cx {
  const q = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / q, im: (a.im * b.re - a.re * b.im) / q };
}
