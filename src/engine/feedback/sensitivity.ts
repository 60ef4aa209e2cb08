// Sensitivity of a pole to every element value, from its right and left eigenvectors.
// Pencil (A, B) = (−G, C): A·x = λ·B·x, yᴴ·A = λ·yᴴ·B. Perturbing A and B and multiplying the first-
// order equation dA·x + A·dx = dλ·B·x + λ·dB·x + λ·B·dx by yᴴ cancels the dx terms, so
//   dλ = yᴴ(dA − λ·dB)x / (yᴴBx) = −yᴴ(dG + λ·dC)x / (yᴴCx)
// (Wilkinson, The Algebraic Eigenvalue Problem, §2.8, for the generalized case). The normalized
// figure is d ln λ / d ln v = (v/λ)·dλ/dv; its real part is d ln|λ| / d ln v. Resistors and output
// resistances are reported against R = 1/g (sign flipped). Eigenvectors from linalg/eigvec.
import type { Cx, Element, MnaSystem } from '../types';
import { eigenvectorPair } from '../linalg/eigvec';
import { computePoles } from '../analyses/poles';
import type { PoleResult } from '../analyses/poles';
import { cabs, cdiv, cmul, cx } from './cx';

export interface ElementSensitivity {
  /** "<part>.<role>" of the element. */
  element: string;
  part: string;
  /** Which value the figure is against: 'R' (resistance), 'ro', 'g', 'C', 'L', 'gm', 'gain'. */
  value: string;
  /** d ln λ / d ln value (complex; re = d ln|λ|, im = d arg λ). */
  dlnp: Cx;
  magnitude: number;
}

export interface PoleSensitivity {
  status: 'ok' | 'no-pole' | 'no-convergence' | 'singular';
  message?: string;
  pole: Cx | null;
  /** Ranked, largest |d ln λ / d ln value| first. */
  ranked: ElementSensitivity[];
  /** Relative residual ‖(G + λC)x‖ / (‖G‖ + |λ|‖C‖)‖x‖ of the right vector (a quality figure). */
  residual: number | null;
}

/** Sensitivity of the slowest pole (default) or of the finite pole nearest `target`. */
export function poleSensitivity(sys: MnaSystem, opts: { target?: Cx; poles?: PoleResult } = {}): PoleSensitivity {
  const pr = opts.poles ?? computePoles(sys);
  if (pr.status !== 'ok') return { status: 'no-convergence', message: pr.reason, pole: null, ranked: [], residual: null };
  const finite = pr.poles.filter((p) => p.kind !== 'origin');
  if (!finite.length) return { status: 'no-pole', message: 'the network has no finite non-zero pole', pole: null, ranked: [], residual: null };
  const pick = opts.target
    ? finite.reduce((a, b) => (cabs({ re: a.re - opts.target!.re, im: a.im - opts.target!.im }) <= cabs({ re: b.re - opts.target!.re, im: b.im - opts.target!.im }) ? a : b))
    : finite.reduce((a, b) => (a.omegaN <= b.omegaN ? a : b));
  const lambda = { re: pick.re, im: pick.im };
  const vec = eigenvectorsNear(sys, lambda);
  if (!vec) return { status: 'singular', message: 'could not form the eigenvectors of this pole', pole: lambda, ranked: [], residual: null };
  const { x, y, residual } = vec;
  const n = sys.n;
  // yᴴ C x
  let yCx = cx(0);
  for (let i = 0; i < n; i++) {
    let sr = 0, si = 0;
    for (let j = 0; j < n; j++) { const c = sys.C[i * n + j]; if (c) { sr += c * x.re[j]; si += c * x.im[j]; } }
    yCx = { re: yCx.re + y.re[i] * sr + y.im[i] * si, im: yCx.im + y.re[i] * si - y.im[i] * sr };
  }
  const ranked: ElementSensitivity[] = [];
  for (const el of sys.elements) {
    const s = elementTerm(el, x, y, lambda, sys.nodeCount);
    if (!s) continue;
    // dλ/dv = −term/(yᴴCx); d ln λ/d ln v = v·dλ/dv/λ
    const dl = cdiv(cmul(cx(-s.value), s.term), cmul(yCx, lambda));
    if (!dl) continue;
    const flip = s.inverse ? -1 : 1;
    const dlnp = { re: flip * dl.re, im: flip * dl.im };
    ranked.push({ element: `${el.part}.${el.role}`, part: el.part, value: s.label, dlnp, magnitude: cabs(dlnp) });
  }
  ranked.sort((a, b) => b.magnitude - a.magnitude);
  return { status: 'ok', pole: lambda, ranked, residual };
}

interface CVec { re: Float64Array; im: Float64Array }

/** yᴴ·(∂G/∂v + λ·∂C/∂v)·x for one element, with its value v. */
function elementTerm(el: Element, x: CVec, y: CVec, lambda: Cx, nodeCount: number): { term: Cx; value: number; label: string; inverse: boolean } | null {
  const at = (v: CVec, i: number) => (i < 0 ? cx(0) : cx(v.re[i], v.im[i]));
  const diff = (v: CVec, a: number, b: number) => { const p = at(v, a), q = at(v, b); return cx(p.re - q.re, p.im - q.im); };
  const conjMul = (a: Cx, b: Cx) => cx(a.re * b.re + a.im * b.im, a.re * b.im - a.im * b.re); // conj(a)·b
  switch (el.type) {
    case 'conductance': {
      const t = conjMul(diff(y, el.a, el.b), diff(x, el.a, el.b));
      const inverse = el.role === 'r' || el.role === 'gds';
      return { term: t, value: el.g, label: el.role === 'r' ? 'R' : el.role === 'gds' ? 'ro' : 'g', inverse };
    }
    case 'capacitance':
      return { term: cmul(lambda, conjMul(diff(y, el.a, el.b), diff(x, el.a, el.b))), value: el.c, label: 'C', inverse: false };
    case 'inductance': {
      // branch row r: v(a) − v(b) − sL·i = 0, so ∂C/∂L = −e_r e_rᵀ
      const r = nodeCount + el.branch;
      const t = conjMul(at(y, r), at(x, r));
      return { term: cmul(lambda, cx(-t.re, -t.im)), value: el.l, label: 'L', inverse: false };
    }
    case 'vcvs': {
      // branch row r: v(p) − v(n) − gain·(v(cp) − v(cn)) = 0
      const r = nodeCount + el.branch;
      const t = conjMul(at(y, r), diff(x, el.cp, el.cn));
      return { term: cx(-t.re, -t.im), value: el.gain, label: 'gain', inverse: false };
    }
    case 'vccs':
      return { term: conjMul(diff(y, el.p, el.n), diff(x, el.cp, el.cn)), value: el.gm, label: el.role === 'gm' || el.role === 'gmb' ? el.role : 'gm', inverse: false };
    default:
      return null;
  }
}

/** Right and left eigenvectors of pencil (−G, C) at λ (linalg/eigvec: inverse iteration). */
function eigenvectorsNear(sys: Pick<MnaSystem, 'n' | 'G' | 'C'>, lambda: Cx): { x: CVec; y: CVec; residual: number } | null {
  const { n, G, C } = sys;
  const A = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) A[i] = -G[i];
  const e = eigenvectorPair(A, C, n, lambda);
  if (!Number.isFinite(e.residual)) return null;
  return { x: { re: e.rightRe, im: e.rightIm }, y: { re: e.leftRe, im: e.leftIm }, residual: e.residual };
}
