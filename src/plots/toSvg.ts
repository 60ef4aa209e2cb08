// DOM-free serialiser: a plot scene → a standalone SVG document string (for export and the CLI).
import type { Scene } from './model/scene';
import { sceneToNodes, type NodeOptions, type SvgNode } from './svgNodes';

const escapeText = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
const escapeAttr = (s: string) => escapeText(s).replace(/"/g, '&quot;');

export function nodeToString(n: SvgNode, indent = ''): string {
  const attrs = Object.entries(n.attrs).map(([k, v]) => ` ${k}="${escapeAttr(String(v))}"`).join('');
  if (n.text !== undefined && !n.children?.length) return `${indent}<${n.tag}${attrs}>${escapeText(n.text)}</${n.tag}>`;
  if (!n.children?.length) return `${indent}<${n.tag}${attrs}/>`;
  const inner = n.children.map((c) => nodeToString(c, indent + '  ')).join('\n');
  const text = n.text !== undefined ? escapeText(n.text) : '';
  return `${indent}<${n.tag}${attrs}>${text}\n${inner}\n${indent}</${n.tag}>`;
}

/** Standalone SVG file text (with XML declaration when `declaration` is true, the default). */
export function toSvg(scene: Scene, opts: NodeOptions & { declaration?: boolean } = {}): string {
  const body = nodeToString(sceneToNodes(scene, opts));
  return (opts.declaration === false ? '' : '<?xml version="1.0" encoding="UTF-8"?>\n') + body + '\n';
}
