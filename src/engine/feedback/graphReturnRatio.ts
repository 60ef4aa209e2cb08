// Bode return ratios of chosen sources read from the solved coupling graph instead of new factors
// of the full network: with D the direct couplings (all sources cut, coupling.ts), the return
// difference of source k with every other source present is
//   1 + T_k = det(I − D) / det(I − D without row and column k) = 1 / [(I − D)⁻¹]_kk
// (Bode 1945, return difference as a ratio of determinants; Cramer's rule for the last step).
// (I − D) is N × N with N the number of live sources, smaller than the network, and one factor per
// frequency serves every key. Where the graph needed the 1e-12 S helper conductance, or (I − D) is
// singular, the point is computed from the full network as before (returnRatio.ts).
import type { MnaSystem } from '../types';
import { luComplex, luReal } from '../linalg/lu';
import type { ComplexLU, RealLU } from '../linalg/lu';
import type { CouplingGraph } from './coupling';
import { describeStatus, returnRatios } from './returnRatio';
import type { ReturnRatioPoint, ReturnRatioSweep } from './returnRatio';

export function returnRatiosFromGraph(
  sys: MnaSystem, g: CouplingGraph, ids: string[], scale?: Record<string, number>,
): ReturnRatioSweep[] {
  const N = g.stamps.length;
  const F = g.fHz.length;
  const idx = ids.map((id) => g.stamps.findIndex((s) => s.id === id));
  const points: (ReturnRatioPoint | null)[][] = ids.map(() => new Array<ReturnRatioPoint | null>(F).fill(null));
  const missing = new Set<number>();
  const work = { re: new Float64Array(N), im: new Float64Array(N) };
  const bufRe = new Float64Array(N * N), bufIm = new Float64Array(N * N);
  for (let fi = 0; fi < F; fi++) {
    if (g.gminAtHz.includes(g.fHz[fi])) { missing.add(fi); continue; }
    // every entry is written below, and each frequency's factor is used up before the next
    const Ar = bufRe, Ai = bufIm;
    for (let i = 0; i < N; i++) {
      for (let j = 0; j < N; j++) {
        // (I − D)ᵀ: row j, column i (c = Dᵀc + …); its inverse has the same diagonal
        Ar[j * N + i] = (i === j ? 1 : 0) - g.re[fi][i * N + j];
        Ai[j * N + i] = -g.im[fi][i * N + j];
      }
    }
    const complex = g.fHz[fi] > 0;
    const real = complex ? null : luReal(Ar, N, 1e-14, true); // Ar, Ai are this frequency's own: factored in place
    const cplx = complex ? luComplex(Ar, Ai, N, 1e-14, true) : null;
    if ((real?.singularAt ?? cplx!.singularAt) >= 0) { missing.add(fi); continue; }
    idx.forEach((k, a) => {
      if (k < 0) return;
      const { re: xr, im: xi } = inverseDiagonal(real, cplx, N, k, work);
      const d = xr * xr + xi * xi;
      // x = 1/(1 + T) ≈ 0: the network with k removed is singular, T unbounded (as returnRatio.ts)
      if (!(d > 1e-24)) { points[a][fi] = { value: null, status: 'infinite' }; return; }
      // T = 1/x − 1
      points[a][fi] = { value: { re: xr / d - 1, im: -xi / d + 0 }, status: 'ok' };
    });
  }
  // sources outside the graph (control on ground, gain 0) and points the graph could not give
  const direct = new Map<string, ReturnRatioSweep>();
  const needDirect = ids.filter((id, a) => idx[a] < 0 || [...missing].some((fi) => !points[a][fi]));
  if (needDirect.length) {
    for (const r of returnRatios(sys, { freqsHz: g.fHz.filter((f) => f > 0), scale, ids: needDirect })) direct.set(r.id, r);
  }
  return ids.map((id, a) => {
    const d = direct.get(id);
    const s = g.stamps[idx[a]];
    if (idx[a] < 0 && d) return d;
    const pts = points[a].map((p, fi) => p ?? (fi === 0 ? d!.dc : d!.points[fi - 1]));
    const base = d ?? { id, part: s.part, role: s.role, kind: s.kind, message: undefined };
    return {
      id, part: base.part, role: base.role, kind: base.kind,
      dc: pts[0], fHz: g.fHz.filter((f) => f > 0), points: pts.slice(1),
      message: d?.message ?? (pts.some((p) => p.status === 'infinite') ? describeStatus(id, 'infinite') : undefined),
    };
  });
}

/** [A⁻¹]_kk from A's LU (real or complex): solve A·y = e_k, forward substitution from the row that
 *  e_k lands on after the row permutation. */
function inverseDiagonal(real: RealLU | null, cplx: ComplexLU | null, n: number, k: number, work: { re: Float64Array; im: Float64Array }): { re: number; im: number } {
  const perm = real ? real.perm : cplx!.perm;
  const yr = work.re.fill(0), yi = work.im.fill(0);
  const first = perm.indexOf(k);
  yr[first] = 1;
  const Lr = real ? real.lu : cplx!.re;
  const Li = real ? null : cplx!.im;
  for (let i = first + 1; i < n; i++) {
    let sr = 0, si = 0;
    for (let j = first; j < i; j++) {
      const lr = Lr[i * n + j], li = Li ? Li[i * n + j] : 0;
      sr -= lr * yr[j] - li * yi[j];
      si -= lr * yi[j] + li * yr[j];
    }
    yr[i] = sr; yi[i] = si;
  }
  // back substitution: y_k needs the rows from the last up to k only
  for (let i = n - 1; i >= k; i--) {
    let sr = yr[i], si = yi[i];
    for (let j = i + 1; j < n; j++) {
      const ur = Lr[i * n + j], ui = Li ? Li[i * n + j] : 0;
      sr -= ur * yr[j] - ui * yi[j];
      si -= ur * yi[j] + ui * yr[j];
    }
    const dr = Lr[i * n + i], di = Li ? Li[i * n + i] : 0;
    const d = dr * dr + di * di;
    yr[i] = (sr * dr + si * di) / d;
    yi[i] = (si * dr - sr * di) / d;
  }
  return { re: yr[k], im: yi[k] };
}

