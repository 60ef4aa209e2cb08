// The annotated schematic as a standalone SVG 1.1 file, DOM-free (the command line writes it too).
// Symbols come from the same symbol JSON through symbolItems (symbolGeometry.ts); colours and line
// weights are the canvas theme's. One group per part and one per net (wires and junction dots in
// the net's colour); then badges, the slowest-node mark, the selected loop, legend and title block.

import type { DrawingDocument, Point } from '../schematic/document';
import { computeConnectivity, GROUND_NET } from '../schematic/connectivity';
import { placedBounds, symbolOf } from '../schematic/symbols';
import { placedSymbolOf } from '../canvas/drawSymbol';
import { INK, INK_SOFT, JUNCTION_RADIUS, SYMBOL_STROKE, WIRE, WIRE_WIDTH } from '../canvas/theme';
import { formatSi } from '../engine/units';
import type { SchematicAnnotations, TitleBlock } from './annotations';
import { BADGE_TEXT_SIZE, EMPTY_ANNOTATIONS } from './annotations';
import { symbolItems, textLines, type DrawItem } from './symbolGeometry';
import { el, esc, idFor, pointsAttr, svgDocument, text } from './svgWriter';

export const SVG_FONT = 'Helvetica, Arial, sans-serif';
export const LOOP_COLOR = '#7b3f98';
export const SLOW_COLOR = '#1e2a32';
const MARGIN = 20;
const BADGE_SIZE = BADGE_TEXT_SIZE;

interface Box { x0: number; y0: number; x1: number; y1: number }
const grow = (b: Box, x: number, y: number) => { b.x0 = Math.min(b.x0, x); b.y0 = Math.min(b.y0, y); b.x1 = Math.max(b.x1, x); b.y1 = Math.max(b.y1, y); };
const textW = (s: string, size: number) => s.length * size * 0.58;

function itemSvg(it: DrawItem, color: string, box: Box): string {
  if (it.type === 'poly') {
    for (let i = 0; i + 1 < it.points.length; i += 2) grow(box, it.points[i], it.points[i + 1]);
    return el(it.closed ? 'polygon' : 'polyline', { points: pointsAttr(it.points), fill: it.fill ? color : 'none' });
  }
  if (it.type === 'circle') {
    grow(box, it.cx - it.r, it.cy - it.r); grow(box, it.cx + it.r, it.cy + it.r);
    return el('circle', { cx: it.cx, cy: it.cy, r: it.r, fill: it.fill ? color : 'none' });
  }
  const lines = textLines(it);
  const anchor = it.align === 'start' ? 'start' : it.align === 'end' ? 'end' : 'middle';
  return lines.map((l) => {
    const w = textW(l.text, it.size);
    const x0 = it.align === 'start' ? it.x : it.align === 'end' ? it.x - w : it.x - w / 2;
    grow(box, x0, l.y - it.size * 0.6); grow(box, x0 + w, l.y + it.size * 0.6);
    return text(it.x, l.y, l.text, {
      'font-size': it.size, 'text-anchor': anchor, dy: '0.35em', stroke: 'none',
      fill: it.role === 'fixed' ? color : INK_SOFT, 'font-weight': it.role === 'label' ? 'bold' : undefined,
    });
  }).join('');
}

function partsSvg(doc: DrawingDocument, box: Box): string {
  const parts = Object.values(doc.parts).sort((a, b) => (a.ref < b.ref ? -1 : a.ref > b.ref ? 1 : a.id < b.id ? -1 : 1));
  return el('g', { id: 'parts', stroke: INK, 'stroke-width': SYMBOL_STROKE, 'stroke-linecap': 'round', 'stroke-linejoin': 'round', fill: 'none' }, parts.map((p) => {
    const sym = symbolOf(p.kind);
    const items = symbolItems(sym, placedSymbolOf(p, sym));
    const b = placedBounds(p);
    grow(box, b.x, b.y); grow(box, b.x + b.width, b.y + b.height);
    return el('g', { id: idFor('part', p.ref), class: `part ${p.kind}` }, [el('title', {}, esc(`${p.ref} (${sym.title})`)), ...items.map((it) => itemSvg(it, INK, box))]);
  }));
}

