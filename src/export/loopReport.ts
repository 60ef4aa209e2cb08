// Feedback loops of a netlist as report rows: members, what each loop regulates (Blackman factors),
// its return ratio at DC and its margins. Linear small-signal estimates; any numerical trouble is
// returned as a status with a message, never thrown.
import type { Netlist } from '../engine/types';
import { buildMna } from '../engine/mna';
import { discoverLoops, type Loop } from '../engine/feedback/loops';
import { loopMargins } from '../engine/feedback/margins';
import { loopRegulation } from '../engine/feedback/regulation';
import { cabs } from '../engine/feedback/cx';

export interface LoopRow {
  id: string;
  label: string;
  kind: 'local' | 'global';
  members: string[];
  nets: string[];
  key: string;
  returnRatioDc: { re: number; im: number } | null;
  band: { fromHz: number; toHz: number | null } | null;
  regulates: { voltage: { node: string; factor: number; text: string } | null; current: { node: string; factor: number; text: string } | null; atHz: number };
  /** |Z|/|Z⁰| per node (Blackman 1943), at the regulation frequency. */
  factors: { node: string; factor: number | null }[];
  margins: { status: string; unityGainHz: number | null; phaseMarginDeg: number | null; gainMarginDb: number | null; message?: string };
  summary: string;
}

export interface LoopTable {
  status: 'ok' | 'not-computed';
  message?: string;
  loops: LoopRow[];
  /** The engine's loop objects (for the canvas / annotate: nets in order). */
  raw: Loop[];
}

export function loopTable(netlist: Netlist, opts: { scale?: Record<string, number> } = {}): LoopTable {
  try {
    const m = buildMna(netlist, { scale: opts.scale });
    if (!m.system) return { status: 'not-computed', message: m.issues.filter((i) => i.severity === 'error').map((i) => i.message).join('; ') || 'no equations', loops: [], raw: [] };
    const sys = m.system;
    const found = discoverLoops(sys, { scale: opts.scale });
    const loops = found.loops.map((loop): LoopRow => {
      const reg = loopRegulation(sys, loop, { scale: opts.scale });
      const mg = loopMargins(sys, loop.key, { scale: opts.scale });
      const held = (h: typeof reg.holdsVoltage) => (h ? { node: h.node, factor: h.factor, text: h.text } : null);
      return {
        id: loop.id, label: loop.label, kind: loop.kind, members: loop.members.map((x) => x.id), nets: loop.nets, key: loop.key,
        returnRatioDc: loop.returnRatioDc.value, band: loop.band,
        regulates: { voltage: held(reg.holdsVoltage), current: held(reg.holdsCurrent), atHz: reg.atHz },
        factors: reg.nodes.map((n) => ({ node: n.node, factor: Number.isFinite(cabs(n.factor)) ? cabs(n.factor) : null })),
        margins: { status: mg.status, unityGainHz: mg.unityGainHz, phaseMarginDeg: mg.phaseMarginDeg, gainMarginDb: mg.gainMarginDb, message: mg.message },
        summary: reg.summary,
      };
    });
    return { status: 'ok', loops, raw: found.loops };
  } catch (e) {
    return { status: 'not-computed', message: `loops could not be computed: ${e instanceof Error ? e.message : String(e)}`, loops: [], raw: [] };
  }
}
