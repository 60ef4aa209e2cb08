// `--svg out.svg` for the command line: the same annotated SVG as the browser's export, written
// without a browser. A saved drawing is exported as drawn; an engine netlist is first laid out
// with the tidy import (ELK's bundled build runs in node).
import { writeFileSync } from 'node:fs';
import type { DrawingDocument } from '../schematic/document';
import { loadDrawing } from '../schematic/file';
import { netlistToDrawing } from '../layout/importNetlist';
import { nodeElk } from '../layout/elkNode';
import { annotatedSvg, type ExportOptions } from './exportDrawing';
import { DEFAULT_EXPORT_OPTIONS } from './liveOptions';

export async function drawingForCli(json: unknown): Promise<{ doc?: DrawingDocument; problems: string[] }> {
  const fmt = (json as { format?: unknown } | null)?.format;
  if (fmt === 'polesketch-drawing') {
    const r = loadDrawing(json);
    return r.ok ? { doc: r.doc, problems: [] } : { problems: [r.reason] };
  }
  const r = await netlistToDrawing(json, nodeElk());
  return r.ok ? { doc: r.doc, problems: [] } : { problems: r.messages.length ? r.messages : ['the netlist could not be drawn'] };
}

/** Write the annotated SVG; returns problems (empty on success). */
export async function writeSvgFile(json: unknown, path: string, opts: ExportOptions = {}): Promise<string[]> {
  const d = await drawingForCli(json);
  if (!d.doc) return d.problems.map((p) => `--svg: ${p}`);
  try {
    writeFileSync(path, annotatedSvg(d.doc, { ...DEFAULT_EXPORT_OPTIONS, ...opts }), 'utf8');
  } catch (e) {
    return [`--svg: cannot write ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`];
  }
  return [];
}
