import { describe, expect, it } from 'vitest';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { commonSource, drawing, part, pt } from './build';

const codes = (doc: ReturnType<typeof drawing>) => documentToNetlist(doc).issues;

describe('drawing checks (with the place they occur)', () => {
  it('marks an unconnected pin at the pin', () => {
    const doc = commonSource();
    delete doc.wires['wire:g']; // the gate is left open
    const issues = codes(doc);
    const open = issues.filter((i) => i.code === 'unconnected-pin');
    expect(open.map((i) => [i.part, i.pin, i.x, i.y, i.severity])).toEqual([
      ['part:in1', 'p', 60, 100, 'error'],
      ['part:m1', 'g', 80, 100, 'error'],
    ]);
    expect(open[1].message).toBe('Pin g of M1 is not connected.');
    expect(documentToNetlist(doc).netlist).toBeUndefined();
  });

  it('marks a part of the circuit with no path to ground as a floating net', () => {
    // R1 and C1 in series between two nets, neither reaching ground; R2 to ground elsewhere.
    const doc = drawing([
      part('resistor', 'R1', 0, 0), part('capacitor', 'C1', 0, 60),
      part('resistor', 'R2', 100, 0), part('ground', 'GND1', 100, 30), part('supply', 'VR1', 100, -30),
    ], [['a', pt(0, -30), pt(-30, -30), pt(-30, 90), pt(0, 90)]]);
    const f = codes(doc).filter((i) => i.code === 'floating-net');
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ severity: 'error', net: 'n1', x: 0, y: 30 }); // C1.p, first pin of the island
    expect(f[0].message).toBe('Net n1, n2 has no path to ground through any part.');
  });

  it('marks wires that join no pin', () => {
    const doc = drawing([part('resistor', 'R1', 0, 0), part('ground', 'GND1', 0, 30)], [['a', pt(100, 0), pt(150, 0)]]);
    const f = codes(doc).filter((i) => i.code === 'floating-net');
    expect(f).toMatchObject([{ severity: 'warning', wire: 'wire:a', x: 100, y: 0 }]);
  });

  it('marks two amplifier outputs tied together, and an output tied to ground', () => {
    // A1 out at (30, 0); A2 mirrored at (60, 0): out at (30, 0) too.
    const doc = drawing([
      part('amplifier', 'A1', 0, 0), part('amplifier', 'A2', 60, 0, { mirror: true }),
      part('ground', 'GND1', -30, -10), part('ground', 'GND2', -30, 10),
      part('ground', 'GND3', 90, -10), part('ground', 'GND4', 90, 10),
    ]);
    const s = codes(doc).filter((i) => i.code === 'outputs-shorted');
    expect(s).toHaveLength(1);
    expect(s[0]).toMatchObject({ part: 'part:a2', pin: 'out', x: 30, y: 0 });
    expect(s[0].message).toBe('The outputs of A2 and A1 are shorted together (net n1).');
    const tied = drawing([part('amplifier', 'A1', 0, 0), part('ground', 'GND1', -30, -10), part('ground', 'GND2', -30, 10), part('ground', 'GND3', 30, 0)]);
    expect(codes(tied).filter((i) => i.code === 'outputs-shorted').map((i) => i.message)).toEqual(['The output of A1 is shorted to ground.']);
  });

  it('reports a missing ground at the first part', () => {
    const doc = drawing([part('resistor', 'R1', 40, 50), part('capacitor', 'C1', 40, 110)]);
    const g = codes(doc).filter((i) => i.code === 'no-ground');
    expect(g).toMatchObject([{ severity: 'error', x: 40, y: 110 }]); // C1 sorts before R1
  });

  it('reports duplicate references and a second input', () => {
    const doc = commonSource();
    doc.parts['part:r1'] = { ...doc.parts['part:r1'], ref: 'M1' };
    doc.parts['part:v9'] = { ...part('vsource', 'V9', 300, 300), isInput: true };
    const issues = codes(doc);
    expect(issues.some((i) => i.code === 'duplicate-ref' && i.message.includes('M1'))).toBe(true);
    expect(issues.filter((i) => i.code === 'several-inputs').map((i) => i.part)).toEqual(['part:v9']);
  });

  it('a clean stage has no issues at all', () => {
    expect(codes(commonSource())).toEqual([]);
  });
});
