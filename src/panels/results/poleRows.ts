// Pole rows for the results panels: one row per real pole and one per conjugate pair, each with the
// nodes that carry it (pole participation from the engine: share of |left·right| eigenvector
// products per node, Pérez-Arriaga, Verghese & Schweppe 1982). Pure data, no React.
import type { Pole, PoleParticipation } from '../../engine/index';

/** Shares below this are not listed as carriers. */
export const CARRIER_SHARE = 0.1;

export interface PoleRow {
  /** Stable row key within one result, e.g. "p2". */
  id: string;
  /** Index of the pole (the upper member of a pair) in result.poles. */
  index: number;
  /** Indices of every pole the row stands for (two for a pair). */
  indices: number[];
  pole: Pole;
  /** Nodes carrying the pole, largest share first (share ≥ CARRIER_SHARE, at least one). */
  carriers: { node: string; share: number }[];
}

/** Rows sorted as the engine sorts its poles (slowest first); a pair is kept once, with im > 0. */
export function poleRows(poles: Pole[], participation: PoleParticipation[]): PoleRow[] {
  const rows: PoleRow[] = [];
  const seen = new Set<number>();
  const byPole = new Map(participation.map((p) => [p.pole, p]));
  poles.forEach((p, i) => {
    if (seen.has(i)) return;
    const indices = [i];
    if (p.kind === 'complex') {
      const twin = poles.findIndex((q, j) => j !== i && !seen.has(j) && q.kind === 'complex' && q.re === p.re && q.im === -p.im);
      if (twin >= 0) indices.push(twin);
    }
    indices.forEach((j) => seen.add(j));
    const upper = indices.reduce((a, j) => (poles[j].im > poles[a].im ? j : a), indices[0]);
    const shares = byPole.get(upper)?.nodes ?? [];
    const carriers = shares.filter((s, k) => k === 0 || s.share >= CARRIER_SHARE);
    rows.push({ id: `p${rows.length + 1}`, index: upper, indices, pole: poles[upper], carriers });
  });
  return rows;
}

/** Net name → ids of the pole rows it carries (for lighting poles when a net is hovered). */
export function polesOfNet(rows: PoleRow[]): Map<string, string[]> {
  const m = new Map<string, string[]>();
  for (const r of rows) for (const c of r.carriers) m.set(c.node, [...(m.get(c.node) ?? []), r.id]);
  return m;
}

/** Short kind text of a pole. */
export function poleKindText(p: Pole): string {
  if (p.kind === 'origin') return 'at s = 0';
  if (p.kind === 'real') return p.rhp ? 'real, right half-plane' : 'real';
  if (p.q === null) return 'undamped pair';
  return p.rhp ? 'pair, right half-plane' : 'pair';
}
