import { describe, expect, it } from 'vitest';
import { documentToNetlist, isDrawing } from '../../src/schematic/toNetlist';
import { loadDrawing, saveDrawing } from '../../src/schematic/file';
import { commonSource } from './build';

describe('documentToNetlist', () => {
  it('builds the engine netlist of a common-source stage', () => {
    const r = documentToNetlist(commonSource());
    expect(r.issues.filter((i) => i.severity === 'error')).toEqual([]);
    const n = r.netlist!;
    expect(n.format).toBe('polesketch-netlist');
    expect(n.input).toBe('IN1');
    expect(n.output).toEqual({ kind: 'voltage', node: 'out' });
    expect(n.process).toBe('demo180-invented'); // bias-mode MOSFET → the built-in demo card
    expect(n.parts.map((p) => [p.name, p.kind, p.pins])).toEqual([
      ['IN1', 'vsource', { p: 'n1', n: '0' }],
      ['M1', 'nmos', { d: 'out', g: 'n1', s: '0' }],
      ['R1', 'resistor', { p: '0', n: 'out' }], // the rail is AC ground
    ]);
    // SI prefixes (SI brochure, 9th ed., Table 7): 4.7k = 4700, 100u = 1e-4, 0.5u = 5e-7
    expect(n.parts[2].values.value).toBeCloseTo(4700, 9);
    expect(n.parts[1].values).toMatchObject({ gmid: 12 });
    expect(n.parts[1].values.id as number).toBeCloseTo(1e-4, 15);
    expect(n.parts[1].values.l as number).toBeCloseTo(5e-7, 18);
    expect('vov' in n.parts[1].values).toBe(false);
    expect('gm' in n.parts[1].values).toBe(false); // direct-mode field left out in bias mode
  });

  it('maps the bulk: tied to the rail → b = "0"; direct mode passes small-signal values only', () => {
    const doc = commonSource();
    doc.parts['part:m1'] = { ...doc.parts['part:m1'], bulk: 'rail', mode: 'direct' };
    const n = documentToNetlist(doc).netlist!;
    const m = n.parts.find((p) => p.name === 'M1')!;
    expect(m.pins.b).toBe('0');
    expect(Object.keys(m.values).sort()).toEqual(['gds', 'gm', 'gmb']);
    expect(n.process).toBeUndefined();
  });

  it('refuses to build with a bad value and names the part and field', () => {
    const doc = commonSource();
    doc.parts['part:r1'] = { ...doc.parts['part:r1'], params: { value: '4.7q7' } };
    const r = documentToNetlist(doc);
    expect(r.netlist).toBeUndefined();
    const bad = r.issues.find((i) => i.code === 'bad-value')!;
    expect(bad).toMatchObject({ part: 'part:r1', field: 'value', x: 110, y: 40 });
    expect(bad.message).toMatch(/R1: Resistance/);
  });

  it('survives save → open with the same netlist', () => {
    const doc = commonSource();
    const text = saveDrawing(doc);
    expect(isDrawing(JSON.parse(text))).toBe(true);
    const back = loadDrawing(text);
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    expect(back.doc).toEqual(doc);
    expect(documentToNetlist(back.doc).netlist).toEqual(documentToNetlist(doc).netlist);
  });
});

describe('capacitance overrides', () => {
  it('passes a typed Cgd in bias mode as an override of the derived value', () => {
    const doc = commonSource();
    const m1 = doc.parts['part:m1'];
    doc.parts['part:m1'] = { ...m1, params: { ...m1.params, cgd: '25f' } };
    const m = documentToNetlist(doc).netlist!.parts.find((p) => p.name === 'M1')!;
    expect(m.values.cgd as number).toBeCloseTo(25e-15, 25); // f = 1e-15 (SI brochure, Table 7)
    expect('cgs' in m.values).toBe(false);
  });
});

describe('unchecked input', () => {
  it('turns a broken drawing object into one file issue instead of throwing', () => {
    const r = documentToNetlist({ format: 'polesketch-drawing', version: 1, parts: { 'part:r1': { id: 'part:r1', kind: 'resistor' } }, wires: {} });
    expect(r.netlist).toBeUndefined();
    expect(r.issues).toHaveLength(1);
    expect(r.issues[0]).toMatchObject({ code: 'bad-value', field: 'file', severity: 'error' });
    expect(r.issues[0].message).toMatch(/Part part:r1: field "ref" must be a text/);
    expect(documentToNetlist(null).issues[0]).toMatchObject({ code: 'bad-value', field: 'file' });
  });
});
