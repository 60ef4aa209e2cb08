// The feedback engine on the built-in example netlists, against hand closed forms.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { analyzeFeedback } from '../../src/engine/feedback/index';
import { feedbackReport } from '../../src/engine/feedback/cli';
import type { Netlist } from '../../src/engine/types';

const read = (f: string) => JSON.parse(readFileSync(`src/examples/netlists/${f}`, 'utf8')) as Netlist;
// The readout examples measure the bare source's output impedance (only a test current at out).
// Here their output drives the readout amplifier: its pMOS device Mload (its own ro) loads out.
const MLOAD = { name: 'Mload', kind: 'pmos', pins: { d: 'out', g: '0', s: '0', b: '0' },
  values: { id: '20u', vov: '0.3', w: '12u', l: '1u' } } as const;
const load = (f: string): Netlist => {
  const nl = read(f);
  return f.startsWith('readout-') ? { ...nl, parts: [...nl.parts, { ...MLOAD, pins: { ...MLOAD.pins }, values: { ...MLOAD.values } }] } : nl;
};

// Demo process card (src/engine/process.ts) and the MOS stamp relations gm = gmid·Id,
// gds = (λL/L)·Id, gmb = η·gm (Razavi, Design of Analog CMOS ICs, ch. 2).
const Id = 20e-6, gm = 12 * Id, gmb = 0.21 * gm;
const go1 = (0.09e-6 / 1e-6) * Id, go2 = (0.09e-6 / 0.5e-6) * Id, goLoad = (0.11e-6 / 1e-6) * Id;
const A = 100;

describe('regulated cascode example, loaded by the readout amplifier (Gray, Hurst, Lewis & Meyer, regulated cascode)', () => {
  const r = analyzeFeedback(load('readout-cascode-regulated.json'));

  it('lists one global loop, the booster A1 → M2, and the local loop of M2', () => {
    expect(r.ok).toBe(true);
    const global = r.loops.filter((l) => l.loop.kind === 'global');
    expect(global.map((l) => l.loop.parts)).toEqual([['A1', 'M2']]);
    expect(r.loops.filter((l) => l.loop.kind === 'local').map((l) => l.loop.parts)).toEqual([['M2']]);
  });

  it('booster loop gain at DC is A times the divider gm2/(gm2 + gmb2 + go1 + go2 + go1·go2/goLoad) (hand nodal analysis)', () => {
    const g = r.loops.find((l) => l.loop.key === 'A1.A0')!;
    const T = (A * gm) / (gm + gmb + go1 + go2 + (go1 * go2) / goLoad);
    expect(g.loop.returnRatioDc.value!.re / T).toBeCloseTo(1, 8);
    expect(T).toBeGreaterThan(0.7 * A); // a divider, not a collapse to 0 as with an unloaded output
  });

  it('holds V(x) (÷ 1 + T: shorting x kills the loop, Blackman 1943) and the current into M2: × (1 + A·gm2/(gm2 + gmb2 + go1 + go2))', () => {
    const g = r.loops.find((l) => l.loop.key === 'A1.A0')!;
    const T = g.loop.returnRatioDc.value!.re;
    expect(g.regulation.holdsVoltage!.node).toBe('x');
    expect(g.regulation.holdsVoltage!.factor * (1 + T)).toBeCloseTo(1, 8);
    expect(g.regulation.holdsVoltage!.text).toMatch(/^holds V\(x\) — impedance ÷ /);
    const cur = g.regulation.holdsCurrent!;
    expect(cur.node).toBe('out');
    expect(cur.into).toBe('M2');
    // Rout(A)/Rout(0) of the regulated cascode: (ro1 + ro2 + ((1 + A)·gm2 + gmb2)·ro1·ro2)/(… A = 0 …)
    const ro1 = 1 / go1, ro2 = 1 / go2;
    const ratio = (ro1 + ro2 + ((1 + A) * gm + gmb) * ro1 * ro2) / (ro1 + ro2 + (gm + gmb) * ro1 * ro2);
    expect(cur.factor / ratio).toBeCloseTo(1, 8);
    expect(cur.text).toMatch(/^holds the current into out — impedance × [\d.]+ looking into M2$/);
  });

  it('the CLI prints both, and the transfer in Ω', () => {
    const rep = feedbackReport(load('readout-cascode-regulated.json'), { loops: true, off: [], compare: false, locus: null, kMax: 10, problems: [] });
    const text = rep.lines.join('\n');
    expect(text).toMatch(/A1\.A0>M2\.gm {2}\[global\]/);
    expect(text).toMatch(/holds V\(x\) — impedance ÷ \d+(\.\d+)?; holds the current into out — impedance × \d+(\.\d+)? looking into M2/);
  });
});

describe('other examples', () => {
  it('plain cascode source: M2\'s local loop raises the impedance looking into its drain by about gm2·ro1 (Gray & Meyer, cascode Rout ≈ gm·ro²)', () => {
    const r = analyzeFeedback(load('readout-cascode-source.json'));
    expect(r.loops.map((l) => l.loop.parts)).toEqual([['M2']]);
    const cur = r.loops[0].regulation.holdsCurrent!;
    expect(cur.into).toBe('M2');
    // with gm2 off only ro1 + ro2 remain: factor = (ro1 + ro2 + (gm2 + gmb2)·ro1·ro2)/(ro1 + ro2 + gmb2·ro1·ro2)
    const ro1 = 1 / go1, ro2 = 1 / go2;
    expect(cur.factor / ((ro1 + ro2 + (gm + gmb) * ro1 * ro2) / (ro1 + ro2 + gmb * ro1 * ro2))).toBeCloseTo(1, 8);
  });

  it('follower: one local loop that holds V(out) (÷ 1 + (gm + gmb)·R at the source, Razavi)', () => {
    const r = analyzeFeedback(load('follower-sampling-load.json'));
    expect(r.loops.map((l) => [l.loop.kind, l.loop.parts])).toEqual([['local', ['M1']]]);
    expect(r.loops[0].regulation.holdsVoltage!.node).toBe('out');
  });

  it('two-stage Miller amplifier in unity feedback: the global loop holds V(out) by 1 + gm1R1·gm2R2 (common practice)', () => {
    const r = analyzeFeedback(load('two-stage-miller-unity.json'));
    const g = r.loops.filter((l) => l.loop.kind === 'global');
    expect(g.length).toBe(1);
    const T = 100e-6 * 2e6 * 1e-3 * 200e3;
    expect(g[0].loop.returnRatioDc.value!.re / T).toBeCloseTo(1, 6);
    expect(g[0].regulation.holdsVoltage!.node).toBe('out');
    expect(g[0].regulation.holdsVoltage!.factor * (1 + T)).toBeCloseTo(1, 6);
  });
});
