// Browser side of the exports: turn the DOM-free exporters' text into downloads, and run the tidy
// layout with ELK in a worker. The only file of src/export that touches the DOM.
import type { Editor } from '../editor/types';
import type { DrawingDocument } from '../schematic/document';
import { tidyEditor, type TidyResult } from '../layout/tidy';
import type { ElkRunner } from '../layout/elkGraph';
import { workerElk } from '../layout/elkWorker';
import { analyseDrawing, annotatedSvg, drawingReport, shownSvg, type ExportOptions } from './exportDrawing';
import type { SchematicAnnotations } from './annotations';
import type { AnalysisResult } from '../engine/index';
import { DEFAULT_SETTINGS, type LiveState } from '../live/types';
import { livePlotSvgs, liveReport } from './liveExport';

export function downloadText(name: string, mime: string, text: string): void {
  const url = URL.createObjectURL(new Blob([text], { type: mime }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 2000);
}

function baseName(doc: DrawingDocument): string {
  return (doc.title?.trim() || 'drawing').replace(/[^A-Za-z0-9_.-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'drawing';
}

/** Top-bar handlers (TopBar props onExportSvg / onExportReport / onExportPlots). */
export function exportActions(
  getDoc: () => DrawingDocument,
  getOptions: () => ExportOptions & { compareOff?: string[] } = () => ({}),
  /** What the canvas overlay shows now (src/live liveAnnotations + its result); when given, the
   *  SVG is drawn from exactly that, else recomputed from the drawing with getOptions(). */
  getShown?: () => { annotations: SchematicAnnotations; result: AnalysisResult } | null,
  /** The live store's state: when given, the report follows its settings (A and B in compare mode)
   *  and the plots are those of the results panel. */
  getLive?: () => LiveState | null,
) {
  return {
    onExportSvg: () => {
      const doc = getDoc();
      const shown = getShown?.();
      downloadText(`${baseName(doc)}.svg`, 'image/svg+xml', shown ? shownSvg(doc, shown, getOptions()) : annotatedSvg(doc, getOptions()));
    },
    onExportReport: () => {
      const doc = getDoc();
      const live = getLive?.();
      const r = live ? liveReport(doc, live, getOptions().date) : drawingReport(doc, getOptions());
      downloadText(`${baseName(doc)}-report.json`, 'application/json', r.json);
      downloadText(`${baseName(doc)}-report.csv`, 'text/csv', r.csv);
    },
    onExportPlots: () => {
      const doc = getDoc();
      const live = getLive?.();
      const shown = live ?? { doc, result: analyseDrawing(doc, getOptions()).result, feedback: null, settings: DEFAULT_SETTINGS, loops: {}, pinnedA: null };
      for (const f of livePlotSvgs(shown)) downloadText(`${baseName(doc)}-${f.name}.svg`, 'image/svg+xml', f.svg);
    },
  };
}

/** The editor's `tidy` action: ELK in a worker, one undo step, the outcome told through `notify`. */
export function editorTidy(editor: Editor, notify: (message: string, isError: boolean) => void, elk: () => ElkRunner = workerElk): () => void {
  return () => {
    void tidyEditor(editor, elk()).then(
      (r: TidyResult) => notify(r.message, r.status === 'failed'),
      (e: unknown) => notify(`Tidy failed: ${e instanceof Error ? e.message : String(e)}`, true),
    );
  };
}
