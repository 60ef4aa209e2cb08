// Netlist import of bipolar stages: the npn base pin is named 'b' like a MOS bulk, and must be wired.
import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/engine/index';
import type { Netlist } from '../../src/engine/types';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { importNetlistText } from '../../src/layout/importNetlist';
import { nodeElk } from '../../src/layout/elkNode';
import { expectTidy } from './invariants';

const elk = nodeElk();

// Invented common-emitter stage: 200 µA collector current, 10 kΩ collector load, VA = 40 V.
const ce: Netlist = {
  format: 'polesketch-netlist', version: 1, title: 'Invented common-emitter stage',
  input: 'Vin', output: { kind: 'voltage', node: 'out' },
  parts: [
    { name: 'Vin', kind: 'vsource', pins: { p: 'base', n: '0' }, values: {} },
    { name: 'Q1', kind: 'npn', pins: { c: 'out', b: 'base', e: '0' }, values: { ic: '200u', beta: '120', va: '40' } },
    { name: 'RC', kind: 'resistor', pins: { p: 'out', n: '0' }, values: { value: '10k' } },
    { name: 'CL', kind: 'capacitor', pins: { p: 'out', n: '0' }, values: { value: '2p' } },
  ],
} as Netlist;

describe('netlist import with an npn', () => {
  it('wires Q1 c / b / e and analyses like the closed form', async () => {
    const r = await importNetlistText(JSON.stringify(ce), elk);
    expect(r.messages).toEqual([]);
    expect(r.ok).toBe(true);
    expectTidy(r.doc);
    const drawn = documentToNetlist(r.doc);
    expect(drawn.issues.filter((i) => i.severity === 'error')).toEqual([]);
    const q1 = drawn.netlist!.parts.find((p) => p.name === 'Q1')!;
    expect(q1.pins).toEqual({ c: 'out', b: 'base', e: '0' });
    const res = analyze(drawn.netlist!);
    expect(res.ok).toBe(true);
    // Gray & Meyer ch. 1 small-signal model: gm = Ic/VT (VT ≈ 25.85 mV at 300 K), ro = VA/Ic;
    // common-emitter gain −gm·(RC‖ro), output pole 1/(2π·(RC‖ro)·CL) (Cμ adds a little: 5 %).
    const gm = 200e-6 / 0.025852, ro = 40 / 200e-6, rout = (10e3 * ro) / (10e3 + ro);
    expect(res.dcGain!).toBeCloseTo(-gm * rout, 0);
    const slowest = Math.min(...res.poles.map((p) => Math.abs(p.hz)));
    expect(Math.abs(slowest - 1 / (2 * Math.PI * rout * 2e-12)) / slowest).toBeLessThan(0.05);
  });
});
