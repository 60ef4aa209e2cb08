// Plot inputs from the live state (DOM-free): the transfer's Bode data, the selected loop's T(jω),
// |Z| against frequency of one node, s-plane roots with locus and A/B migrations, step response.
import type { AnalysisResult, Netlist } from '../../engine/index';
import type { FeedbackResult } from '../../engine/feedback/index';
import type { BodeInput, ImpedanceInput, LoopGainInput, SplaneInput, StepInput } from '../../plots/index';
import { bodeInputFrom, complexToCurve, stepInputFrom } from '../../plots/index';
import type { LoopDetail } from '../../worker/loopDetail';
import { compareResults, migrationsOf } from './compareModel';

export function transferLabel(r: AnalysisResult): string {
  const out = r.conditions.output;
  const o = !out ? '?' : out.kind === 'voltage' ? `V(${out.node}${out.ref ? `, ${out.ref}` : ''})` : `I(${out.part})`;
  return `${r.conditions.input ?? '?'} → ${o}`;
}

export function bodeInput(r: AnalysisResult): BodeInput | null {
  return bodeInputFrom(r, transferLabel(r));
}

export function loopGainInput(detail: LoopDetail | null, fb: FeedbackResult | null, label: string): LoopGainInput | null {
  if (!detail || !detail.hz.length) return null;
  const margins = fb?.loops.find((l) => l.loop.key === detail.key)?.margins ?? null;
  const hz: number[] = [], values: typeof detail.values = [];
  detail.hz.forEach((f, i) => { if (f > 0) { hz.push(f); values.push(detail.values[i]); } });
  return { ...complexToCurve(hz, values), label, margins };
}

/** The node the impedance plot shows: the chosen one, else the slowest. */
export function impedanceNode(r: AnalysisResult, chosen: string | null): string | null {
  const names = r.impedanceSweep?.nodes ?? [];
  if (chosen && names.includes(chosen)) return chosen;
  return r.nodes.find((n) => n.slowest)?.name ?? names[0] ?? null;
}

export function impedanceInput(r: AnalysisResult, node: string | null): ImpedanceInput | null {
  const sw = r.impedanceSweep;
  if (!sw || !node) return null;
  const k = sw.nodes.indexOf(node);
  if (k < 0) return null;
  const ohms = sw.values[k].map((z) => (z ? Math.hypot(z.re, z.im) : null)).map((m) => (m !== null && Number.isFinite(m) ? m : null));
  const pole = r.nodes.find((n) => n.name === node)?.poleHz;
  return { node, hz: sw.hz, ohms, markHz: pole ? [pole] : [] };
}

export function splaneInput(r: AnalysisResult, detail: LoopDetail | null, pinned: AnalysisResult | null): SplaneInput {
  const migrations = pinned && pinned !== r && pinned.ok && r.ok ? migrationsOf(compareResults(pinned, r)) : undefined;
  return {
    poles: r.poles, zeros: r.zeros,
    locus: detail?.locus && detail.locus.status === 'ok' ? detail.locus : null,
    migrations, compareLabels: migrations ? ['A', 'B'] : undefined,
  };
}

export function stepInput(fb: FeedbackResult | null, r: AnalysisResult): StepInput | null {
  return fb?.step ? stepInputFrom(fb.step, transferLabel(r)) : null;
}

/** Unit of the transfer: V/V, Ω (current in, voltage out), S or A/A. */
export function gainUnit(netlist: Netlist | null, r: AnalysisResult): { unit: string; dimensionless: boolean } {
  const inKind = netlist?.parts.find((p) => p.name === r.conditions.input)?.kind;
  const outKind = r.conditions.output?.kind;
  if (inKind === 'isource') return outKind === 'current' ? { unit: 'A/A', dimensionless: true } : { unit: 'Ω', dimensionless: false };
  return outKind === 'current' ? { unit: 'S', dimensionless: false } : { unit: 'V/V', dimensionless: true };
}
