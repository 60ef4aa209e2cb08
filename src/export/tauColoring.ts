// Time-constant colouring of annotations: nets coloured by the node's τ (|Z| at DC times its
// capacitance) on the same log scale and palette as |Z|, with a τ legend. Used by annotate().
import type { AnalysisResult } from '../engine/index';
import { formatSi } from '../engine/units';
import type { SchematicAnnotations } from './annotations';
import { impedanceColor, legendStops, NO_VALUE_COLOR, scaleFor } from './colorScale';

export function colorByTimeConstant(ann: SchematicAnnotations, result: AnalysisResult): SchematicAnnotations {
  const tau = new Map(result.nodes.map((r) => [r.name, r.tau]));
  const scale = scaleFor(Object.keys(ann.nets).map((n) => tau.get(n) ?? null));
  const nets: SchematicAnnotations['nets'] = {};
  for (const [name, m] of Object.entries(ann.nets)) {
    const t = tau.get(name) ?? null;
    nets[name] = { ...m, color: t !== null && t > 0 ? impedanceColor(t, scale) : NO_VALUE_COLOR };
  }
  const stops = legendStops(scale).map((s) => ({ ...s, label: formatSi(s.ohms, 's', 1) }));
  return { ...ann, nets, legend: { title: 'node time constant τ', stops, noValueColor: NO_VALUE_COLOR, noValueLabel: 'no capacitance / open' } };
}
