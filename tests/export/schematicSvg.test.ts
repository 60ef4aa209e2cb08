import { describe, expect, it } from 'vitest';
import { computeConnectivity } from '../../src/schematic/connectivity';
import { symbolOf } from '../../src/schematic/symbols';
import { analyseDrawing, annotatedSvg, annotationsFor } from '../../src/export/exportDrawing';
import { schematicSvg } from '../../src/export/schematicSvg';
import { drawing, part } from '../schematic/build';
import { all, exampleDrawing, parseXml } from './fixtures';

const DATE = '2026-01-15';

describe('annotated schematic SVG', () => {
  it('is well-formed SVG 1.1 with one group per part and per net, nets in their impedance colour', async () => {
    const doc = await exampleDrawing('two-stage-miller-unity');
    const svg = annotatedSvg(doc, { date: DATE });
    const { doc: xml, problems } = parseXml(svg);
    expect(problems).toEqual([]);
    const root = xml.documentElement!;
    expect(root.nodeName).toBe('svg');
    expect(root.getAttribute('xmlns')).toBe('http://www.w3.org/2000/svg'); // SVG 1.1 §5.1 namespace
    expect(root.getAttribute('version')).toBe('1.1');
    const groups = all(xml, 'g');
    const partGroups = groups.filter((g) => (g.getAttribute('class') ?? '').startsWith('part '));
    expect(partGroups.map((g) => g.getAttribute('id')).sort()).toEqual(Object.values(doc.parts).map((p) => `part-${p.ref}`).sort());
    const conn = computeConnectivity(doc);
    const netGroups = groups.filter((g) => g.getAttribute('class') === 'net');
    expect(netGroups.length).toBe(conn.nets.length);
    const an = analyseDrawing(doc);
    expect(an.result?.ok).toBe(true);
    const ann = annotationsFor(doc, an);
    const colored = Object.keys(ann.nets);
    expect(colored.length).toBeGreaterThan(2);
    for (const net of colored) {
      const g = netGroups.find((x) => x.getAttribute('id') === `net-${net}`)!;
      expect(g.getAttribute('stroke')).toBe(ann.nets[net].color);
      for (const line of all(g, 'polyline')) expect(line.getAttribute('stroke')).toBeNull(); // inherits the net colour
    }
    // Text stays text (vector, selectable): every reference designator of a device is a <text>.
    const texts = all(xml, 'text').map((t) => t.textContent);
    for (const p of Object.values(doc.parts)) if (symbolOf(p.kind).role === 'device') expect(texts).toContain(p.ref);
    // Badges, slowest mark, legend, title block.
    expect(groups.filter((g) => g.getAttribute('class') === 'badge').length).toBe(ann.badges.length);
    expect(ann.badges.length).toBe(colored.length);
    expect(groups.some((g) => g.getAttribute('id') === 'slowest-node')).toBe(ann.slowest !== null);
    expect(groups.some((g) => g.getAttribute('id') === 'legend')).toBe(true);
    const title = groups.find((g) => g.getAttribute('id') === 'title-block')!;
    const tt = all(title, 'text').map((t) => t.textContent).join(' | ');
    expect(tt).toContain(doc.title!);
    expect(tt).toContain(`date ${DATE}`);
    expect(tt).toMatch(/analysis frequency \d/);
    expect(tt).toContain('loops switched off: none');
    expect(all(xml, 'text').some((t) => /small-signal/.test(t.textContent ?? ''))).toBe(true);
  });

  it('crops the viewBox to the drawing', async () => {
    const doc = await exampleDrawing('sensor-cs-miller');
    const { doc: xml } = parseXml(annotatedSvg(doc, { date: DATE }));
    const [vx, vy, vw, vh] = xml.documentElement!.getAttribute('viewBox')!.split(' ').map(Number);
    const xs: number[] = [], ys: number[] = [];
    for (const pl of all(xml, 'polyline')) for (const pair of pl.getAttribute('points')!.split(' ')) { const [x, y] = pair.split(',').map(Number); xs.push(x); ys.push(y); }
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(vx);
    expect(Math.max(...xs)).toBeLessThanOrEqual(vx + vw);
    expect(Math.min(...ys)).toBeGreaterThanOrEqual(vy);
    expect(Math.max(...ys)).toBeLessThanOrEqual(vy + vh);
    // Tight: the margin around the line work is small (legend and title block sit below it).
    expect(Math.min(...xs) - vx).toBeLessThan(60);
    expect(Math.min(...ys) - vy).toBeLessThan(60);
  });

  it('draws a symbol from its JSON primitives with the placement transform of symbols/README.md', () => {
    // Resistor turned a quarter clockwise: local (x, y) → world (−y, x) + position (README).
    const doc = drawing([part('resistor', 'R7', 100, 50, { rotation: 90 })]);
    const { doc: xml } = parseXml(schematicSvg(doc));
    const g = all(xml, 'g').find((x) => x.getAttribute('id') === 'part-R7')!;
    const zig = symbolOf('resistor').primitives.find((p) => p.type === 'polyline') as { points: number[] };
    const expected: string[] = [];
    for (let i = 0; i < zig.points.length; i += 2) expected.push(`${100 - zig.points[i + 1]},${50 + zig.points[i]}`);
    expect(all(g, 'polyline').map((p) => p.getAttribute('points'))).toContain(expected.join(' '));
  });

  it('draws the selected loop path and lists switched-off loops in the title block', async () => {
    const doc = await exampleDrawing('readout-cascode-regulated');
    const an = analyseDrawing(doc);
    expect(an.loops.status).toBe('ok');
    expect(an.loops.loops.length).toBeGreaterThan(0);
    const loop = an.loops.loops[0];
    const { doc: xml, problems } = parseXml(annotatedSvg(doc, { date: DATE, selectedLoop: loop.id }));
    expect(problems).toEqual([]);
    const path = all(xml, 'g').find((g) => g.getAttribute('id') === 'loop-path')!;
    expect(path).toBeDefined();
    const pts = all(path, 'polyline')[0].getAttribute('points')!.split(' ');
    expect(pts[0]).toBe(pts[pts.length - 1]); // closes on itself
    const off = annotatedSvg(doc, { date: DATE, off: [loop.key] });
    expect(off).toContain(`loops switched off: ${loop.key}`);
    expect(off).not.toBe(annotatedSvg(doc, { date: DATE }));
  });

  it('exports a drawing with errors without analysis marks, saying why', () => {
    const doc = drawing([part('resistor', 'R1', 0, 0)]);
    const svg = annotatedSvg(doc, { date: DATE });
    const { problems, doc: xml } = parseXml(svg);
    expect(problems).toEqual([]);
    expect(svg).toContain('not analysed');
    expect(all(xml, 'g').filter((g) => g.getAttribute('class') === 'badge')).toEqual([]);
  });
});

describe('export of what the screen shows', () => {
  it('draws the given overlay data unchanged (e.g. nets recoloured by the live view)', async () => {
    const { shownSvg } = await import('../../src/export/exportDrawing');
    const doc = await exampleDrawing('sensor-cs-miller');
    const an = analyseDrawing(doc);
    const ann = annotationsFor(doc, an);
    const recoloured = { ...ann, nets: Object.fromEntries(Object.entries(ann.nets).map(([k, m]) => [k, { ...m, color: '#123456' }])) };
    const { doc: xml, problems } = parseXml(shownSvg(doc, { annotations: recoloured, result: an.result! }, { date: DATE }));
    expect(problems).toEqual([]);
    const nets = all(xml, 'g').filter((g) => g.getAttribute('class') === 'net' && Object.keys(ann.nets).some((n) => g.getAttribute('id') === `net-${n}`));
    expect(nets.length).toBe(Object.keys(ann.nets).length);
    for (const g of nets) expect(g.getAttribute('stroke')).toBe('#123456');
  });
});
