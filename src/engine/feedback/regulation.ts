// What a loop regulates, read from Blackman's factors (blackman.ts): the loop holds the voltage of
// the node whose impedance it divides most and the current into the node whose impedance it
// multiplies most. Linear small-signal estimate at one frequency (DC when the loop is active there,
// else where its gain peaks).
import type { MnaSystem } from '../types';
import { blackmanAt, fullPencil } from './blackman';
import type { BlackmanNode, BlackmanResult, FullPencil } from './blackman';
import type { Loop } from './loops';
import { portFactor, splitNetwork } from './portInto';
import type { SplitNetwork } from './portInto';
import { cabs } from './cx';
import { scaledG, sourceStamps, nodeLabel } from './pencil';
import type { SourceStamp } from './pencil';

/** A factor must pass this (×1.5 or ÷1.5) before the loop is said to hold anything there. */
export const SIGNIFICANT_FACTOR = 1.5;
const TIE = 1.05;

export interface HeldQuantity {
  node: string;
  /** |Z|/|Z⁰| at that node. */
  factor: number;
  /** Words, e.g. "holds V(x) — impedance ÷ 48". */
  text: string;
  /** Set when the factor is that of the impedance looking into this part at the node (not the
   *  node's impedance to ground): a loaded node keeps its load's impedance, the part's side alone
   *  is what the loop raises (e.g. into a regulated cascode's drain). */
  into?: string;
}

export interface Regulation {
  loopId: string;
  key: string;
  atHz: number;
  status: 'ok' | 'unknown-source' | 'singular' | 'ill-conditioned';
  message?: string;
  holdsVoltage: HeldQuantity | null;
  holdsCurrent: HeldQuantity | null;
  nodes: BlackmanNode[];
  /** Plain summary, with the linear small-signal caveat. */
  summary: string;
}

/** At DC first (the textbook figures: Rout raised, a node held); when the loop changes nothing
 *  there (e.g. closed only through a capacitor), at the frequency where its cycle gain peaks. */
export function loopRegulation(
  sys: MnaSystem, loop: Loop,
  opts: {
    scale?: Record<string, number>; fHz?: number; cache?: Map<string, BlackmanResult>; pencils?: Map<number, FullPencil>;
    splits?: Map<string, SplitNetwork | null>; G?: Float64Array; stamps?: SourceStamp[];
  } = {},
): Regulation {
  const common = { ...opts, loopId: loop.id, preferNets: loop.nets, parts: loop.parts };
  if (opts.fHz !== undefined) return regulationOf(sys, loop.key, common);
  const dc = regulationOf(sys, loop.key, { ...common, fHz: 0 });
  if (dc.holdsVoltage || dc.holdsCurrent || loop.peakAtHz === 0) return dc;
  const hf = regulationOf(sys, loop.key, { ...common, fHz: loop.peakAtHz });
  return hf.status === 'ok' && (hf.holdsVoltage || hf.holdsCurrent) ? hf : dc;
}

