// A/B comparison of two analysis results (pinned A, current B): per node |Z| and τ, poles paired by
// minimum total log-distance (Hungarian assignment, engine/feedback/matching.ts) so each pole's
// movement is read as a continuation, and the change of gain and bandwidth. Pure data.
import type { AnalysisResult, Pole } from '../../engine/index';
import { matchPoles } from '../../engine/feedback/matching';

export interface FigureChange {
  a: number | null;
  b: number | null;
  /** b / a (null when either is missing or a is 0). */
  ratio: number | null;
}

export interface NodeCompare {
  node: string;
  /** |Z| at DC. */
  dcOhms: FigureChange;
  /** |Z| at the impedance column frequency of each result. */
  zOhms: FigureChange;
  tau: FigureChange;
  /** Present in only one of the two results. */
  only?: 'a' | 'b';
}

export interface PoleCompare {
  a: Pole | null;
  b: Pole | null;
  /** |p_B| / |p_A| (natural frequency). */
  ratio: number | null;
}

export interface ResultComparison {
  nodes: NodeCompare[];
  poles: PoleCompare[];
  dcGain: FigureChange;
  bandwidthHz: FigureChange;
  unityGainHz: FigureChange;
  /** Frequencies of the |Z| column in A and B (they may differ). */
  frequencyHz: FigureChange;
}

export function change(a: number | null | undefined, b: number | null | undefined): FigureChange {
  const x = typeof a === 'number' && Number.isFinite(a) ? a : null;
  const y = typeof b === 'number' && Number.isFinite(b) ? b : null;
  return { a: x, b: y, ratio: x !== null && y !== null && x !== 0 ? y / x : null };
}

/** Poles of the upper half-plane and the real axis only (a pair is shown once). */
const upper = (ps: Pole[]) => ps.filter((p) => p.im >= 0);

export function compareResults(a: AnalysisResult, b: AnalysisResult): ResultComparison {
  const pa = upper(a.poles), pb = upper(b.poles);
  const m = matchPoles(pa, pb);
  const used = new Set<number>();
  const poles: PoleCompare[] = pa.map((p, i) => {
    const j = m[i];
    if (j < 0) return { a: p, b: null, ratio: null };
    used.add(j);
    const q = pb[j];
    return { a: p, b: q, ratio: p.omegaN > 0 && q.omegaN > 0 ? q.omegaN / p.omegaN : null };
  });
  pb.forEach((q, j) => { if (!used.has(j)) poles.push({ a: null, b: q, ratio: null }); });

  const nodes: NodeCompare[] = a.nodes.map((na) => {
    const nb = b.nodes.find((x) => x.name === na.name);
    return {
      node: na.name,
      dcOhms: change(na.dcOhms, nb?.dcOhms),
      zOhms: change(na.z?.mag, nb?.z?.mag),
      tau: change(na.tau, nb?.tau),
      ...(nb ? {} : { only: 'a' as const }),
    };
  });
  for (const nb of b.nodes) {
    if (a.nodes.some((x) => x.name === nb.name)) continue;
    nodes.push({ node: nb.name, dcOhms: change(null, nb.dcOhms), zOhms: change(null, nb.z?.mag), tau: change(null, nb.tau), only: 'b' });
  }
  return {
    nodes, poles,
    dcGain: change(a.dcGain, b.dcGain),
    bandwidthHz: change(a.bandwidthHz, b.bandwidthHz),
    unityGainHz: change(a.unityGainHz, b.unityGainHz),
    frequencyHz: change(a.conditions.frequencyHz, b.conditions.frequencyHz),
  };
}

/** Migrations for the s-plane arrows (A → B), both members of a pair. */
export function migrationsOf(c: ResultComparison): { before: Pole | null; after: Pole | null }[] {
  const out: { before: Pole | null; after: Pole | null }[] = [];
  for (const p of c.poles) {
    out.push({ before: p.a, after: p.b });
    const conj = (x: Pole | null) => (x && x.im > 0 ? { ...x, im: -x.im } : null);
    if ((p.a && p.a.im > 0) || (p.b && p.b.im > 0)) {
      const ca = conj(p.a), cb = conj(p.b);
      if (ca || cb) out.push({ before: ca ?? (p.a && p.a.im === 0 ? p.a : null), after: cb ?? (p.b && p.b.im === 0 ? p.b : null) });
    }
  }
  return out;
}
