// Tiny DOM-free SVG 1.1 text builder: escaped attributes and text, compact numbers.

export function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** A number for an attribute: at most 2 decimals, no "-0". */
export function num(v: number): string {
  const r = Math.round(v * 100) / 100;
  return String(r === 0 ? 0 : r);
}

export type Attrs = Record<string, string | number | undefined | null>;

function attrs(a: Attrs): string {
  let out = '';
  for (const [k, v] of Object.entries(a)) {
    if (v === undefined || v === null) continue;
    out += ` ${k}="${typeof v === 'number' ? num(v) : esc(v)}"`;
  }
  return out;
}

export function el(name: string, a: Attrs, children?: string | string[]): string {
  const body = Array.isArray(children) ? children.join('') : children;
  return body === undefined || body === '' ? `<${name}${attrs(a)}/>` : `<${name}${attrs(a)}>${body}</${name}>`;
}

export function text(x: number, y: number, content: string, a: Attrs = {}): string {
  return el('text', { x, y, ...a }, esc(content));
}

export function pointsAttr(flat: number[]): string {
  const out: string[] = [];
  for (let i = 0; i + 1 < flat.length; i += 2) out.push(`${num(flat[i])},${num(flat[i + 1])}`);
  return out.join(' ');
}

/** An XML id from a free name: letters, digits, '_', '-', '.' kept, anything else as _hh_. */
export function idFor(prefix: string, name: string): string {
  return `${prefix}-${name.replace(/[^A-Za-z0-9_.-]/g, (c) => `_${c.codePointAt(0)!.toString(16)}_`)}`;
}

export const SVG_NS = 'http://www.w3.org/2000/svg';

export function svgDocument(viewBox: { x: number; y: number; width: number; height: number }, title: string, desc: string, body: string[]): string {
  return '<?xml version="1.0" encoding="UTF-8" standalone="no"?>\n' + el('svg', {
    xmlns: SVG_NS, version: '1.1', width: viewBox.width, height: viewBox.height,
    viewBox: `${num(viewBox.x)} ${num(viewBox.y)} ${num(viewBox.width)} ${num(viewBox.height)}`,
  }, [el('title', {}, esc(title)), el('desc', {}, esc(desc)), ...body]) + '\n';
}
