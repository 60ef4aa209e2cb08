// Many solves of (G + sC)·x = b for the same G and C at many s = jω, for several right-hand sides
// and outputs at once (Laub 1981, "Efficient multivariable frequency response computations"):
// with the shifted Hessenberg form of analyses/hessenberg.ts, G + sC = F·Q·(I + (s − σ)·H)·Qᵀ with
// F = G + σC, so for an output selector c and a right-hand side b
//   cᵀ(G + sC)⁻¹b = (Qᵀc)ᵀ·(I + (s − σ)·H)⁻¹·(QᵀF⁻¹b).
// After one O(n³) set-up, each frequency costs one O(n²) factor of the Hessenberg matrix and each
// right-hand side one O(n²) back substitution. The projected vectors QᵀF⁻¹b and Qᵀc do not depend
// on s and are formed once. A frequency where the Hessenberg factor has a tiny pivot (s at or near
// a pole) is refused: the caller solves that point directly.
import { shiftedReduction } from '../analyses/hessenberg';
import type { ShiftedReduction } from '../analyses/hessenberg';
import { solveReal } from '../linalg/lu';

/** Pivots smaller than this, relative to the largest entry of I + (s − σ)H, send the point to a
 *  direct solve (common practice: keep the fast path only where it is well conditioned). */
const PIVOT_FLOOR = 1e-10;
/** Largest Σ|terms| / |sum| accepted from the fast path (as analyses/transfer.ts). */
const MAX_SPREAD = 1e5;

export class ReducedPencil {
  readonly n: number;
  private readonly red: ShiftedReduction;
  private work?: { ar: Float64Array; ai: Float64Array; yr: Float64Array; yi: Float64Array };

  private constructor(red: ShiftedReduction) {
    this.red = red;
    this.n = red.n;
  }

  /** Null when no shift makes G + σC regular (the caller solves directly). */
  static of(G: Float64Array, C: Float64Array, n: number): ReducedPencil | null {
    const red = n > 0 ? shiftedReduction(G, C, n) : null;
    return red ? new ReducedPencil(red) : null;
  }

  /** QᵀF⁻¹b for a right-hand side b. */
  input(b: Float64Array): Float64Array {
    const x = solveReal(this.red.f, b);
    return this.project(x);
  }

  /** Qᵀc for an output selector c (sparse: rows and weights). */
  output(rows: number[], weights: number[]): Float64Array {
    const { n, Q } = this.red;
    const out = new Float64Array(n);
    for (let a = 0; a < rows.length; a++) {
      const r = rows[a] * n;
      const w = weights[a];
      for (let j = 0; j < n; j++) out[j] += w * Q[r + j];
    }
    return out;
  }

  private project(x: Float64Array): Float64Array {
    const { n, Q } = this.red;
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const xi = x[i];
      if (xi === 0) continue;
      const r = i * n;
      for (let j = 0; j < n; j++) out[j] += Q[r + j] * xi;
    }
    return out;
  }

  /** The reduction itself, for analyses that take one (analyses/transfer.ts transferEvaluator). */
  get reduction(): ShiftedReduction {
    return this.red;
  }

  /** ctᵀ(I + (jω − σ)H)⁻¹bt for projected vectors; null where the factor is refused or the final
   *  sum cancels by more than MAX_SPREAD (|value| far below its terms: the caller solves directly). */
  transfer(bt: Float64Array, ct: Float64Array, omega: number): { re: number; im: number } | null {
    const n = this.n;
    // one workspace for every point (the factor is used at once and dropped)
    const w = (this.work ??= { ar: new Float64Array(n * n), ai: new Float64Array(n * n), yr: new Float64Array(n), yi: new Float64Array(n) });
    const h = HessenbergFactor.of(this.red.H, n, -this.red.sigma, omega, w.ar, w.ai);
    if (!h) return null;
    const { yr, yi } = w;
    h.solveReal(bt, yr, yi);
    let re = 0, im = 0, sum = 0;
    for (let i = 0; i < n; i++) {
      re += ct[i] * yr[i];
      im += ct[i] * yi[i];
      sum += Math.abs(ct[i]) * (Math.abs(yr[i]) + Math.abs(yi[i]));
    }
    if (!Number.isFinite(re) || !Number.isFinite(im)) return null;
    const mag = Math.abs(re) + Math.abs(im);
    return sum <= MAX_SPREAD * mag ? { re, im } : null;
  }
}

