// Caches and the spatial grid behind the live overlay: the grid's overlap sums equal the all-pairs
// sums, the grid placement equals the all-pairs greedy placement, a value edit reuses the badge
// placement (and the nets) and still shows the new figures, and the netlist cache never hands out
// a result of a changed document.
import { readFileSync } from 'node:fs';
import { produce } from 'immer';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/engine/index';
import { annotate } from '../../src/export/annotate';
import { placementCacheStats } from '../../src/export/annotateCache';
import { badgeSize } from '../../src/export/annotations';
import { boxArea, BoxGrid, layoutBadges, symbolObstacles, type BadgeText, type Box } from '../../src/export/badgeLayout';
import { loadDrawing } from '../../src/schematic/file';
import type { DrawingDocument, PartId } from '../../src/schematic/document';
import { cachedConnectivity, documentToNetlist } from '../../src/schematic/toNetlist';
import { csStage } from './fixtures';

function thirty(): DrawingDocument {
  const r = loadDrawing(JSON.parse(readFileSync(new URL('../browser/fixtures/thirty-parts.drawing.json', import.meta.url), 'utf8')));
  if (!r.ok) throw new Error(r.reason);
  return r.doc;
}

/** Park–Miller minimal standard generator (Park & Miller 1988), for repeatable random boxes. */
function lcg(seed: number) {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

/** The greedy placement with plain all-pairs sums: the definition the grid version must match
 *  (common practice: check an accelerated search against the brute-force one). */
function allPairsLayout(doc: DrawingDocument, badges: BadgeText[], first: string[]): { net: string; box: Box }[] {
  const { bodies, texts } = symbolObstacles(doc);
  const wires: Box[] = [];
  for (const w of Object.values(doc.wires)) for (let i = 1; i < w.points.length; i++) {
    const a = w.points[i - 1], b = w.points[i];
    wires.push({ x: Math.min(a.x, b.x) - 1.5, y: Math.min(a.y, b.y) - 1.5, width: Math.abs(a.x - b.x) + 3, height: Math.abs(a.y - b.y) + 3 });
  }
  const rank = (b: BadgeText) => (first.includes(b.net) ? first.indexOf(b.net) : first.length);
  const order = [...badges].sort((a, b) => rank(a) - rank(b) || a.anchor.y - b.anchor.y || a.anchor.x - b.anchor.x || (a.net < b.net ? -1 : 1));
  const placed: { net: string; box: Box }[] = [];
  for (const b of order) {
    const { width: w, height: h } = badgeSize(b.lines);
    let best: { box: Box; cost: number; hard: number } | null = null;
    let i = 0;
    outer: for (const d of [6, 12, 20, 32, 48, 70]) {
      const a = b.anchor;
      for (const s of [
        { x: a.x + d, y: a.y - d - h }, { x: a.x - d - w, y: a.y - d - h }, { x: a.x + d, y: a.y + d }, { x: a.x - d - w, y: a.y + d },
        { x: a.x - w / 2, y: a.y - d - h }, { x: a.x - w / 2, y: a.y + d }, { x: a.x + d, y: a.y - h / 2 }, { x: a.x - d - w, y: a.y - h / 2 },
      ]) {
        const c = { ...s, width: w, height: h };
        const hard = bodies.reduce((t, o) => t + boxArea(c, o), 0) + placed.reduce((t, o) => t + boxArea(c, o.box), 0);
        const soft = texts.reduce((t, o) => t + boxArea(c, o), 0) + 0.3 * wires.reduce((t, o) => t + boxArea(c, o), 0);
        const cost = soft + i * 4;
        if (!best || hard < best.hard || (hard === best.hard && cost < best.cost)) best = { box: c, cost, hard };
        i += 1;
        if (best.hard === 0 && soft === 0) break outer;
      }
    }
    placed.push({ net: b.net, box: best!.box });
  }
  return badges.map((b) => placed.find((p) => p.net === b.net)!);
}

describe('box grid', () => {
  it('gives the same overlap sums as summing over every box (rectangle intersection area, common practice)', () => {
    const rnd = lcg(7);
    const boxes: Box[] = Array.from({ length: 400 }, () => ({ x: rnd() * 2000 - 500, y: rnd() * 1200 - 300, width: rnd() * 300, height: rnd() * 40 }));
    boxes.push({ x: -1e6, y: 0, width: 2e6, height: 5 }); // spans far more buckets than a normal box
    const grid = new BoxGrid(boxes);
    let checked = 0;
    for (let k = 0; k < 500; k++) {
      const q = { x: rnd() * 2200 - 600, y: rnd() * 1400 - 400, width: 10 + rnd() * 120, height: 10 + rnd() * 60 };
      const brute = boxes.reduce((s, b) => s + boxArea(q, b), 0);
      expect(grid.overlapSum(q)).toBe(brute);
      if (brute > 0) checked += 1;
    }
    expect(checked).toBeGreaterThan(100); // most queries do hit something
  });

  it('places the badges of the 30-part drawing exactly where the all-pairs search puts them', () => {
    const doc = thirty();
    const ann = annotate(doc, analyze(documentToNetlist(doc).netlist!, { frequencyHz: 0 }), { column: 'dc' });
    const first = ann.slowest ? [ann.slowest.net] : [];
    const grid = layoutBadges(doc, ann.badges, first).map((b) => ({ net: b.net, box: b.box }));
    expect(grid.length).toBeGreaterThan(8);
    expect(grid).toEqual(allPairsLayout(doc, ann.badges, first));
  });
});

describe('annotate placement memo', () => {
  it('a value edit reuses the boxes, shows the new figures, and matches a fresh placement', () => {
    const base = produce(csStage('4.7k'), () => {}); // frozen, as the editor's revisions are
    const edited = produce(base, (d) => { d.parts['part:r1' as PartId].params.value = '4.6k'; });
    const r0 = analyze(documentToNetlist(base).netlist!, { frequencyHz: 0 });
    const r1 = analyze(documentToNetlist(edited).netlist!, { frequencyHz: 0 });
    const a0 = annotate(base, r0, { column: 'dc' });
    const before = placementCacheStats();
    const a1 = annotate(edited, r1, { column: 'dc' });
    const after = placementCacheStats();
    expect(after.hits).toBe(before.hits + 1);
    expect(a1.badges.map((b) => b.box)).toEqual(a0.badges.map((b) => b.box));
    // the figures are new: R1 ‖ ro at the drain changed (4.7k → 4.6k with ro = 50 kΩ; Ohm's law)
    const out0 = a0.badges.find((b) => b.net === 'out')!, out1 = a1.badges.find((b) => b.net === 'out')!;
    expect(out0.lines[0]).toContain('4.30 kΩ'); // 4.7k ‖ 50k = 4.296 kΩ
    expect(out1.lines[0]).toContain('4.21 kΩ'); // 4.6k ‖ 50k = 4.212 kΩ
    const fresh = layoutBadges(edited, a1.badges.map(({ net, lines, anchor }) => ({ net, lines, anchor })), a1.slowest ? [a1.slowest.net] : [],
      a1.slowest ? [{ x: a1.slowest.anchor.x - 10, y: a1.slowest.anchor.y - 10, width: Math.ceil((22 + a1.slowest.label.length * 7 * 0.58) / 8) * 8, height: 32 }] : []);
    expect(a1.badges.map((b) => b.box)).toEqual(fresh.map((b) => b.box));
  });

  it('a moved part misses the memo and places again', () => {
    const base = produce(csStage('4.7k'), () => {});
    annotate(base, analyze(documentToNetlist(base).netlist!, { frequencyHz: 0 }), { column: 'dc' });
    // the whole drawing shifted by one grid step: same circuit, new places
    const moved = produce(base, (d) => {
      for (const p of Object.values(d.parts)) p.x += 10;
      for (const w of Object.values(d.wires)) for (const q of w.points) q.x += 10;
    });
    const before = placementCacheStats();
    annotate(moved, analyze(documentToNetlist(moved).netlist!, { frequencyHz: 0 }), { column: 'dc' });
    expect(placementCacheStats().misses).toBe(before.misses + 1);
  });
});

describe('netlist caches', () => {
  it('a frozen revision converts once; an unfrozen document is converted every time', () => {
    const doc = produce(csStage('4.7k'), () => {});
    expect(documentToNetlist(doc)).toBe(documentToNetlist(doc));
    const loose = csStage('4.7k');
    const first = documentToNetlist(loose);
    loose.parts['part:r1' as PartId].params.value = '2.2k';
    const second = documentToNetlist(loose);
    expect(second).not.toBe(first);
    expect(second.netlist!.parts.find((p) => p.name === 'R1')!.values).not.toEqual(first.netlist!.parts.find((p) => p.name === 'R1')!.values);
  });

  it('a value edit keeps the nets; a moved wire end makes new ones', () => {
    const doc = produce(csStage('4.7k'), () => {});
    const edited = produce(doc, (d) => { d.parts['part:r1' as PartId].params.value = '1k'; });
    expect(cachedConnectivity(edited)).toBe(cachedConnectivity(doc));
    const rewired = produce(doc, (d) => { const w = Object.values(d.wires)[0]; w.points[w.points.length - 1].x += 10; });
    expect(cachedConnectivity(rewired)).not.toBe(cachedConnectivity(doc));
    // and the converted netlist follows the edit (a bad value is reported, naming the part)
    const bad = produce(doc, (d) => { d.parts['part:r1' as PartId].params.value = 'x'; });
    const issue = documentToNetlist(bad).issues.find((i) => i.code === 'bad-value');
    expect(issue?.message).toMatch(/R1/);
  });
});
