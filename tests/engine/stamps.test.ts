import { describe, it, expect } from 'vitest';
import { expandNetlist } from '../../src/engine/mna';
import { VT_300K } from '../../src/engine/stamps/bjt';
import { BUILTIN_PROCESSES, DEFAULT_PROCESS_NAME } from '../../src/engine/process';
import type { Element, Netlist, NetlistPart, ProcessCard } from '../../src/engine/types';

// Round-number process card for hand computation (invented values, not a real process).
const HAND: ProcessCard = {
  name: 'hand-test',
  n: { kPrime: 200e-6, cox: 5e-3, lambdaL: 0.1e-6, cov: 0.3e-9, cj: 1e-9, eta: 0.2 },
  p: { kPrime: 80e-6, cox: 5e-3, lambdaL: 0.2e-6, cov: 0.3e-9, cj: 1e-9, eta: 0.25 },
};
function expand(p: NetlistPart, process: Netlist['process'] = HAND) {
  const x = expandNetlist({ format: 'polesketch-netlist', version: 1, parts: [p], process });
  expect(x.issues.filter((i) => i.severity === 'error')).toEqual([]);
  return x;
}
function byRole(els: Element[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const e of els) {
    out[e.role] = e.type === 'conductance' ? e.g : e.type === 'capacitance' ? e.c : e.type === 'vccs' ? e.gm : NaN;
  }
  return out;
}
const mos = (kind: 'nmos' | 'pmos', values: Record<string, string | number>, pins: Record<string, string> = { d: 'd', g: 'g', s: 's', b: '0' }): NetlistPart => ({ name: 'M1', kind, pins, values });

describe('MOS square-law small-signal values (Razavi ch. 2; Sedra & Smith)', () => {
  it('from id and W/L: gm = √(2·µnCox·(W/L)·Id), gds = λ·Id, gmb = η·gm, capacitances from W, L', () => {
    const v = byRole(expand(mos('nmos', { id: '100u', w: '10u', l: '1u' })).elements);
    // Hand numbers: 2·200e-6·10·100e-6 = 4e-7 → gm = 632.456 µS; λ = 0.1 µm/V / 1 µm = 0.1 /V.
    expect(v.gm).toBeCloseTo(632.456e-6, 9);
    expect(v.gds).toBeCloseTo(10e-6, 12);
    expect(v.gmb).toBeCloseTo(0.2 * 632.456e-6, 9);
    // Cgs = ⅔·10µ·1µ·5e-3 + 10µ·0.3e-9 = 33.333 fF + 3 fF; Cgd = 3 fF; Cdb = Csb = 10 fF.
    expect(v.cgs).toBeCloseTo(36.3333e-15, 18);
    expect(v.cgd).toBeCloseTo(3e-15, 20);
    expect(v.cdb).toBeCloseTo(10e-15, 20);
    expect(v.csb).toBeCloseTo(10e-15, 20);
  });

  it('from id and gm/Id: gm = gmid·Id; from id and Vov: gm = 2·Id/Vov (square law)', () => {
    expect(byRole(expand(mos('nmos', { id: '100u', gmid: 10 })).elements).gm).toBeCloseTo(1e-3, 15);
    expect(byRole(expand(mos('nmos', { id: '100u', gmid: '10/V' })).elements).gm).toBeCloseTo(1e-3, 15);
    expect(byRole(expand(mos('nmos', { id: '250u', vov: '200mV' })).elements).gm).toBeCloseTo(2.5e-3, 15);
    // gm/Id = 10 /V implies Vov = 2/gmid = 0.2 V, hence the same gm as id with vov = 0.2 V.
    const a = byRole(expand(mos('nmos', { id: '100u', gmid: 10 })).elements).gm;
    const b = byRole(expand(mos('nmos', { id: '100u', vov: 0.2 })).elements).gm;
    expect(a).toBeCloseTo(b, 15);
  });

  it('pmos uses the p card (λ and η of p devices)', () => {
    const v = byRole(expand(mos('pmos', { id: '50u', gmid: 12, w: '20u', l: '0.5u' })).elements);
    expect(v.gm).toBeCloseTo(600e-6, 12);
    expect(v.gds).toBeCloseTo((0.2e-6 / 0.5e-6) * 50e-6, 12); // λ = 0.4 /V → 20 µS
    expect(v.gmb).toBeCloseTo(0.25 * 600e-6, 12);
  });

  it('direct values override derived ones; ro gives gds = 1/ro', () => {
    const v = byRole(expand(mos('nmos', { id: '100u', gmid: 10, gm: '3m', ro: '25k', cgs: '50f', w: '10u', l: '1u' })).elements);
    expect(v.gm).toBe(3e-3);
    expect(v.gds).toBeCloseTo(40e-6, 15);
    expect(v.cgs).toBeCloseTo(50e-15, 25);
    expect(v.gmb).toBeCloseTo(0.2 * 3e-3, 15); // derived from the (overridden) gm
  });

  it('a part with only direct values gets nothing else; zero values and a tied bulk drop out', () => {
    const x = expand(mos('nmos', { gm: '1m', gds: '10u', gmb: 0 }, { d: 'd', g: 'g', s: 's' }));
    expect(x.elements.map((e) => e.role)).toEqual(['gm', 'gds']);
    const y = expand(mos('nmos', { id: '100u', gmid: 10, w: '10u', l: '1u' }, { d: 'd', g: 'g', s: 's' }));
    expect(y.elements.map((e) => e.role)).toEqual(['gm', 'gds', 'cgs', 'cgd', 'cdb']); // b tied to s: no gmb, no Csb
  });

  it('element ids and the nMOS orientation: gm from d to s controlled by g − s (types.ts)', () => {
    const els = expand(mos('nmos', { gm: '1m', gmb: '0.2m' })).elements;
    const [gm, gmb] = els;
    expect(gm).toMatchObject({ type: 'vccs', id: 'M1.gm', p: 0, n: 2, cp: 1, cn: 2 }); // nodes d, g, s in order
    expect(gmb).toMatchObject({ type: 'vccs', id: 'M1.gmb', p: 0, n: 2, cp: -1, cn: 2 });
  });

  it('the built-in demo card is complete and marked as invented', () => {
    const card = BUILTIN_PROCESSES[DEFAULT_PROCESS_NAME];
    expect(DEFAULT_PROCESS_NAME).toMatch(/invented/);
    for (const dev of [card.n, card.p]) for (const v of Object.values(dev)) expect(v).toBeGreaterThan(0);
    // Electron mobility exceeds hole mobility (fact of the trade): k'n > k'p at equal Cox.
    expect(card.n.kPrime).toBeGreaterThan(card.p.kPrime);
    const v = byRole(expand(mos('nmos', { id: '100u', w: '10u', l: '1u' }), DEFAULT_PROCESS_NAME).elements);
    expect(v.gm).toBeCloseTo(Math.sqrt(2 * card.n.kPrime * 10 * 100e-6), 12);
  });
});

