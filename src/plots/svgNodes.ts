// Scene → a tree of SVG element descriptions (tag, attributes in SVG spelling, children, text).
// toSvg.ts serialises this tree to a string; PlotSvg.tsx turns the same tree into React elements,
// so the screen and the exported file are drawn by one piece of code. DOM-free.
import type { Scene, SceneItem, Style } from './model/scene';
import { markerPath, pathData, r2 } from './model/scene';
import { FONT_FAMILY } from './model/palette';

export interface SvgNode {
  tag: string;
  attrs: Record<string, string | number>;
  children?: SvgNode[];
  text?: string;
}

export interface NodeOptions {
  /** Prefix of clip-path ids, so several plots can share one document. */
  idPrefix?: string;
  /** Extra items drawn on top (e.g. the hover read-out). */
  overlay?: SceneItem[];
}

export function sceneToNodes(scene: Scene, opts: NodeOptions = {}): SvgNode {
  const pre = opts.idPrefix ?? 'plot';
  const defs: SvgNode = {
    tag: 'defs', attrs: {},
    children: scene.clips.map((c) => ({
      tag: 'clipPath', attrs: { id: `${pre}-${c.id}` },
      children: [{ tag: 'rect', attrs: { x: r2(c.x), y: r2(c.y), width: r2(c.w), height: r2(c.h) } }],
    })),
  };
  const children: SvgNode[] = [
    { tag: 'title', attrs: {}, text: scene.title },
    { tag: 'desc', attrs: {}, text: scene.description },
    defs,
    { tag: 'rect', attrs: { class: 'ps-background', x: 0, y: 0, width: scene.width, height: scene.height, fill: scene.background } },
    { tag: 'g', attrs: { class: 'ps-items' }, children: scene.items.map((i) => itemNode(i, pre)) },
  ];
  if (opts.overlay?.length) children.push({ tag: 'g', attrs: { class: 'ps-overlay' }, children: opts.overlay.map((i) => itemNode(i, pre)) });
  return {
    tag: 'svg',
    attrs: {
      xmlns: 'http://www.w3.org/2000/svg', width: scene.width, height: scene.height,
      viewBox: `0 0 ${scene.width} ${scene.height}`, 'font-family': FONT_FAMILY, role: 'img',
    },
    children,
  };
}

function styleAttrs(s: Style, defaultFill = 'none'): Record<string, string | number> {
  const a: Record<string, string | number> = { fill: s.fill ?? defaultFill };
  if (s.stroke) a.stroke = s.stroke;
  if (s.width !== undefined) a['stroke-width'] = s.width;
  if (s.dash) a['stroke-dasharray'] = s.dash;
  if (s.opacity !== undefined && s.opacity !== 1) a.opacity = s.opacity;
  return a;
}

export function itemNode(item: SceneItem, pre: string): SvgNode {
  const base: Record<string, string | number> = { class: `ps-${item.role}` };
  if (item.clip) base['clip-path'] = `url(#${pre}-${item.clip})`;
  switch (item.kind) {
    case 'path':
      return { tag: 'path', attrs: { ...base, d: pathData(item.runs, item.closed), ...styleAttrs(item.style), 'stroke-linejoin': 'round' } };
    case 'line':
      return { tag: 'line', attrs: { ...base, x1: r2(item.x1), y1: r2(item.y1), x2: r2(item.x2), y2: r2(item.y2), ...styleAttrs(item.style) } };
    case 'rect':
      return { tag: 'rect', attrs: { ...base, x: r2(item.x), y: r2(item.y), width: r2(item.w), height: r2(item.h), ...styleAttrs(item.style) } };
    case 'circle':
      return { tag: 'circle', attrs: { ...base, cx: r2(item.cx), cy: r2(item.cy), r: r2(item.r), ...styleAttrs(item.style) } };
    case 'marker': {
      const node: SvgNode = {
        tag: 'path',
        attrs: { ...base, d: markerPath(item.shape, item.x, item.y, item.size), ...styleAttrs(item.style), 'stroke-linecap': 'round' },
      };
      if (item.title) node.children = [{ tag: 'title', attrs: {}, text: item.title }];
      return node;
    }
    case 'text': {
      const a: Record<string, string | number> = {
        ...base, x: r2(item.x), y: r2(item.y), 'font-size': item.size, fill: item.fill, 'text-anchor': item.anchor,
      };
      if (item.baseline && item.baseline !== 'auto') a['dominant-baseline'] = item.baseline;
      if (item.weight === 'bold') a['font-weight'] = 'bold';
      if (item.rotate) a.transform = `rotate(${item.rotate} ${r2(item.x)} ${r2(item.y)})`;
      return { tag: 'text', attrs: a, text: item.text };
    }
  }
}
