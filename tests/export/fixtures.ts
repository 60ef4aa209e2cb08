// Drawings for the export tests: example netlists imported and laid out (ELK, bundled build).
import { readFileSync } from 'node:fs';
import type { Netlist } from '../../src/engine/types';
import type { DrawingDocument } from '../../src/schematic/document';
import { netlistToDrawing } from '../../src/layout/importNetlist';
import { nodeElk } from '../../src/layout/elkNode';
import { DOMParser } from '@xmldom/xmldom';

export function exampleNetlist(name: string): Netlist {
  return JSON.parse(readFileSync(new URL(`../../src/examples/netlists/${name}.json`, import.meta.url), 'utf8')) as Netlist;
}

export async function exampleDrawing(name: string): Promise<DrawingDocument> {
  const r = await netlistToDrawing(exampleNetlist(name), nodeElk());
  if (!r.ok) throw new Error(r.messages.join('; '));
  return r.doc;
}

/** Parse with an XML parser; every warning or error is collected (a well-formed file has none). */
export function parseXml(text: string) {
  const problems: string[] = [];
  const doc = new DOMParser({ onError: (level, msg) => { problems.push(`${level}: ${msg}`); } }).parseFromString(text, 'image/svg+xml');
  return { doc, problems };
}

export function all(node: { getElementsByTagName(n: string): ArrayLike<unknown> }, tag: string): Element[] {
  return Array.from(node.getElementsByTagName(tag) as ArrayLike<Element>);
}
