// The tidy action: document → layout model → ELK graph → ELK → tidied document, checked to have the
// same connectivity (same nets, same pins on each, same rails) before it is offered. Pure apart
// from awaiting the ELK runner; the result is one whole document, applied as one undo step.

import { produce } from 'immer';
import type { DrawingDocument, PartId } from '../schematic/document';
import { isPartId } from '../schematic/document';
import { documentToNetlist } from '../schematic/toNetlist';
import type { Editor } from '../editor/types';
import { symbolOf } from '../schematic/symbols';
import { applyElkLayout, type ApplyOutcome } from './applyLayout';
import { layoutProblems } from './checks';
import { toElkGraph, type ElkGraphJson, type ElkRunner } from './elkGraph';
import { buildModel, railSplitConnectivity, RAIL_KINDS, type ModelOptions } from './model';

export interface TidyResult {
  status: 'ok' | 'nothing-to-do' | 'failed';
  /** The tidied drawing (the input unchanged unless status is 'ok'). */
  doc: DrawingDocument;
  message: string;
  graph?: ElkGraphJson;
  outcome?: ApplyOutcome;
}

/** Nets as sets of "ref.pin" of non-rail parts, with their label / rail names (auto names left
 *  out): equal signatures mean equal connectivity. */
export function connectivitySignature(doc: DrawingDocument): string[] {
  const conn = railSplitConnectivity(doc);
  const out: string[] = [];
  for (const n of conn.nets) {
    const pins = n.pins
      .filter((p) => doc.parts[p.part] && !RAIL_KINDS.has(doc.parts[p.part].kind))
      .map((p) => `${doc.parts[p.part].ref}.${p.pin}`)
      .sort();
    if (pins.length === 0) continue;
    out.push(`${n.auto ? '' : n.name}|${pins.join(',')}`);
  }
  return out.sort();
}

export function sameConnectivity(a: DrawingDocument, b: DrawingDocument): boolean {
  const x = connectivitySignature(a), y = connectivitySignature(b);
  return x.length === y.length && x.every((s, i) => s === y[i]);
}

export async function tidyDocument(doc: DrawingDocument, elk: ElkRunner, opts: ModelOptions = {}): Promise<TidyResult> {
  const model = buildModel(doc, opts);
  if (model.moving.length === 0) return { status: 'nothing-to-do', doc, message: 'Nothing to tidy: no part is free to move.' };
  const graph = toElkGraph(doc, model);
  let laid: ElkGraphJson;
  try {
    laid = await elk.layout(structuredClone(graph));
  } catch (e) {
    return { status: 'failed', doc, graph, message: `The layout engine failed: ${e instanceof Error ? e.message : String(e)}` };
  }
  let outcome: ApplyOutcome = { ok: false, rerouted: 0, wiresFromElk: 0 };
  const next = produce(doc, (d) => { outcome = applyElkLayout(d, doc, model, laid); });
  if (!outcome.ok) return { status: 'failed', doc, graph, outcome, message: `Tidy left the drawing as it was: ${outcome.message}.` };
  if (!sameConnectivity(doc, next)) {
    return { status: 'failed', doc, graph, outcome, message: 'Tidy left the drawing as it was: the rebuilt wires would have changed the connections.' };
  }
  const problems = layoutProblems(next);
  if (problems.length) return { status: 'failed', doc, graph, outcome, message: `Tidy left the drawing as it was: ${problems[0]}.` };
  const before = documentToNetlist(doc).netlist, after = documentToNetlist(next).netlist;
  if (before && JSON.stringify(before) !== JSON.stringify(after)) {
    return { status: 'failed', doc, graph, outcome, message: 'Tidy left the drawing as it was: the netlist would have changed.' };
  }
  return { status: 'ok', doc: next, graph, outcome, message: `Tidied ${model.moving.length} parts.` };
}

/** Scope of the tidy in the editor: the selected parts when there are any, else everything. */
export function tidyScope(doc: DrawingDocument, selection: ReadonlySet<string>): PartId[] | undefined {
  const picked = [...selection].filter(isPartId).filter((id) => doc.parts[id] && symbolOf(doc.parts[id].kind));
  return picked.length > 0 ? picked : undefined;
}

/** Run the tidy on an editor: one undo entry ("Tidy layout"); nothing changes when the drawing was
 *  edited while the layout ran, or when the check fails (the message says why). */
export async function tidyEditor(editor: Editor, elk: ElkRunner, opts: { pinned?: Iterable<PartId> } = {}): Promise<TidyResult> {
  const start = editor.document;
  const r = await tidyDocument(start, elk, { pinned: opts.pinned, scope: tidyScope(start, editor.selection) });
  if (r.status !== 'ok') return r;
  if (editor.document !== start) return { ...r, status: 'failed', doc: editor.document, message: 'The drawing changed while the layout ran; tidy again.' };
  editor.history.replace('Tidy layout', r.doc);
  // Rail symbols the tidy replaced may have been selected: keep only what still exists.
  const kept = [...editor.selection].filter((id) => id in r.doc.parts || id in r.doc.wires);
  if (kept.length !== editor.selection.size) editor.select(kept);
  return r;
}