export function regulationOf(
  sys: MnaSystem, key: string,
  opts: {
    scale?: Record<string, number>; fHz?: number; loopId?: string; preferNets?: string[]; cache?: Map<string, BlackmanResult>;
    /** Full factors by frequency, shared by the keys analysed at that frequency (filled as needed). */
    pencils?: Map<number, FullPencil>;
    /** Parts of the loop: when no node impedance to ground is raised, the impedance looking into
     *  each of them at their output nodes is tried (portInto.ts). */
    parts?: string[];
    /** Split networks by "part@node@f", shared across keys (filled as needed). */
    splits?: Map<string, SplitNetwork | null>;
    /** G with `scale` applied, and sourceStamps(sys), when the caller holds them (else formed here). */
    G?: Float64Array;
    stamps?: SourceStamp[];
  } = {},
): Regulation {
  const atHz = opts.fHz ?? 0;
  const stamps = opts.stamps ?? sourceStamps(sys);
  // the factors depend only on the key and the frequency; loops sharing a key share them
  const memo = `${key}@${atHz}`;
  let shared = opts.pencils?.get(atHz);
  if (opts.pencils && !shared && !opts.cache?.has(memo)) {
    shared = fullPencil(sys, opts.G ?? scaledG(sys, stamps, opts.scale ?? {}), atHz);
    opts.pencils.set(atHz, shared);
  }
  const b = opts.cache?.get(memo) ?? blackmanAt(sys, key, { fHz: atHz, scale: opts.scale, shared, stamps, G: opts.G });
  opts.cache?.set(memo, b);
  const base = { loopId: opts.loopId ?? key, key, atHz, status: b.status, message: b.message, nodes: b.nodes };
  if (b.status !== 'ok') return { ...base, holdsVoltage: null, holdsCurrent: null, summary: b.message ?? '' };
  const stamp = stamps.find((s) => s.id === key)!;
  const sensed = [stamp.cp, stamp.cn].filter((v) => v >= 0).map((v) => nodeLabel(sys, v));
  const rank = (name: string) => (sensed.includes(name) ? 0 : opts.preferNets?.includes(name) ? 1 : 2);
  const usable = b.nodes.filter((x) => x.status === 'ok' && Number.isFinite(cabs(x.factor)) && cabs(x.factor) > 0);
  let holdsVoltage: HeldQuantity | null = null;
  let holdsCurrent: HeldQuantity | null = null;
  if (usable.length) {
    const mags = usable.map((x) => cabs(x.factor));
    const lo = Math.min(...mags);
    const hi = Math.max(...mags);
    if (lo < 1 / SIGNIFICANT_FACTOR) {
      // among near-equal divisions (every node on a shunt loop is divided alike), the sensed node
      const pick = usable.filter((_, i) => mags[i] <= lo * TIE).sort((p, q) => rank(p.node) - rank(q.node) || cabs(p.factor) - cabs(q.factor))[0];
      const f = cabs(pick.factor);
      holdsVoltage = { node: pick.node, factor: f, text: `holds V(${pick.node}) — impedance ÷ ${fmt(1 / f)}` };
    }
    if (hi > SIGNIFICANT_FACTOR) {
      const pick = usable.filter((_, i) => mags[i] >= hi / TIE).sort((p, q) => cabs(q.factor) - cabs(p.factor))[0];
      const f = cabs(pick.factor);
      holdsCurrent = { node: pick.node, factor: f, text: `holds the current into ${pick.node} — impedance × ${fmt(f)}` };
    }
  }
  if (!holdsCurrent && opts.parts?.length) holdsCurrent = heldInto(sys, key, opts.parts, atHz, opts.scale, opts.splits ?? new Map(), opts.G, shared, stamps);
  const parts = [holdsVoltage?.text, holdsCurrent?.text].filter(Boolean);
  const where = atHz > 0 ? ` at ${fmt(atHz)} Hz` : ' at DC';
  const summary = parts.length
    ? `${key}: ${parts.join('; ')}${where} (linear small-signal estimate)`
    : `${key}: changes no node impedance by more than ×/÷ ${SIGNIFICANT_FACTOR}${where} (linear small-signal estimate)`;
  return { ...base, holdsVoltage, holdsCurrent, summary };
}

/** The largest raise of an impedance looking into one of the loop's parts at a node it drives with
 *  a current (a transistor's drain or collector: the p pin of its gm; an amplifier's output) that
 *  other parts share; null below SIGNIFICANT_FACTOR. */
function heldInto(
  sys: MnaSystem, key: string, parts: string[], fHz: number, scale: Record<string, number> | undefined, splits: Map<string, SplitNetwork | null>,
  G?: Float64Array, fullAt?: FullPencil, stamps: SourceStamp[] = sourceStamps(sys),
): HeldQuantity | null {
  let best: HeldQuantity | null = null;
  const Gs = G ?? scaledG(sys, stamps, scale ?? {});
  for (const part of parts) {
    const outs = new Set<number>();
    for (const s of stamps) {
      if (s.part !== part) continue;
      const v = s.role === 'out' ? Math.max(s.p, s.n) : s.role === 'gm' ? s.p : -1;
      if (v >= 0 && v < sys.nodeCount && !sys.nodeNames[v].includes('#')) outs.add(v);
    }
    for (const node of outs) {
      const shared = sys.elements.some((e) => e.part !== part && e.type !== 'isource' && touches(e, node));
      if (!shared) continue;
      const memo = `${part}@${node}@${fHz}`;
      if (!splits.has(memo)) splits.set(memo, splitNetwork(sys, part, node, { fHz, scale, G: Gs, full: fullAt?.fHz === fHz ? fullAt.pencil : undefined }));
      const split = splits.get(memo);
      const pf = split ? portFactor(sys, key, split, scale, stamps) : null;
      if (!pf) continue;
      const f = cabs(pf.factor);
      if (f > SIGNIFICANT_FACTOR && (!best || f > best.factor)) {
        best = { node: pf.node, factor: f, into: part, text: `holds the current into ${pf.node} — impedance × ${fmt(f)} looking into ${part}` };
      }
    }
  }
  return best;
}

function touches(e: MnaSystem['elements'][number], node: number): boolean {
  switch (e.type) {
    case 'conductance': case 'capacitance': case 'inductance': return e.a === node || e.b === node;
    case 'vccs': case 'vcvs': return [e.p, e.n, e.cp, e.cn].includes(node);
    default: return e.p === node || e.n === node;
  }
}

/** Three significant digits, SI-free (factors and Hz). */
export function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a >= 1e4 || (a > 0 && a < 1e-2)) return x.toExponential(2);
  return String(Number(x.toPrecision(3)));
}
