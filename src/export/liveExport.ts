// Exports of what the app shows (DOM-free): the report of the shown settings (A and B in compare
// mode) and each plot as a standalone SVG drawn by src/plots (the same scene models as the panel).
import type { DrawingDocument } from '../schematic/document';
import type { LiveSettings, LiveState } from '../live/types';
import { bodeModel, impedanceModel, splaneModel, stepModel, toSvg } from '../plots/index';
import { bodeInput, impedanceInput, impedanceNode, splaneInput, stepInput } from '../panels/results/plotInputs';
import { analyseDrawing, today } from './exportDrawing';
import { exportOptionsOf } from './liveOptions';

export { exportOptionsOf };
import { reportCsv, reportJson, type ReportSide } from './report';

type Shown = Pick<LiveState, 'doc' | 'result' | 'feedback' | 'settings' | 'loops' | 'pinnedA'>;

/** JSON + CSV report of the shown settings; with a pinned A, side A is it and side B the drawing now. */
export function liveReport(doc: DrawingDocument, state: Shown, date = today()): { json: string; csv: string; problems: string[] } {
  const sides: ReportSide[] = [];
  const add = (name: string, d: DrawingDocument, settings: LiveSettings) => {
    const an = analyseDrawing(d, exportOptionsOf(settings, state.loops));
    if (an.result) sides.push({ name, result: an.result, loops: an.loops.loops, loopsOff: an.result.conditions.off });
    return an.problems;
  };
  let problems: string[] = [];
  if (state.pinnedA) {
    add('A', state.pinnedA.doc ?? doc, state.pinnedA.settings);
    problems = add('B', doc, state.settings);
  } else {
    problems = add('A', doc, state.settings);
  }
  const input = { title: doc.title?.trim() || 'Untitled drawing', date, sides };
  return { json: reportJson(input), csv: reportCsv(input), problems };
}

export interface PlotFile {
  /** File name suffix, e.g. "bode". */
  name: string;
  svg: string;
}

/** Every plot the results panel can show for the shown result, as SVG files (src/plots toSvg). */
export function livePlotSvgs(state: Shown, size = { width: 640, height: 440 }): PlotFile[] {
  const r = state.result;
  if (!r || !r.ok) return [];
  const out: PlotFile[] = [];
  const bode = bodeInput(r);
  if (bode) out.push({ name: 'bode', svg: toSvg(bodeModel(bode, size)) });
  const z = impedanceInput(r, impedanceNode(r, state.settings.selectedNet ?? null));
  if (z) out.push({ name: `impedance-${z.node.replace(/[^A-Za-z0-9_.-]+/g, '-')}`, svg: toSvg(impedanceModel(z, size)) });
  out.push({ name: 's-plane', svg: toSvg(splaneModel(splaneInput(r, null, state.pinnedA?.result ?? null), size)) });
  const step = stepInput(state.feedback, r);
  if (step) out.push({ name: 'step', svg: toSvg(stepModel(step, size)) });
  return out;
}