describe('BJT hybrid-π values (Gray, Hurst, Lewis & Meyer ch. 1)', () => {
  it('VT = kT/q ≈ 25.85 mV at 300 K (CODATA constants)', () => {
    expect(VT_300K * 1e3).toBeCloseTo(25.852, 3);
  });

  it('Ic = 1 mA, β = 100, VA = 50 V, τF = 0.3 ns, Cje = 0.5 pF', () => {
    const q: NetlistPart = { name: 'Q1', kind: 'npn', pins: { c: 'c', b: 'b', e: 'e' }, values: { ic: '1mA', beta: 100, va: '50V', tf: '0.3ns', cje: '0.5p', cmu: '0.2p' } };
    const els = expand(q).elements;
    const v = byRole(els);
    // Hand numbers: gm = 1m/25.852m = 38.682 mS; rπ = 100/gm = 2585 Ω; ro = 50 kΩ; Cπ = gm·τF + Cje = 11.60 + 0.5 pF.
    expect(v.gm).toBeCloseTo(38.682e-3, 6);
    expect(1 / v.gpi).toBeCloseTo(2585.2, 1);
    expect(1 / v.go).toBeCloseTo(50e3, 6);
    expect(v.cpi).toBeCloseTo(12.104e-12, 14);
    expect(v.cmu).toBeCloseTo(0.2e-12, 20);
    expect(els[0]).toMatchObject({ type: 'vccs', id: 'Q1.gm', p: 0, n: 2, cp: 1, cn: 2 });
  });

  it('direct values override; no VA means no ro', () => {
    const q: NetlistPart = { name: 'Q2', kind: 'pnp', pins: { c: 'c', b: 'b', e: 'e' }, values: { ic: '1m', beta: 50, gm: '20m', rpi: '3k' } };
    const v = byRole(expand(q).elements);
    expect(v.gm).toBe(20e-3);
    expect(1 / v.gpi).toBeCloseTo(3000, 9);
    expect(v.go).toBeUndefined();
  });
});

describe('passive and controlled parts', () => {
  it('R, C, L values in Ω, F, H; a 0 F capacitor is omitted', () => {
    expect(expand({ name: 'R1', kind: 'resistor', pins: { p: 'a', n: '0' }, values: { value: '4.7kΩ' } }).elements[0]).toMatchObject({ type: 'conductance', a: 0, b: -1, g: 1 / 4700 });
    expect(expand({ name: 'C1', kind: 'capacitor', pins: { p: 'a', n: '0' }, values: { value: '0' } }).elements).toEqual([]);
    expect(expand({ name: 'L1', kind: 'inductor', pins: { p: 'a', n: 'b' }, values: { value: '10nH' } }).elements[0]).toMatchObject({ type: 'inductance', l: 10e-9, branch: 0 });
  });

  it('vccs and vcvs carry ids <part>.gm and <part>.gain', () => {
    expect(expand({ name: 'G1', kind: 'vccs', pins: { p: 'a', n: '0', cp: 'c', cn: '0' }, values: { gm: '1mA/V' } }).elements[0]).toMatchObject({ id: 'G1.gm', gm: 1e-3 });
    expect(expand({ name: 'E1', kind: 'vcvs', pins: { p: 'a', n: '0', cp: 'c', cn: '0' }, values: { gain: '20dB' } }).elements[0]).toMatchObject({ id: 'E1.gain', gain: expect.closeTo(10, 12) });
  });
});
