// One way to export a drawing, used by the browser and by the command line alike: drawing →
// netlist → analysis (+ loops) → annotations → SVG / report text. DOM-free.
import { analyze, type AnalysisResult, type AnalyzeOptions } from '../engine/index';
import type { Netlist } from '../engine/types';
import type { DrawingDocument } from '../schematic/document';
import { documentToNetlist } from '../schematic/toNetlist';
import { annotate, type AnnotateSettings } from './annotate';
import type { SchematicAnnotations, TitleBlock } from './annotations';
import { loopTable, type LoopTable } from './loopReport';
import { reportCsv, reportJson, type ReportSide } from './report';
import { schematicSvg } from './schematicSvg';

export interface ExportOptions {
  /** ISO date for the title block (default: today, UTC). */
  date?: string;
  /** Sources or loop keys switched off, as for analyze(). */
  off?: string[];
  frequencyHz?: number;
  /** Loop id (LoopRow.id) to draw as the selected loop. */
  selectedLoop?: string;
  column?: AnnotateSettings['column'];
  colorBy?: AnnotateSettings['colorBy'];
  note?: string;
}

export interface DrawingAnalysis {
  netlist: Netlist | null;
  result: AnalysisResult | null;
  loops: LoopTable;
  /** Why there is no result (drawing errors), else empty. */
  problems: string[];
}

export const today = () => new Date().toISOString().slice(0, 10);

export function analyseDrawing(doc: DrawingDocument, opts: ExportOptions = {}): DrawingAnalysis {
  const d = documentToNetlist(doc);
  if (!d.netlist) return { netlist: null, result: null, loops: { status: 'not-computed', loops: [], raw: [] }, problems: d.issues.filter((i) => i.severity === 'error').map((i) => i.message) };
  const a: AnalyzeOptions = {};
  if (opts.off?.length) a.off = opts.off;
  if (opts.frequencyHz !== undefined) a.frequencyHz = opts.frequencyHz;
  const result = analyze(d.netlist, a);
  const scale: Record<string, number> = {};
  for (const id of result.conditions.off) scale[id] = 0;
  const loops = result.ok ? loopTable(d.netlist, { scale }) : { status: 'not-computed' as const, loops: [], raw: [] };
  return { netlist: d.netlist, result, loops, problems: result.issues.filter((i) => i.severity === 'error').map((i) => i.message) };
}

export function annotationsFor(doc: DrawingDocument, an: DrawingAnalysis, opts: ExportOptions = {}): SchematicAnnotations {
  const loop = an.loops.loops.find((l) => l.id === opts.selectedLoop);
  // Member parts (refs) route the loop path; the same list the live store keeps per loop.
  const raw = an.loops.raw.find((l) => l.id === opts.selectedLoop);
  const parts = raw ? [...new Set(raw.members.map((m) => m.part))] : [];
  return annotate(doc, an.result, { column: opts.column, colorBy: opts.colorBy, loop: loop ? { id: loop.id, label: loop.label, nets: loop.nets, parts } : null });
}

export function titleBlockFor(doc: DrawingDocument, an: DrawingAnalysis, opts: ExportOptions = {}): TitleBlock {
  const tb: TitleBlock = {
    drawingName: doc.title?.trim() || 'Untitled drawing',
    date: opts.date ?? today(),
    frequencyHz: an.result?.conditions.frequencyHz ?? null,
    loopsOff: an.result?.conditions.off ?? opts.off ?? [],
  };
  const note = opts.note ?? (an.problems.length ? `not analysed: ${an.problems[0]}` : undefined);
  if (note) tb.note = note;
  return tb;
}

/** The annotated schematic SVG of a drawing (what the top bar and `--svg` both write). */
export function annotatedSvg(doc: DrawingDocument, opts: ExportOptions = {}): string {
  const an = analyseDrawing(doc, opts);
  return schematicSvg(doc, annotationsFor(doc, an, opts), titleBlockFor(doc, an, opts));
}

/** The SVG of what the screen shows: the live overlay's annotations (annotate() output, possibly
 *  recoloured, e.g. by τ) and the result they came from, so the file matches the canvas exactly. */
export function shownSvg(doc: DrawingDocument, shown: { annotations: SchematicAnnotations; result: AnalysisResult }, opts: ExportOptions = {}): string {
  const an: DrawingAnalysis = { netlist: null, result: shown.result, loops: { status: 'not-computed', loops: [], raw: [] }, problems: [] };
  return schematicSvg(doc, shown.annotations, titleBlockFor(doc, an, opts));
}

/** JSON and CSV report; with `compareOff`, side B is the same drawing with those switched off. */
export function drawingReport(doc: DrawingDocument, opts: ExportOptions & { compareOff?: string[] } = {}): { json: string; csv: string; problems: string[] } {
  const a = analyseDrawing(doc, opts);
  const sides: ReportSide[] = [];
  if (a.result) sides.push({ name: 'A', result: a.result, loops: a.loops.loops, loopsOff: a.result.conditions.off });
  if (opts.compareOff && a.result) {
    const b = analyseDrawing(doc, { ...opts, off: [...(opts.off ?? []), ...opts.compareOff] });
    if (b.result) sides.push({ name: 'B', result: b.result, loops: b.loops.loops, loopsOff: b.result.conditions.off });
  }
  const input = { title: doc.title?.trim() || 'Untitled drawing', date: opts.date ?? today(), sides };
  return { json: reportJson(input), csv: reportCsv(input), problems: a.problems };
}
