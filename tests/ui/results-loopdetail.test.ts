// The selected loop's detail for the plots (src/worker/loopDetail.ts) on a one-node shunt loop with closed
// forms: a transconductor gm that senses node a and pulls current out of it, with R ∥ C to ground.
import { describe, it, expect } from 'vitest';
import type { Netlist } from '../../src/engine/index';
import { computeLoopDetail } from '../../src/worker/loopDetail';

const R = 10e3, C = 1e-12, GM = 1e-3;
const netlist: Netlist = {
  format: 'polesketch-netlist', version: 1, input: 'I1', output: { kind: 'voltage', node: 'a' },
  parts: [
    { name: 'I1', kind: 'isource', pins: { p: 'a', n: '0' }, values: {} },
    { name: 'R1', kind: 'resistor', pins: { p: 'a', n: '0' }, values: { value: R } },
    { name: 'C1', kind: 'capacitor', pins: { p: 'a', n: '0' }, values: { value: C } },
    { name: 'G1', kind: 'vccs', pins: { p: 'a', n: '0', cp: 'a', cn: '0' }, values: { gm: GM } },
  ],
};
const base = { kind: 'loopDetail' as const, id: 7, netlist, key: 'G1.gm', offSources: [], fMin: 1e3, fMax: 1e10, perDecade: 10 };

describe('loop detail', () => {
  it('T(jω) of a shunt transconductor is gm·R/(1 + jωRC)', () => {
    // Bode return ratio of a source sensing its own node: T = gm·Z with the source removed
    // (textbook feedback analysis; Z = R ∥ 1/(sC)).
    const d = computeLoopDetail({ ...base, part: 'gain' });
    expect(d.id).toBe(7);
    expect(d.hz.length).toBeGreaterThan(50);
    d.hz.forEach((f, i) => {
      const w = 2 * Math.PI * f;
      const den = 1 + (w * R * C) ** 2;
      const re = (GM * R) / den, im = (-GM * R * w * R * C) / den;
      const v = d.values[i]!;
      expect(Math.hypot(v.re - re, v.im - im) / Math.hypot(re, im)).toBeLessThan(1e-9);
    });
  });

  it('the root locus runs the single pole −(1/R + k·gm)/C along the real axis', () => {
    const d = computeLoopDetail({ ...base, part: 'locus' });
    const l = d.locus!;
    expect(l.status).toBe('ok');
    expect(l.branches).toHaveLength(1);
    l.k.forEach((k, i) => {
      const p = -(1 / R + k * GM) / C;
      expect(l.branches[0].re[i]! / p).toBeCloseTo(1, 9);
      expect(l.branches[0].im[i]).toBeCloseTo(0, 3);
    });
    expect(l.rhpAtK).toBeNull();
  });

  it('an unknown key or a broken netlist comes back as a message, not a throw', () => {
    const d = computeLoopDetail({ ...base, key: 'G9.gm', part: 'gain' });
    expect(d.message).toMatch(/G9\.gm/);
    expect(d.values).toEqual([]);
    const noKey = computeLoopDetail({ ...base, key: 'G9.gm', part: 'locus' });
    expect(noKey.locus!.status).toBe('unknown-source');
    expect(noKey.message).toMatch(/G9\.gm/);
    const bad = { ...netlist, parts: netlist.parts.map((p) => (p.name === 'R1' ? { ...p, values: { value: '10kF' } } : p)) };
    const broken = computeLoopDetail({ ...base, netlist: bad, part: 'locus' });
    expect(broken.locus).toBeNull();
    expect(broken.message).toMatch(/does not build.*R1/);
  });
});
