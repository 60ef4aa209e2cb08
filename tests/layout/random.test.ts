// Seeded random circuits (a fixed linear congruential generator, Knuth TAOCP vol. 2 §3.2.1
// constants as in the C standard's example rand) through import and tidy: every circuit the
// engine accepts must come out drawn without overlaps, on the grid, with the same netlist.
import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/engine/index';
import type { Netlist, NetlistPart } from '../../src/engine/types';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { netlistToDrawing } from '../../src/layout/importNetlist';
import { tidyDocument, sameConnectivity } from '../../src/layout/tidy';
import { nodeElk } from '../../src/layout/elkNode';
import { badWires, overlappingBodies, wiresThroughBodies } from './invariants';

function generator(seed: number) {
  let s = seed;
  return () => { s = (s * 1103515245 + 12345) % 2147483648; return s / 2147483648; };
}

function randomNetlist(rnd: () => number): Netlist {
  const nodes = ['0', 'a', 'b', 'c', 'd', 'e', 'f', 'g'].slice(0, 4 + Math.floor(rnd() * 5));
  const pick = () => nodes[Math.floor(rnd() * nodes.length)];
  const parts: NetlistPart[] = [{ name: 'Vin', kind: 'vsource', pins: { p: 'a', n: '0' }, values: {} }];
  const count = 5 + Math.floor(rnd() * 10);
  for (let i = 0; i < count; i++) {
    const k = rnd();
    const p = pick();
    let q = pick();
    while (q === p) q = pick();
    if (k < 0.35) parts.push({ name: `R${i}`, kind: 'resistor', pins: { p, n: q }, values: { value: '10k' } });
    else if (k < 0.6) parts.push({ name: `C${i}`, kind: 'capacitor', pins: { p, n: q }, values: { value: '1p' } });
    else if (k < 0.8) parts.push({ name: `G${i}`, kind: 'vccs', pins: { p, n: '0', cp: q, cn: '0' }, values: { gm: '1m' } });
    else parts.push({ name: `M${i}`, kind: rnd() < 0.5 ? 'nmos' : 'pmos', pins: { d: p, g: q, s: rnd() < 0.5 ? '0' : pick(), b: '0' }, values: { gm: '1m', gds: '10u' } });
  }
  const used = new Set(parts.flatMap((p) => Object.values(p.pins)));
  const out = [...used].filter((n) => n !== '0').sort().pop()!;
  return { format: 'polesketch-netlist', version: 1, parts, input: 'Vin', output: { kind: 'voltage', node: out } };
}

describe('random circuits through import and tidy', () => {
  it('draws every circuit the engine accepts, cleanly and with the same netlist', async () => {
    const rnd = generator(20261202);
    const elk = nodeElk();
    let accepted = 0;
    for (let t = 0; t < 24; t++) {
      const net = randomNetlist(rnd);
      if (!analyze(net).ok) continue;
      accepted += 1;
      const r = await netlistToDrawing(net, elk);
      expect(r.messages, `circuit ${t}`).toEqual([]);
      expect(overlappingBodies(r.doc), `circuit ${t}`).toEqual([]);
      expect(badWires(r.doc), `circuit ${t}`).toEqual([]);
      expect(wiresThroughBodies(r.doc), `circuit ${t}`).toEqual([]);
      const t2 = await tidyDocument(r.doc, elk);
      expect(t2.message, `circuit ${t}`).toMatch(/Tidied/);
      expect(sameConnectivity(r.doc, t2.doc)).toBe(true);
      expect(documentToNetlist(t2.doc).netlist).toEqual(documentToNetlist(r.doc).netlist);
    }
    expect(accepted).toBeGreaterThan(10);
  });
});
