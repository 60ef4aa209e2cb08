// Glue from engine results to plot inputs (type-only imports: no engine code runs here). The plot
// input types are structural matches of the engine's; these helpers pick the fields and convert
// a loop's complex return-ratio samples to magnitude/phase.
import type { AnalysisResult } from '../engine/index';
import type { Loop } from '../engine/feedback/loops';
import type { LoopMargins } from '../engine/feedback/margins';
import type { RootLocus } from '../engine/feedback/locus';
import type { LoopComparison } from '../engine/feedback/compare';
import type { StepResponse } from '../engine/feedback/step';
import type { BodeInput, LoopGainInput, SplaneInput, StepInput } from './types';
import { complexToCurve } from './model/freqPanels';

/** Transfer of an analysis as a Bode input (null when the analysis has no sweep). */
export function bodeInputFrom(r: AnalysisResult, label?: string): BodeInput | null {
  if (!r.sweep) return null;
  return { ...r.sweep, label, poles: r.poles, zeros: r.zeros };
}

/** A discovered loop's T(jω) with its margins. Samples at f ≤ 0 (DC) are dropped. */
export function loopGainInputFrom(loop: Loop, margins: LoopMargins | null): LoopGainInput {
  const hz: number[] = [], values: ({ re: number; im: number } | null)[] = [];
  loop.returnRatio.fHz.forEach((f, i) => {
    if (!(f > 0)) return;
    hz.push(f);
    values.push(loop.returnRatio.points[i]?.value ?? null);
  });
  return { ...complexToCurve(hz, values), label: loop.label, margins };
}

/** Poles and zeros of an analysis, with an optional root locus and compare-mode migrations. */
export function splaneInputFrom(r: AnalysisResult, locus?: RootLocus | null, compare?: LoopComparison | null, labels?: [string, string]): SplaneInput {
  return {
    poles: r.poles, zeros: r.zeros, locus: locus ?? null,
    migrations: compare ? compare.poles.map((p) => ({ before: p.before, after: p.after })) : undefined,
    compareLabels: labels,
  };
}

export function stepInputFrom(s: StepResponse, label?: string): StepInput {
  return { ...s, label };
}
