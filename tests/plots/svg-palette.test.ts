import { describe, it, expect } from 'vitest';
import { DOMParser } from '@xmldom/xmldom';
import { toSvg } from '../../src/plots/toSvg';
import { bodeModel } from '../../src/plots/model/bodeModel';
import { splaneModel } from '../../src/plots/model/splaneModel';
import { complexToCurve } from '../../src/plots/model/freqPanels';
import { LINES, MARKS, PALETTE } from '../../src/plots/model/palette';
import { logGrid } from './sceneProbe';

const TWO_PI = 2 * Math.PI;

function parse(text: string) {
  const errors: string[] = [];
  const doc = new DOMParser({ onError: (level, msg) => { if (level !== 'warning') errors.push(msg); } }).parseFromString(text, 'image/svg+xml');
  return { doc, errors };
}

const all = (doc: ReturnType<typeof parse>['doc'], tag: string) => Array.from(doc.getElementsByTagName(tag));

describe('SVG serialiser (checked with an independent XML parser, @xmldom/xmldom)', () => {
  const hz = logGrid(10, 1e7, 20);
  const curve = complexToCurve(hz, hz.map((f) => ({ re: 1 / (1 + (f / 1e4) ** 2), im: -(f / 1e4) / (1 + (f / 1e4) ** 2) })));
  const scene = bodeModel({ ...curve, label: 'in < out & "x"', poles: [{ re: -TWO_PI * 1e4, im: 0 }], zeros: [{ re: TWO_PI * 1e6, im: 0 }] });
  const text = toSvg(scene, { idPrefix: 'b1' });

  it('is well-formed SVG with size, viewBox and the namespace (SVG 1.1)', () => {
    const { doc, errors } = parse(text);
    expect(errors).toEqual([]);
    const root = doc.documentElement!;
    expect(root.tagName).toBe('svg');
    expect(root.getAttribute('xmlns')).toBe('http://www.w3.org/2000/svg');
    expect(root.getAttribute('viewBox')).toBe(`0 0 ${scene.width} ${scene.height}`);
    expect(all(doc, 'title')[0].textContent).toBe('Bode plot: in < out & "x"');
  });

  it('every clip-path reference names a clipPath defined in the file', () => {
    const { doc } = parse(text);
    const ids = new Set(all(doc, 'clipPath').map((c) => c.getAttribute('id')));
    const refs = all(doc, 'path').concat(all(doc, 'line')).map((e) => e.getAttribute('clip-path')).filter((r): r is string => !!r);
    expect(refs.length).toBeGreaterThan(0);
    for (const r of refs) expect(ids.has(/^url\(#(.+)\)$/.exec(r)![1])).toBe(true);
  });

  it('writes one element per scene item, with the role as class', () => {
    const { doc } = parse(text);
    const items = all(doc, 'g').find((g) => g.getAttribute('class') === 'ps-items')!;
    expect(items.childNodes.length - Array.from(items.childNodes).filter((n) => n.nodeType !== 1).length).toBe(scene.items.length);
    const cls = (c: string) => all(doc, 'path').filter((p) => p.getAttribute('class') === c);
    expect(cls('ps-pole')).toHaveLength(1);
    expect(cls('ps-zero')).toHaveLength(1);
    expect(cls('ps-curve-mag')[0].getAttribute('d')).toMatch(/^M[\d.]+ [\d.]+(L[\d.-]+ [\d.-]+)+$/);
  });

  it('s-plane scenes serialise too (circles, markers with titles)', () => {
    const s = splaneModel({ poles: [{ re: -1e3, im: 2e3 }, { re: -1e3, im: -2e3 }], zeros: [{ re: -1e5, im: 0 }] });
    const { doc, errors } = parse(toSvg(s));
    expect(errors).toEqual([]);
    expect(all(doc, 'circle').length).toBeGreaterThan(0);
    const titled = all(doc, 'path').filter((p) => p.getAttribute('class') === 'ps-pole');
    expect(titled.map((p) => p.getElementsByTagName('title')[0].textContent)).toHaveLength(2);
  });
});

/** WCAG 2.1 relative luminance and contrast ratio (W3C, "relative luminance" definition). */
function luminance(hex: string): number {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2];
}
const contrast = (a: string, b: string) => { const [x, y] = [luminance(a), luminance(b)].sort((p, q) => q - p); return (x + 0.05) / (y + 0.05); };

describe('palette', () => {
  it('every data ink has ≥ 3:1 contrast on the background (WCAG 2.1 SC 1.4.11)', () => {
    expect(contrast('#ffffff', '#000000')).toBeCloseTo(21, 6); // the formula's known end point
    for (const ink of [PALETTE.ink, PALETTE.inkSoft, PALETTE.blue, PALETTE.amber, PALETTE.violet, PALETTE.slate]) {
      expect(contrast(ink, PALETTE.background)).toBeGreaterThanOrEqual(3);
    }
  });

  it('things told apart also differ in line style or marker shape, not colour alone (common practice for colour-blind safe plots)', () => {
    expect(LINES.primary.dash).not.toBe(LINES.secondary.dash);
    expect(LINES.compareA.dash).not.toBe(LINES.compareB.dash);
    expect(MARKS.pole.shape).not.toBe(MARKS.zero.shape);
    expect(MARKS.poleA.style.width).not.toBe(MARKS.poleB.style.width);
    expect(MARKS.zeroRhp.style.fill).not.toBe(MARKS.zero.style.fill);
    expect(new Set([MARKS.locusStart.shape, MARKS.locusAtOne.shape, MARKS.locusEnd.shape]).size).toBe(3);
  });
});

describe('small-signal caution', () => {
  it('every plot shows that its figures are linear small-signal estimates (project rule)', () => {
    const scenes = [
      bodeModel({ hz: [1, 10], magDb: [0, -1], phaseDeg: [0, -5], label: 'a rather long transfer label that fills the title row' }),
      splaneModel({ poles: [{ re: -1, im: 0 }], zeros: [] }),
    ];
    for (const s of scenes) {
      const c = s.items.filter((i) => i.kind === 'text' && i.role === 'caution');
      expect(c).toHaveLength(1);
      expect(c[0].kind === 'text' && c[0].text).toBe('Linear small-signal estimate.');
      expect(s.description).toMatch(/Linear small-signal estimate/);
    }
  });
});
