// Pure helpers of the canvas overlay: badge layout clear of symbols, pole ↔ net links, frequency
// text, complex read-out text.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/engine/index';
import { annotate } from '../../src/export/annotate';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { loadDrawing } from '../../src/schematic/file';
import { placedBounds } from '../../src/schematic/symbols';
import type { DrawingDocument } from '../../src/schematic/document';
import type { Badge } from '../../src/export/annotations';
import { boxArea, layoutBadges } from '../../src/export/badgeLayout';
import { formatCx, netsOfPole, parseFrequency, polesOfNet } from '../../src/canvas/overlayModel';
import { commonSource } from '../schematic/build';

function thirty(): DrawingDocument {
  const r = loadDrawing(JSON.parse(readFileSync(new URL('../browser/fixtures/thirty-parts.drawing.json', import.meta.url), 'utf8')));
  if (!r.ok) throw new Error(r.reason);
  return r.doc;
}

describe('badge layout', () => {
  const doc = thirty();
  const result = analyze(documentToNetlist(doc).netlist!, { frequencyHz: 0 });
  const ann = annotate(doc, result, { column: 'dc' });
  const placed = layoutBadges(doc, ann.badges, ann.slowest ? [ann.slowest.net] : []);

  it('gives every net of the 30-part drawing a box on no symbol body and on no other badge', () => {
    expect(result.ok).toBe(true);
    expect(placed.length).toBeGreaterThan(8);
    const bodies = Object.values(doc.parts).map((p) => ({ ref: p.ref, ...placedBounds(p) }));
    const onBody = placed.flatMap((b) => bodies.filter((s) => boxArea(b.box, s) > 0).map((s) => `${b.net} on ${s.ref}`));
    expect(onBody).toEqual([]);
    const onBadge = placed.flatMap((a, i) => placed.slice(i + 1).filter((b) => boxArea(a.box, b.box) > 0).map((b) => `${a.net}/${b.net}`));
    expect(onBadge).toEqual([]);
    expect(placed.every((b) => !b.crowded)).toBe(true);
  });

  it('is deterministic and keeps the input order', () => {
    const again = layoutBadges(doc, ann.badges, ann.slowest ? [ann.slowest.net] : []);
    expect(again).toEqual(placed);
    expect(placed.map((b) => b.net)).toEqual(ann.badges.map((b) => b.net));
  });

  it('moves a badge off a symbol sitting at its first spot and marks a leader when far', () => {
    const cs = commonSource();
    // anchor right next to M1's body: the up-right spot would land on the transistor
    const m1 = placedBounds(cs.parts['part:m1' as never]);
    const badge = { net: 'x', lines: ['x: |Z| 1.00 kΩ', 'C 1.00 pF', 'τ 1.00 ns'], anchor: { x: m1.x - 4, y: m1.y + m1.height } } as Badge;
    const [p] = layoutBadges(cs, [badge]);
    expect(boxArea(p.box, m1)).toBe(0);
    expect(p.crowded).toBe(false);
  });
});

describe('overlay helpers', () => {
  it('parses frequencies with SI prefixes and DC (BIPM SI brochure prefixes)', () => {
    expect(parseFrequency('DC')).toBe(0);
    expect(parseFrequency('0')).toBe(0);
    expect(parseFrequency('2.5 MHz')).toBeCloseTo(2.5e6, 3);
    expect(parseFrequency('10k')).toBeCloseTo(1e4, 6);
    expect(parseFrequency('fast')).toBeNull();
    expect(parseFrequency('-3k')).toBeNull();
  });

  it('writes complex figures as magnitude and phase (common practice)', () => {
    expect(formatCx({ re: 0, im: 1000 }, 'Ω')).toBe('1.00 kΩ ∠90°');
    expect(formatCx({ re: -47, im: 0 })).toBe('−47.0');
    expect(formatCx(null)).toBe('—');
  });

  it('links a pole to the nets that carry it and back', () => {
    const r = analyze(documentToNetlist(thirty()).netlist!, { frequencyHz: 0 });
    const i = r.participation[0].pole;
    const nets = netsOfPole(r, i);
    expect(nets.length).toBeGreaterThan(0);
    expect(nets[0]).toBe(r.participation[0].nodes[0].node); // the largest share comes first
    for (const n of nets) expect(polesOfNet(r, n)).toContain(i);
    expect(netsOfPole(r, null)).toEqual([]);
  });
});

describe('loop path', () => {
  it('runs from net to net through the member part that joins them', async () => {
    const { loopPathPoints } = await import('../../src/export/loopPath');
    const doc = thirty();
    const d = documentToNetlist(doc);
    const a1 = Object.values(doc.parts).find((p) => p.ref === 'A1')!;
    const m2 = Object.values(doc.parts).find((p) => p.ref === 'M2')!;
    const centre = (p: typeof a1) => { const r = placedBounds(p); return { x: r.x + r.width / 2, y: r.y + r.height / 2 }; };
    const pa = { x: 0, y: 0 }, pb = { x: 100, y: 0 };
    // the regulation loop of the invented netlist: A1 senses d1 and drives gc; M2's gate gc moves d1
    const pts = loopPathPoints(doc, d.netOfPin, ['d1', 'gc'], [pa, pb], ['A1', 'M2']);
    expect(pts).toEqual([pa, centre(a1), pb, centre(m2), pa]);
  });
});