/** LU of an upper Hessenberg complex matrix I + (dr + j·di)·H with partial pivoting between
 *  neighbouring rows (the only rows below the diagonal that hold entries). */
export class HessenbergFactor {
  private constructor(
    private readonly n: number,
    private readonly ur: Float64Array,
    private readonly ui: Float64Array,
    /** Per step k: multiplier of row k into row k+1, and whether the rows were swapped. */
    private readonly lr: Float64Array,
    private readonly li: Float64Array,
    private readonly swap: Uint8Array,
  ) {}

  /** `ar`, `ai`: optional n × n workspace (only the Hessenberg band is written and read). */
  static of(H: Float64Array, n: number, dr: number, di: number, ar: Float64Array = new Float64Array(n * n), ai: Float64Array = new Float64Array(n * n)): HessenbergFactor | null {
    let max2 = 0;
    for (let i = 0; i < n; i++) {
      for (let j = Math.max(0, i - 1); j < n; j++) {
        const h = H[i * n + j];
        const r = dr * h + (i === j ? 1 : 0), m = di * h;
        ar[i * n + j] = r;
        ai[i * n + j] = m;
        const v = r * r + m * m;
        if (v > max2) max2 = v;
      }
    }
    const floor2 = PIVOT_FLOOR * PIVOT_FLOOR * max2;
    const lr = new Float64Array(n), li = new Float64Array(n);
    const swap = new Uint8Array(n);
    for (let k = 0; k < n; k++) {
      const kk = k * n + k;
      if (k + 1 < n) {
        const below = kk + n;
        const p2 = ar[kk] * ar[kk] + ai[kk] * ai[kk];
        const q2 = ar[below] * ar[below] + ai[below] * ai[below];
        if (q2 > p2) {
          swap[k] = 1;
          for (let j = k; j < n; j++) {
            let t = ar[k * n + j]; ar[k * n + j] = ar[(k + 1) * n + j]; ar[(k + 1) * n + j] = t;
            t = ai[k * n + j]; ai[k * n + j] = ai[(k + 1) * n + j]; ai[(k + 1) * n + j] = t;
          }
        }
      }
      const pr = ar[kk], pi = ai[kk];
      const d = pr * pr + pi * pi;
      if (!(d > floor2) || !(d > 1e-300)) return null;
      if (k + 1 < n) {
        const xr = ar[kk + n], xi = ai[kk + n];
        const fr = (xr * pr + xi * pi) / d;
        const fi = (xi * pr - xr * pi) / d;
        lr[k] = fr; li[k] = fi;
        ar[kk + n] = 0; ai[kk + n] = 0;
        for (let j = k + 1; j < n; j++) {
          const br = ar[k * n + j], bi = ai[k * n + j];
          ar[(k + 1) * n + j] -= fr * br - fi * bi;
          ai[(k + 1) * n + j] -= fr * bi + fi * br;
        }
      }
    }
    return new HessenbergFactor(n, ar, ai, lr, li, swap);
  }

  /** y = (I + (s − σ)H)⁻¹·b for a real reduced right-hand side b, into (yr, yi). */
  solveReal(b: Float64Array, yr: Float64Array, yi: Float64Array): void {
    const { n, ur, ui, lr, li, swap } = this;
    yr.set(b);
    yi.fill(0);
    for (let k = 0; k + 1 < n; k++) {
      if (swap[k]) {
        let t = yr[k]; yr[k] = yr[k + 1]; yr[k + 1] = t;
        t = yi[k]; yi[k] = yi[k + 1]; yi[k + 1] = t;
      }
      const fr = lr[k], fi = li[k];
      yr[k + 1] -= fr * yr[k] - fi * yi[k];
      yi[k + 1] -= fr * yi[k] + fi * yr[k];
    }
    for (let i = n - 1; i >= 0; i--) {
      let sr = yr[i], si = yi[i];
      const row = i * n;
      for (let j = i + 1; j < n; j++) {
        const a = ur[row + j], c = ui[row + j];
        const xr = yr[j], xi = yi[j];
        sr -= a * xr - c * xi;
        si -= a * xi + c * xr;
      }
      const pr = ur[row + i], pi = ui[row + i];
      const d = pr * pr + pi * pi;
      yr[i] = (sr * pr + si * pi) / d;
      yi[i] = (si * pr - sr * pi) / d;
    }
  }
}