function netsSvg(doc: DrawingDocument, ann: SchematicAnnotations, box: Box): string {
  const conn = computeConnectivity(doc);
  const nets = [...conn.nets].sort((a, b) => (a.name < b.name ? -1 : 1));
  const dots = new Map<string, Point[]>();
  for (const j of conn.junctions) {
    const net = conn.nets.find((n) => n.wires.some((w) => doc.wires[w]?.points.some((p) => p.x === j.x && p.y === j.y)) || n.pins.some((pr) => conn.pins.some((pp) => pp.part === pr.part && pp.name === pr.pin && pp.x === j.x && pp.y === j.y)));
    if (net) dots.set(net.name, [...(dots.get(net.name) ?? []), j]);
  }
  return el('g', { id: 'nets', fill: 'none', 'stroke-linecap': 'round', 'stroke-linejoin': 'round' }, nets.map((n) => {
    const mark = ann.nets[n.name];
    const color = n.name !== GROUND_NET && mark ? mark.color : WIRE;
    const wires = [...n.wires].sort().map((id) => {
      const pts = doc.wires[id].points;
      for (const p of pts) grow(box, p.x, p.y);
      return el('polyline', { points: pointsAttr(pts.flatMap((p) => [p.x, p.y])) });
    });
    const js = (dots.get(n.name) ?? []).map((j) => el('circle', { cx: j.x, cy: j.y, r: JUNCTION_RADIUS, fill: color, stroke: 'none' }));
    return el('g', { id: idFor('net', n.name), class: 'net', stroke: color, 'stroke-width': mark ? WIRE_WIDTH + 0.7 : WIRE_WIDTH }, [el('title', {}, esc(n.name === GROUND_NET ? 'ground (0)' : n.name)), ...wires, ...js]);
  }));
}

function overlaySvg(ann: SchematicAnnotations, box: Box): string {
  const out: string[] = [];
  if (ann.loop) {
    const pts = ann.loop.points;
    pts.forEach((p) => grow(box, p.x, p.y));
    out.push(el('g', { id: 'loop-path', class: 'loop' }, [
      el('title', {}, esc(`selected loop ${ann.loop.label}`)),
      el('polyline', { points: pointsAttr(pts.flatMap((p) => [p.x, p.y])), fill: 'none', stroke: LOOP_COLOR, 'stroke-width': 2.2, 'stroke-dasharray': '6 4', opacity: 0.85 }),
      text(pts[0].x + 6, pts[0].y + 14, `loop ${ann.loop.label}`, { 'font-size': BADGE_SIZE, fill: LOOP_COLOR }),
    ]));
  }
  if (ann.slowest) {
    const a = ann.slowest.anchor;
    grow(box, a.x - 10, a.y - 10); grow(box, a.x + 10 + textW(ann.slowest.label, BADGE_SIZE), a.y + 22);
    out.push(el('g', { id: 'slowest-node', class: 'slowest' }, [
      el('title', {}, esc(ann.slowest.label)),
      el('circle', { cx: a.x, cy: a.y, r: 7, fill: 'none', stroke: SLOW_COLOR, 'stroke-width': 1.4 }),
      el('circle', { cx: a.x, cy: a.y, r: 10, fill: 'none', stroke: SLOW_COLOR, 'stroke-width': 0.8 }),
      text(a.x + 12, a.y + 16, ann.slowest.label, { 'font-size': BADGE_SIZE, fill: SLOW_COLOR, 'font-weight': 'bold' }),
    ]));
  }
  const badges = ann.badges.map((b) => {
    const { x, y, width: w, height: h } = b.box;
    grow(box, x, y); grow(box, x + w, y + h);
    // Leader from the anchor to the nearest corner of the box.
    const cx = Math.abs(b.anchor.x - x) < Math.abs(b.anchor.x - (x + w)) ? x : x + w;
    const cy = Math.abs(b.anchor.y - y) < Math.abs(b.anchor.y - (y + h)) ? y : y + h;
    const color = ann.nets[b.net]?.color ?? WIRE;
    return el('g', { id: idFor('badge', b.net), class: 'badge' }, [
      el('line', { x1: b.anchor.x, y1: b.anchor.y, x2: cx, y2: cy, stroke: color, 'stroke-width': 0.8 }),
      el('rect', { x, y, width: w, height: h, rx: 2, fill: '#ffffff', 'fill-opacity': 0.9, stroke: color, 'stroke-width': 1 }),
      ...b.lines.map((l, i) => text(x + 4, y + 2 + (i + 0.5) * (BADGE_SIZE + 2), l, { 'font-size': BADGE_SIZE, dy: '0.35em', fill: INK })),
    ]);
  });
  if (badges.length) out.push(el('g', { id: 'badges' }, badges));
  return out.join('');
}

