// Root locus of one loop: scale its key source by k from 0 (off) through 1 (as drawn) to kMax and
// follow the poles (finite eigenvalues of (−G(k), C), QZ via analyses/poles). Steps adapt so that
// no pole moves farther than `maxMove` (log-distance, matching.ts) between accepted steps, and
// poles are paired step to step by minimum-cost assignment, so branches do not jump. The first k
// where a pole enters the right half-plane, and the k where real poles meet and split into a
// complex pair, are refined by bisection.
import type { Cx, MnaSystem } from '../types';
import { computePoles } from '../analyses/poles';
import { scaledG, sourceStamps } from './pencil';
import { matchPoles, poleDistance } from './matching';
import { hypot2 } from './cx';

/** A pole's path; null where that pole does not exist (the finite pole count changed). */
export interface LocusBranch { re: (number | null)[]; im: (number | null)[] }

export interface LocusEvent { k: number; pole: Cx }

export interface RootLocus {
  key: string;
  status: 'ok' | 'unknown-source' | 'no-convergence';
  message?: string;
  k: number[];
  /** branches[b].re[i], .im[i]: pole b at k[i]. */
  branches: LocusBranch[];
  /** First k at which a pole crosses into the right half-plane (null if none up to kMax). */
  rhpAtK: number | null;
  rhpPole: Cx | null;
  /** k at which two real poles meet and split into a complex pair (breakaway points). */
  splits: LocusEvent[];
}

export interface LocusOptions {
  kMax?: number;
  scale?: Record<string, number>;
  /** Largest pole move per step (log-distance); default 0.15. */
  maxMove?: number;
  maxSteps?: number;
}

const isRhp = (p: Cx) => p.re > 1e-9 * hypot2(p.re, p.im);
const complexCount = (ps: Cx[]) => ps.filter((p) => p.im !== 0).length;

export function rootLocus(sys: MnaSystem, key: string, opts: LocusOptions = {}): RootLocus {
  const kMax = opts.kMax ?? 10;
  const maxMove = opts.maxMove ?? 0.15;
  const maxSteps = opts.maxSteps ?? 400;
  const stamps = sourceStamps(sys);
  const base: RootLocus = { key, status: 'ok', k: [], branches: [], rhpAtK: null, rhpPole: null, splits: [] };
  if (!stamps.some((s) => s.id === key)) return { ...base, status: 'unknown-source', message: `no controlled source "${key}" in this network` };
  const polesAt = (k: number): Cx[] | null => {
    const G = scaledG(sys, stamps, { ...(opts.scale ?? {}), [key]: k * (opts.scale?.[key] ?? 1) });
    const r = computePoles({ n: sys.n, G, C: sys.C });
    return r.status === 'ok' ? r.poles.map((p) => ({ re: p.re, im: p.im })) : null;
  };
  const p0 = polesAt(0);
  if (!p0) return { ...base, status: 'no-convergence', message: `${key}: pole computation did not converge at k = 0` };
  const ks = [0];
  const branches: LocusBranch[] = p0.map((p) => ({ re: [p.re], im: [p.im] }));
  let prev = p0;
  let active = p0.map((_, i) => i);
  let k = 0;
  let h = Math.min(0.05, kMax / 50);
  const hMin = kMax * 1e-7;
  let steps = 0;
  const marks = [1, kMax].filter((m) => m <= kMax);
  while (k < kMax && steps++ < maxSteps) {
    let kn = Math.min(k + h, kMax);
    for (const m of marks) if (k < m && kn > m) kn = m; // land exactly on k = 1 (as drawn)
    const next = polesAt(kn);
    if (!next) return { ...base, k: ks, branches, status: 'no-convergence', message: `${key}: pole computation did not converge at k = ${kn}` };
    const m = matchPoles(prev, next);
    let move = 0;
    for (let i = 0; i < prev.length; i++) if (m[i] >= 0) move = Math.max(move, poleDistance(prev[i], next[m[i]]));
    if (move > maxMove && kn - k > hMin) { h = (kn - k) / 2; continue; }
    // events between k and kn
    if (base.rhpAtK === null && !prev.some(isRhp) && next.some(isRhp)) {
      base.rhpAtK = bisect(k, kn, (x) => (polesAt(x) ?? []).some(isRhp));
      base.rhpPole = (polesAt(base.rhpAtK) ?? []).filter(isRhp)[0] ?? null;
    }
    if (complexCount(next) > complexCount(prev)) {
      const ks2 = bisect(k, kn, (x) => complexCount(polesAt(x) ?? []) > complexCount(prev));
      const at = (polesAt(ks2) ?? []).filter((p) => p.im !== 0).sort((a, b) => Math.abs(a.im) - Math.abs(b.im))[0];
      if (at) base.splits.push({ k: ks2, pole: { re: at.re, im: 0 } });
    }
    // extend the matched branches; a pole without partner ends its branch, a new one starts one
    const nextActive: number[] = [];
    const nextPrev: Cx[] = [];
    const used = new Set<number>();
    for (let i = 0; i < active.length; i++) {
      const br = branches[active[i]];
      if (m[i] < 0) { br.re.push(null); br.im.push(null); continue; }
      const q = next[m[i]];
      used.add(m[i]);
      br.re.push(q.re); br.im.push(q.im);
      nextActive.push(active[i]); nextPrev.push(q);
    }
    next.forEach((q, j) => {
      if (used.has(j)) return;
      branches.push({ re: [...ks.map(() => null), q.re], im: [...ks.map(() => null), q.im] });
      nextActive.push(branches.length - 1); nextPrev.push(q);
    });
    for (const br of branches) while (br.re.length < ks.length + 1) { br.re.push(null); br.im.push(null); }
    ks.push(kn);
    active = nextActive;
    prev = nextPrev;
    k = kn;
    if (move < maxMove / 3) h *= 1.6;
  }
  return { ...base, k: ks, branches };
}

/** Smallest x in (lo, hi] where pred turns true (pred(lo) false, pred(hi) true), to 1e-9 relative
 *  (each probe is a pole computation; a locus event is not read closer than that). */
function bisect(lo: number, hi: number, pred: (x: number) => boolean, iters = 26): number {
  for (let i = 0; i < iters && hi - lo > 1e-9 * Math.max(1, hi); i++) {
    const mid = 0.5 * (lo + hi);
    if (pred(mid)) hi = mid; else lo = mid;
  }
  return hi;
}
