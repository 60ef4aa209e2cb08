// Renders a plot scene as JSX <svg> (the same element tree toSvg serialises) with a hover read-out.
import { createElement, useEffect, useId, useMemo, useState, type ReactElement, type MouseEvent } from 'react';
import type { Scene } from './model/scene';
import { hoverAt, readoutItems, type HoverHit } from './model/hover';
import { sceneToNodes, type SvgNode } from './svgNodes';
import { toSvg } from './toSvg';

const camel = (k: string) =>
  k === 'class' ? 'className' : /^(data|aria)-/.test(k) ? k : k.replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());

function toReact(n: SvgNode, key: string | number): ReactElement {
  const props: Record<string, unknown> = { key };
  for (const [k, v] of Object.entries(n.attrs)) props[camel(k)] = v;
  const kids = n.children?.map((c, i) => toReact(c, i)) ?? [];
  return createElement(n.tag, props, n.text !== undefined ? [n.text, ...kids] : kids.length ? kids : undefined);
}

export interface PlotSvgProps {
  scene: Scene;
  className?: string;
  /** Called with the standalone SVG text when the user asks for an export (shows the button). */
  onExport?: (svgText: string, scene: Scene) => void;
  onHover?: (hit: HoverHit | null) => void;
}

export function PlotSvg({ scene, className, onExport, onHover }: PlotSvgProps): ReactElement {
  const pre = 'p' + useId().replace(/[^a-zA-Z0-9]/g, '');
  const [hit, setHit] = useState<HoverHit | null>(null);
  const base = useMemo(() => sceneToNodes(scene, { idPrefix: pre }), [scene, pre]);
  const overlay = useMemo(() => (hit ? sceneToNodes({ ...scene, items: [], clips: [] }, { idPrefix: pre, overlay: readoutItems(scene, hit) }) : null), [hit, scene, pre]);
  useEffect(() => setHit(null), [scene]); // a new scene invalidates the old read-out
  const update = (h: HoverHit | null) => { setHit(h); onHover?.(h); };
  const onMove = (e: MouseEvent<SVGSVGElement>) => {
    const r = e.currentTarget.getBoundingClientRect();
    const sx = r.width > 0 ? scene.width / r.width : 1, sy = r.height > 0 ? scene.height / r.height : 1;
    update(hoverAt(scene, (e.clientX - r.left) * sx, (e.clientY - r.top) * sy));
  };
  const overlayGroup = overlay?.children?.find((c) => c.attrs.class === 'ps-overlay');
  const svgProps: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(base.attrs)) svgProps[camel(k)] = v;
  return (
    <figure className={['ps-plot', className].filter(Boolean).join(' ')} style={{ margin: 0 }}>
      <svg {...svgProps} aria-label={scene.title} onMouseMove={onMove} onMouseLeave={() => update(null)} style={{ maxWidth: '100%', height: 'auto' }}>
        {base.children?.map((c, i) => toReact(c, i))}
        {overlayGroup ? toReact({ ...overlayGroup, attrs: { ...overlayGroup.attrs, 'data-testid': 'plot-readout' } }, 'overlay') : null}
      </svg>
      <figcaption className="ps-caption" style={{ fontSize: 11 }}>
        <span aria-live="polite" data-testid="plot-readout-text">{hit ? hit.point.lines.join(' · ') : ''}</span>
        {onExport ? <button type="button" onClick={() => onExport(toSvg(scene), scene)}>Save as SVG</button> : null}
      </figcaption>
    </figure>
  );
}
