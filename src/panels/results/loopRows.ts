// Loop rows for the loop list. Cycles that share a key source are one feedback loop as a designer
// breaks it on the bench (Bode's return ratio of that source, Bode 1945): they share T, the margins
// and what the loop holds, and switching one off switches the key off for all. So the list groups
// cycles by key; each cycle stays selectable for drawing its path. Pure data, no React.
import type { FeedbackResult, LoopReport } from '../../engine/feedback/index';
import type { BoosterCheck } from '../../engine/feedback/doublets';
import { magOf } from './format';

/** Phase margin below this (degrees) is flagged; common practice for a settled step response. */
export const PM_WARN_DEG = 45;
/** Gain margin below this (dB) is flagged; common practice. */
export const GM_WARN_DB = 6;

export interface LoopCycle {
  id: string;
  /** Parts in loop order, e.g. "A1 → M2". */
  label: string;
  /** Member sources in order, e.g. ["A1.A0", "A1.out", "M2.gm"]. */
  members: string[];
  nets: string[];
  kind: 'local' | 'global';
}

export interface LoopGroup {
  /** Key source id: what the switch turns off. */
  key: string;
  /** Label of the primary cycle. */
  label: string;
  /** The cycle that stands for the loop (selected and switched from the loop's header): the
   *  shortest one through more than one part, else the shortest. */
  primaryId: string;
  cycles: LoopCycle[];
  /** "holds V(x) — impedance ÷ 48" and/or "holds the current into out — impedance × 47". */
  holds: string[];
  /** Frequency at which "holds" was read (0 = DC). */
  holdsAtHz: number;
  /** Return ratio T at DC (signed real part when T is real; magnitude otherwise; 0 below roundoff). */
  dcLoopGain: number | null;
  /** Band where the loop is active (|cycle gain| above the threshold), from the shortest cycle. */
  band: { fromHz: number; toHz: number | null } | null;
  unityGainHz: number | null;
  phaseMarginDeg: number | null;
  gainMarginDb: number | null;
  marginNote: string | null;
  warnings: string[];
  booster: BoosterCheck | null;
}

/** |T| below this is roundoff of a loop that is open at DC (e.g. closed only through a capacitor). */
export const T_ROUNDOFF = 1e-9;

function dcGainOf(r: LoopReport): number | null {
  const v = r.margins?.dc ?? r.loop.returnRatioDc?.value ?? null;
  if (!v) return null;
  const m = magOf(v);
  if (m !== null && m < T_ROUNDOFF) return 0;
  if (Math.abs(v.im) <= 1e-9 * Math.abs(v.re)) return v.re;
  return m;
}

export function loopGroups(fb: FeedbackResult | null | undefined): LoopGroup[] {
  if (!fb) return [];
  const groups = new Map<string, LoopGroup>();
  for (const r of fb.loops) {
    const cyc: LoopCycle = { id: r.loop.id, label: r.loop.label, members: r.loop.members.map((m) => m.id), nets: r.loop.nets, kind: r.loop.kind };
    const g = groups.get(r.loop.key);
    if (g) {
      g.cycles.push(cyc);
      if (cyc.members.length < g.cycles[0].members.length) g.label = cyc.label;
      continue;
    }
    const m = r.margins;
    const holds = [r.regulation.holdsVoltage?.text, r.regulation.holdsCurrent?.text].filter((t): t is string => !!t);
    groups.set(r.loop.key, {
      key: r.loop.key, label: r.loop.label, primaryId: r.loop.id, cycles: [cyc], holds, holdsAtHz: r.regulation.atHz,
      dcLoopGain: dcGainOf(r), band: r.loop.band,
      unityGainHz: m?.unityGainHz ?? null, phaseMarginDeg: m?.phaseMarginDeg ?? null, gainMarginDb: m?.gainMarginDb ?? null,
      marginNote: m && m.status !== 'ok' && m.status !== 'positive-feedback' ? m.message ?? m.status : null,
      warnings: [], booster: null,
    });
  }
  for (const g of groups.values()) {
    g.cycles.sort((a, b) => a.members.length - b.members.length);
    // the shortest cycle through more than one part names the loop best ("A1 → M2")
    const primary = g.cycles.find((c) => c.label.includes('→')) ?? g.cycles[0];
    g.label = primary.label;
    g.primaryId = primary.id;
    const shortest = fb.loops.find((r) => r.loop.id === g.cycles[0].id);
    if (shortest) g.band = shortest.loop.band;
    g.booster = fb.boosters.find((b) => g.cycles.some((c) => c.id === b.loopId)) ?? null;
    g.warnings = loopWarnings(g, fb);
  }
  return [...groups.values()];
}

function loopWarnings(g: LoopGroup, fb: FeedbackResult): string[] {
  const w: string[] = [];
  if (g.phaseMarginDeg !== null && g.phaseMarginDeg < PM_WARN_DEG) w.push(`phase margin ${g.phaseMarginDeg.toFixed(1)}° is under ${PM_WARN_DEG}°`);
  if (g.gainMarginDb !== null && g.gainMarginDb < GM_WARN_DB) w.push(`gain margin ${g.gainMarginDb.toFixed(1)} dB is under ${GM_WARN_DB} dB`);
  const pos = fb.loops.find((r) => r.loop.key === g.key && r.margins?.status === 'positive-feedback');
  // a T(0) at roundoff level is no feedback at DC at all, whatever its sign
  if (pos && g.dcLoopGain !== 0) w.push(pos.margins.message ?? 'positive feedback at DC');
  if (g.booster && g.booster.ok === false) w.push(g.booster.verdict);
  return w;
}

/** Group of the loop with this id (a cycle id or a key id). */
export function groupOf(groups: LoopGroup[], id: string | null | undefined): LoopGroup | null {
  if (!id) return null;
  return groups.find((g) => g.key === id || g.cycles.some((c) => c.id === id)) ?? null;
}
