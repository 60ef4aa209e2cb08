// The live overlay's annotation data: annotate() (the same data the SVG export draws) with the
// store's settings (column, selected loop, colour by |Z| or by τ).
import { annotate } from '../export/annotate';
import type { SchematicAnnotations } from '../export/annotations';
import type { LiveState } from './types';

export function liveAnnotations(state: Pick<LiveState, 'doc' | 'result' | 'settings' | 'loops'>): SchematicAnnotations | null {
  const { doc, result, settings } = state;
  if (!doc || !result || !result.ok) return null;
  const loop = settings.selectedLoopId ? state.loops[settings.selectedLoopId] : undefined;
  const ann = annotate(doc, result, {
    column: settings.frequencyHz === 0 ? 'dc' : 'frequency',
    loop: loop ? { id: loop.id, label: loop.label, nets: loop.nets, parts: loop.parts } : null,
    colorBy: settings.colorMode === 'timeConstant' ? 'timeConstant' : 'impedance',
  });
  return ann;
}
