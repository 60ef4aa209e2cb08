import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/engine/index';
import type { Netlist } from '../../src/engine/types';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { importNetlistText, netlistToDrawing } from '../../src/layout/importNetlist';
import { nodeElk } from '../../src/layout/elkNode';
import { expectTidy } from './invariants';

const dir = new URL('../../src/examples/netlists/', import.meta.url);
const examples = readdirSync(dir).filter((f) => f.endsWith('.json'));
const elk = nodeElk();

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b), 1e-300);

describe('netlist import', () => {
  it.each(examples)('%s: draws tidily and analyses identically to the netlist', async (file) => {
    const net = JSON.parse(readFileSync(new URL(file, dir), 'utf8')) as Netlist;
    const r = await netlistToDrawing(net, elk);
    expect(r.messages).toEqual([]);
    expect(r.ok).toBe(true);
    expectTidy(r.doc);

    const drawn = documentToNetlist(r.doc);
    expect(drawn.issues.filter((i) => i.severity === 'error')).toEqual([]);
    // Same parts, kinds and pin-to-node map as the file (the drawing lists parts by name).
    const pinsOf = (n: Netlist) => Object.fromEntries(n.parts.map((p) => [p.name, { kind: p.kind, pins: p.pins }]));
    expect(pinsOf(drawn.netlist!)).toEqual(pinsOf(net));
    // The reference is the engine run on the file itself, parts taken in the drawing's (name)
    // order, so both runs assemble the same equations: results must agree to rounding.
    const sorted = { ...net, parts: [...net.parts].sort((x, y) => (x.name < y.name ? -1 : 1)) };
    const a = analyze(sorted), b = analyze(drawn.netlist!);
    expect(b.ok).toBe(a.ok);
    expect(b.poles.length).toBe(a.poles.length);
    a.poles.forEach((p, i) => { expect(rel(b.poles[i].re, p.re)).toBeLessThan(1e-9); expect(rel(b.poles[i].im, p.im)).toBeLessThan(1e-9); });
    expect(b.zeros.length).toBe(a.zeros.length);
    a.zeros.forEach((z, i) => expect(rel(b.zeros[i].hz, z.hz)).toBeLessThan(1e-9));
    if (a.dcGain !== null) expect(rel(b.dcGain!, a.dcGain)).toBeLessThan(1e-12);
    expect(b.nodes.map((n) => n.name).sort()).toEqual(a.nodes.map((n) => n.name).sort());
    for (const n of a.nodes) {
      const m = b.nodes.find((x) => x.name === n.name)!;
      if (n.dcOhms === null) expect(m.dcOhms).toBeNull();
      else expect(rel(m.dcOhms!, n.dcOhms)).toBeLessThan(1e-9);
    }
    // Against the file in its own part order the equations are the same up to row order; poles of
    // stiff stages then move in the 7th digit (eigenvalue conditioning, Golub & Van Loan §7.2).
    const f = analyze(net);
    f.poles.forEach((p, i) => expect(rel(b.poles[i].hz, p.hz)).toBeLessThan(1e-5));
  });

  it('names what it cannot draw instead of failing deep inside', async () => {
    const bad = await netlistToDrawing({ format: 'polesketch-netlist', version: 1, parts: [{ name: 'R1', kind: 'resistor', pins: { p: 'a' }, values: { value: '1k' } }] }, elk);
    expect(bad.ok).toBe(false);
    expect(bad.messages.join(' ')).toMatch(/R1/);
    const text = await importNetlistText('{"format": "polesketch-netlist", ', elk);
    expect(text.ok).toBe(false);
    expect(text.messages[0]).toMatch(/not valid JSON/);
    expect((await importNetlistText('{"format": "polesketch-drawing"}', elk)).messages[0]).toMatch(/not an engine netlist/);
    const pasted = await importNetlistText(readFileSync(new URL(examples[0], dir), 'utf8'), elk);
    expect(pasted.ok).toBe(true);
    const junk = await netlistToDrawing(42, elk);
    expect(junk.ok).toBe(false);
    expect(junk.messages.length).toBeGreaterThan(0);
  });
});
