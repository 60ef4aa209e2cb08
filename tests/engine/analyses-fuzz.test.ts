// Seeded random netlists through analyze(): whatever the circuit, no exception escapes, no NaN or
// Infinity appears in the result, and every error names where it is (common practice: fuzzing).
import { describe, it, expect } from 'vitest';
import { analyze, buildMna, type Netlist, type NetlistPart } from '../../src/engine/index';
import { transferDirect } from '../../src/engine/analyses/transfer';
import { rng } from '../seeded'; // mulberry32, common practice


function hasNonFinite(v: unknown): boolean {
  if (typeof v === 'number') return !Number.isFinite(v);
  if (Array.isArray(v)) return v.some(hasNonFinite);
  if (v && typeof v === 'object') return Object.values(v).some(hasNonFinite);
  return false;
}

function randomNetlist(seed: number): Netlist {
  const r = rng(seed);
  const nodes = ['0', 'a', 'b', 'c', 'd', 'e'].slice(0, 3 + Math.floor(r() * 4));
  const pick = () => nodes[Math.floor(r() * nodes.length)];
  const mag = (lo: number, hi: number) => Math.pow(10, lo + (hi - lo) * r());
  const parts: NetlistPart[] = [{ name: 'Vin', kind: 'vsource', pins: { p: nodes[1], n: '0' }, values: {} }];
  const count = 2 + Math.floor(r() * 8);
  for (let i = 0; i < count; i++) {
    const k = Math.floor(r() * 7);
    const name = `P${i}`;
    if (k === 0) parts.push({ name, kind: 'resistor', pins: { p: pick(), n: pick() }, values: { value: mag(-1, 9) } });
    else if (k === 1) parts.push({ name, kind: 'capacitor', pins: { p: pick(), n: pick() }, values: { value: mag(-16, -6) } });
    else if (k === 2) parts.push({ name, kind: 'inductor', pins: { p: pick(), n: pick() }, values: { value: mag(-9, -3) } });
    else if (k === 3) parts.push({ name, kind: 'vccs', pins: { p: pick(), n: pick(), cp: pick(), cn: pick() }, values: { gm: (r() - 0.5) * mag(-6, -1) } });
    else if (k === 4) parts.push({ name, kind: 'vcvs', pins: { p: pick(), n: pick(), cp: pick(), cn: pick() }, values: { gain: (r() - 0.5) * mag(-1, 4) } });
    else if (k === 5) parts.push({ name, kind: 'nmos', pins: { d: pick(), g: pick(), s: pick() }, values: { gm: mag(-5, -2), gds: mag(-8, -4), cgs: mag(-15, -12), cgd: mag(-16, -13) } });
    else parts.push({ name, kind: 'amplifier', pins: { out: pick(), inp: pick(), inn: pick() }, values: { A0: mag(0, 5), p1: mag(3, 8) } });
  }
  return { format: 'polesketch-netlist', version: 1, parts, input: 'Vin', output: { kind: 'voltage', node: nodes[nodes.length - 1] } };
}

const CASES = 300;

describe('analyze() on random circuits', () => {
  it('never throws, never returns NaN/Infinity, and errors name a part, node or field', () => {
    let computed = 0;
    for (let seed = 1; seed <= CASES; seed++) {
      const net = randomNetlist(seed);
      let r;
      try {
        r = analyze(net, { impedanceSweep: seed % 5 === 0 });
      } catch (e) {
        throw new Error(`seed ${seed}: analyze threw ${(e as Error).message}`);
      }
      expect(hasNonFinite(r), `seed ${seed}`).toBe(false);
      // The final no-NaN pass (report.ts sanitize) must have had nothing to clean up.
      expect(r.issues.filter((x) => /could not be computed/.test(x.message)), `seed ${seed}`).toEqual([]);
      for (const i of r.issues.filter((x) => x.severity === 'error')) {
        expect(i.message.length, `seed ${seed}`).toBeGreaterThan(10);
        expect(i.message, `seed ${seed}`).not.toMatch(/internal problem/);
      }
      if (r.ok) {
        computed++;
        // Crossings re-checked with a direct solve (one complex LU, not the fast sweep path):
        // |H(f−3dB)| = |H(0)|/√2 and |H(f_u)| = 1 (definitions).
        const sys = buildMna(net).system!;
        const magAt = (f: number) => { const h = transferDirect(sys, { re: 0, im: 2 * Math.PI * f }); return h ? Math.hypot(h.re, h.im) : NaN; };
        if (r.bandwidthHz !== null) expect(magAt(r.bandwidthHz) / (Math.abs(r.dcGain!) / Math.SQRT2), `seed ${seed}`).toBeCloseTo(1, 5);
        if (r.unityGainHz !== null) expect(magAt(r.unityGainHz), `seed ${seed}`).toBeCloseTo(1, 5);
        expect(r.nodes.length, `seed ${seed}`).toBe(r.unknowns.nodes);
        expect(r.participation.length, `seed ${seed}`).toBe(r.poles.length);
      }
    }
    // Most random circuits are structurally fine; the loop must have exercised the analyses.
    expect(computed).toBeGreaterThan(50);
    console.log(`random circuits analysed: ${computed} of ${CASES} (the rest stopped at named structural errors)`);
  });
});
