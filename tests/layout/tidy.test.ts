import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Netlist } from '../../src/engine/types';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { createEditor } from '../../src/editor/editor';
import { tidyDocument, tidyEditor, sameConnectivity, connectivitySignature } from '../../src/layout/tidy';
import { netlistToDrawing } from '../../src/layout/importNetlist';
import { nodeElk } from '../../src/layout/elkNode';
import { drawing, part, pt } from '../schematic/build';
import { badWires, overlappingBodies, wiresThroughBodies } from './invariants';

const elk = nodeElk();

// A common-source stage drawn by hand (supply, load resistor, nMOS, load capacitor, markers).
function csStage() {
  return drawing(
    [
      part('input', 'IN1', 0, 100),
      part('nmos', 'M1', 100, 100),
      part('resistor', 'R1', 110, 10),
      part('supply', 'VR1', 110, -20),
      part('ground', 'GND1', 110, 130),
      part('output', 'OUT1', 200, 60),
      part('capacitor', 'C1', 160, 100),
      part('ground', 'GND2', 160, 130),
    ],
    [
      ['w1', pt(20, 100), pt(80, 100)],
      ['w2', pt(110, 40), pt(110, 70)],
      ['w3', pt(110, 60), pt(180, 60)],
      ['w4', pt(160, 60), pt(160, 70)],
    ],
  );
}

function expectTidy(before: ReturnType<typeof csStage>, after: ReturnType<typeof csStage>) {
  expect(overlappingBodies(after)).toEqual([]);
  expect(badWires(after)).toEqual([]);
  expect(wiresThroughBodies(after)).toEqual([]);
  expect(connectivitySignature(after)).toEqual(connectivitySignature(before));
  expect(documentToNetlist(after).netlist).toEqual(documentToNetlist(before).netlist);
}

describe('tidy layout', () => {
  it('keeps the netlist of a hand-drawn stage and lays it out cleanly', async () => {
    const doc = csStage();
    expect(documentToNetlist(doc).issues.filter((i) => i.severity === 'error')).toEqual([]);
    const r = await tidyDocument(doc, elk);
    expect(r.message).toMatch(/Tidied/);
    expect(r.status).toBe('ok');
    expectTidy(doc, r.doc);
    // Signal flows left to right: input marker left of the transistor, output marker right of it.
    const p = r.doc.parts;
    expect(p['part:in1'].x).toBeLessThan(p['part:m1'].x);
    expect(p['part:out1'].x).toBeGreaterThan(p['part:m1'].x);
    // The supply symbol sits above the pin it feeds, ground symbols below theirs.
    const supply = Object.values(p).filter((q) => q.kind === 'supply');
    const grounds = Object.values(p).filter((q) => q.kind === 'ground');
    expect(supply.length).toBe(1);
    expect(supply[0].params.net).toBe('vdd');
    expect(supply[0].y).toBeLessThanOrEqual(p['part:r1'].y - 30);
    expect(grounds.length).toBe(2);
    for (const g of grounds) expect(g.rotation).toBe(0);
  });

  it('tidies imported netlists again without changing a connection', async () => {
    for (const f of ['two-stage-miller-unity.json', 'readout-cascode-regulated.json']) {
      const net = JSON.parse(readFileSync(new URL(`../../src/examples/netlists/${f}`, import.meta.url), 'utf8')) as Netlist;
      const imp = await netlistToDrawing(net, elk);
      const r = await tidyDocument(imp.doc, elk);
      expect(r.status).toBe('ok');
      expectTidy(imp.doc, r.doc);
    }
  });

  it('leaves pinned parts where they are', async () => {
    const doc = csStage();
    const r = await tidyDocument(doc, elk, { pinned: ['part:m1', 'part:c1'] });
    expect(r.message).toMatch(/Tidied/);
    expect({ x: r.doc.parts['part:m1'].x, y: r.doc.parts['part:m1'].y }).toEqual({ x: 100, y: 100 });
    expect({ x: r.doc.parts['part:c1'].x, y: r.doc.parts['part:c1'].y }).toEqual({ x: 160, y: 100 });
    expectTidy(doc, r.doc);
    // A `pinned: true` flag on the record counts as well.
    const flagged = structuredClone(doc);
    (flagged.parts['part:r1'] as unknown as { pinned: boolean }).pinned = true;
    const r2 = await tidyDocument(flagged, elk);
    expect(r2.status).toBe('ok');
    expect(r2.doc.parts['part:r1'].x).toBe(110);
    expect(r2.doc.parts['part:r1'].y).toBe(10);
    expect(sameConnectivity(flagged, r2.doc)).toBe(true);
  });

  it('tidies only the selection when parts are selected', async () => {
    const doc = csStage();
    const ed = createEditor(doc);
    ed.select(['part:c1', 'part:out1', 'part:gnd2']);
    const r = await tidyEditor(ed, elk);
    expect(r.status).toBe('ok');
    // GND2 was in the selection and is replaced by a fresh rail symbol: the selection drops it.
    expect([...ed.selection].every((id) => id in ed.document.parts || id in ed.document.wires)).toBe(true);
    for (const id of ['part:in1', 'part:m1', 'part:r1'] as const) {
      expect({ x: ed.document.parts[id].x, y: ed.document.parts[id].y }).toEqual({ x: doc.parts[id].x, y: doc.parts[id].y });
    }
    expectTidy(doc, ed.document);
  });

  it('is one undo step in the editor', async () => {
    const doc = csStage();
    const ed = createEditor(doc);
    const r = await tidyEditor(ed, elk);
    expect(r.status).toBe('ok');
    expect(ed.history.size.undo).toBe(1);
    expect(ed.history.undoLabel).toBe('Tidy layout');
    expect(ed.document).not.toEqual(doc);
    ed.history.undo();
    expect(ed.document).toEqual(doc);
  });

  it('says so when there is nothing to move', async () => {
    const doc = csStage();
    const r = await tidyDocument(doc, elk, { pinned: Object.keys(doc.parts) as never });
    expect(r.status).toBe('nothing-to-do');
    expect(r.doc).toBe(doc);
  });

  it('reports a failing layout engine as a status, not an exception', async () => {
    const r = await tidyDocument(csStage(), { layout: () => Promise.reject(new Error('worker gone')) });
    expect(r.status).toBe('failed');
    expect(r.message).toMatch(/worker gone/);
  });
});

describe('tidy is deterministic', () => {
  it('gives the same drawing for the same input, and a tidy of a tidy keeps every connection', async () => {
    const a = await tidyDocument(csStage(), elk);
    const b = await tidyDocument(csStage(), elk);
    expect(b.doc).toEqual(a.doc);
    const again = await tidyDocument(a.doc, elk);
    expect(again.status).toBe('ok');
    expect(sameConnectivity(a.doc, again.doc)).toBe(true);
  });
});
