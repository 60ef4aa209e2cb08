// Export options from the live settings (DOM-free, no plots): the browser export and `--svg` use
// these so a file drawn from the same settings equals what the canvas shows.
import type { LiveSettings, LiveState } from '../live/types';
import { DEFAULT_SETTINGS } from '../live/types';
import type { ExportOptions } from './exportDrawing';

/** Export options equal to the live settings: frequency and the switched-off loops' key sources. */
export function exportOptionsOf(settings: LiveSettings, loops: LiveState['loops'], date?: string): ExportOptions {
  const off = settings.offLoopIds.map((id) => loops[id]?.key).filter((k): k is string => !!k);
  const o: ExportOptions = {
    frequencyHz: settings.frequencyHz, column: settings.frequencyHz === 0 ? 'dc' : 'frequency',
    colorBy: settings.colorMode === 'timeConstant' ? 'timeConstant' : 'impedance',
  };
  if (off.length) o.off = off;
  if (settings.selectedLoopId) o.selectedLoop = settings.selectedLoopId;
  if (date) o.date = date;
  return o;
}

/** What the app shows for a freshly opened drawing (the command line's defaults). */
export const DEFAULT_EXPORT_OPTIONS: ExportOptions = exportOptionsOf(DEFAULT_SETTINGS, {});