function footerSvg(ann: SchematicAnnotations, title: TitleBlock, top: number, left: number, right: number): { svg: string; height: number; right: number } {
  const parts: string[] = [];
  let legendH = 0;
  if (ann.legend && ann.legend.stops.length > 0) {
    const lg = ann.legend, w = 200, y = top + 14;
    const grad = el('linearGradient', { id: 'legend-gradient', x1: 0, y1: 0, x2: 1, y2: 0 },
      lg.stops.map((s) => el('stop', { offset: s.t, 'stop-color': s.color })));
    parts.push(el('g', { id: 'legend' }, [
      el('defs', {}, grad),
      text(left, top + 6, lg.title, { 'font-size': 8, fill: INK, 'font-weight': 'bold' }),
      el('rect', { x: left, y, width: w, height: 8, fill: 'url(#legend-gradient)', stroke: INK_SOFT, 'stroke-width': 0.5 }),
      ...lg.stops.map((s) => el('g', { class: 'legend-tick' }, [
        el('line', { x1: left + s.t * w, y1: y + 8, x2: left + s.t * w, y2: y + 11, stroke: INK_SOFT, 'stroke-width': 0.6 }),
        text(left + s.t * w, y + 17, s.label, { 'font-size': 6.5, 'text-anchor': 'middle', fill: INK }),
      ])),
      el('rect', { x: left, y: y + 24, width: 8, height: 6, fill: lg.noValueColor }),
      text(left + 11, y + 27, lg.noValueLabel, { 'font-size': 6.5, dy: '0.35em', fill: INK }),
    ]));
    legendH = 60;
  }
  const lines = [
    title.drawingName,
    `date ${title.date}`,
    `analysis frequency ${title.frequencyHz === null ? 'DC' : formatSi(title.frequencyHz, 'Hz')}`,
    `loops switched off: ${title.loopsOff.length ? title.loopsOff.join(', ') : 'none'}`,
    ...(title.note ? [title.note] : []),
  ];
  const tw = Math.max(180, ...lines.map((l, i) => textW(l, i === 0 ? 9 : 7.5))) + 12;
  const th = lines.length * 12 + 8;
  const tx = Math.max(left + (legendH ? 220 : 0), right - tw);
  parts.push(el('g', { id: 'title-block' }, [
    el('rect', { x: tx, y: top, width: tw, height: th, fill: 'none', stroke: INK, 'stroke-width': 0.8 }),
    ...lines.map((l, i) => text(tx + 6, top + 10 + i * 12, l, { 'font-size': i === 0 ? 9 : 7.5, 'font-weight': i === 0 ? 'bold' : undefined, fill: INK })),
  ]));
  const capY = top + Math.max(legendH, th) + 10;
  parts.push(text(left, capY, ann.caution || 'Linear small-signal estimates.', { id: 'caution', 'font-size': 6.5, fill: INK_SOFT }));
  return { svg: parts.join(''), height: Math.max(legendH, th) + 16, right: tx + tw };
}

/** The annotated schematic as SVG text. */
export function schematicSvg(doc: DrawingDocument, ann: SchematicAnnotations = EMPTY_ANNOTATIONS, title?: TitleBlock): string {
  const box: Box = { x0: Infinity, y0: Infinity, x1: -Infinity, y1: -Infinity };
  const nets = netsSvg(doc, ann, box);
  const parts = partsSvg(doc, box);
  const overlay = overlaySvg(ann, box);
  if (box.x0 === Infinity) { box.x0 = 0; box.y0 = 0; box.x1 = 200; box.y1 = 100; }
  const tb: TitleBlock = title ?? { drawingName: doc.title?.trim() || 'Untitled drawing', date: '', frequencyHz: null, loopsOff: [] };
  const left = box.x0 - MARGIN;
  const footer = footerSvg(ann, tb, box.y1 + MARGIN, left + MARGIN, box.x1);
  const width = Math.max(box.x1 - box.x0 + 2 * MARGIN, footer.right + MARGIN - left);
  const vb = { x: left, y: box.y0 - MARGIN, width, height: box.y1 - box.y0 + 3 * MARGIN + footer.height };
  const desc = `Schematic ${tb.drawingName} with node impedance annotations. ${ann.caution}`.trim();
  return svgDocument(vb, tb.drawingName, desc, [
    el('rect', { id: 'sheet', x: vb.x, y: vb.y, width: vb.width, height: vb.height, fill: '#ffffff' }),
    el('g', { 'font-family': SVG_FONT }, [nets, parts, overlay, footer.svg]),
  ]);
}
