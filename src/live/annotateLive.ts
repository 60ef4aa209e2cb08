// The live overlay's annotation data: annotate() (the same data the SVG export draws) with the
// store's settings, plus the time-constant colour mode (nets coloured by τ on the same log scale
// and palette as |Z|).
import { formatSi } from '../engine/units';
import { annotate } from '../export/annotate';
import type { SchematicAnnotations } from '../export/annotations';
import { impedanceColor, legendStops, NO_VALUE_COLOR, scaleFor } from '../export/colorScale';
import type { LiveState } from './types';

export function liveAnnotations(state: Pick<LiveState, 'doc' | 'result' | 'settings' | 'loops'>): SchematicAnnotations | null {
  const { doc, result, settings } = state;
  if (!doc || !result || !result.ok) return null;
  const loop = settings.selectedLoopId ? state.loops[settings.selectedLoopId] : undefined;
  const ann = annotate(doc, result, {
    column: settings.frequencyHz === 0 ? 'dc' : 'frequency',
    loop: loop ? { id: loop.id, label: loop.label, nets: loop.nets } : null,
  });
  if (settings.colorMode !== 'timeConstant') return ann;
  const tau = new Map(result.nodes.map((r) => [r.name, r.tau]));
  // τ of a node: |Z| at DC times its capacitance; same log mapping as the impedance scale
  const scale = scaleFor(Object.keys(ann.nets).map((n) => tau.get(n) ?? null));
  const nets: SchematicAnnotations['nets'] = {};
  for (const [name, m] of Object.entries(ann.nets)) {
    const t = tau.get(name) ?? null;
    nets[name] = { ...m, color: t !== null && t > 0 ? impedanceColor(t, scale) : NO_VALUE_COLOR };
  }
  const stops = legendStops(scale).map((s) => ({ ...s, label: formatSi(s.ohms, 's', 1) }));
  return { ...ann, nets, legend: { title: 'node time constant τ', stops, noValueColor: NO_VALUE_COLOR, noValueLabel: 'no capacitance / open' } };
}
