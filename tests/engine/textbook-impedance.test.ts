import { describe, it, expect } from 'vitest';
import { Hand } from './analyses-handmna';
import { dcImpedances } from '../../src/engine/analyses/impedance';
import { openCircuitTimeConstants, nodeTimeConstants } from '../../src/engine/analyses/octc';
import { computePoles } from '../../src/engine/analyses/poles';
import { rng } from '../seeded'; // mulberry32, common practice

// Small-signal MOS as in types.ts: VCCS gm·(v(g) − v(s)) from d to s, gmb·(v(b) − v(s)) from d to
// s, ro = 1/gds between d and s.
function mos(h: Hand, name: string, d: string, g: string, s: string, gm: number, gmb: number, ro: number, b = '0') {
  h.G(`${name}.gm`, d, s, g, s, gm);
  if (gmb) h.G(`${name}.gmb`, d, s, b, s, gmb);
  h.R(`${name}.ro`, d, s, ro);
  return h;
}

const zAt = (sys: ReturnType<Hand['build']>, node: string) => dcImpedances(sys)[sys.nodeNames.indexOf(node)].ohms!;

describe('output resistances (closed forms)', () => {
  const gm1 = 1.1e-3, ro1 = 80e3, gm2 = 1.7e-3, ro2 = 65e3;

  it('cascode: Rout = ro1 + ro2 + gm2·ro1·ro2 (Gray, Hurst, Lewis & Meyer, cascode output resistance)', () => {
    const h = new Hand();
    mos(h, 'm1', 'x', '0', '0', gm1, 0, ro1); // lower device, gate at AC ground
    mos(h, 'm2', 'out', '0', 'x', gm2, 0, ro2); // cascode device, gate at AC ground
    const sys = h.build();
    const expected = ro1 + ro2 + gm2 * ro1 * ro2;
    expect(zAt(sys, 'out') / expected).toBeCloseTo(1, 12);
  });

  it('regulated cascode with error-amplifier gain A: ro1 + ro2 + (1 + A)·gm2·ro1·ro2 (Gray, Hurst, Lewis & Meyer)', () => {
    for (const A of [1, 10, 250]) {
      const h = new Hand();
      mos(h, 'm1', 'x', '0', '0', gm1, 0, ro1);
      mos(h, 'm2', 'out', 'gate2', 'x', gm2, 0, ro2);
      h.E('amp', 'gate2', '0', '0', 'x', A); // ideal amplifier senses x, drives the cascode gate: v(gate2) = −A·v(x)
      const sys = h.build();
      const expected = ro1 + ro2 + (1 + A) * gm2 * ro1 * ro2;
      expect(zAt(sys, 'out') / expected).toBeCloseTo(1, 11);
    }
  });

  it('source follower: Rout = 1/(gm + gmb) ∥ ro (Razavi, Design of Analog CMOS ICs, source follower)', () => {
    const gm = 2e-3, gmb = 0.4e-3, ro = 40e3;
    const h = new Hand();
    mos(h, 'm1', '0', 'in', 'out', gm, gmb, ro); // drain at AC ground (supply)
    h.V('vin', 'in', '0'); // input zeroed → gate at AC ground
    const sys = h.build();
    const expected = 1 / (gm + gmb + 1 / ro);
    expect(zAt(sys, 'out') / expected).toBeCloseTo(1, 12);
  });

  it('common gate: Rin = (RD + ro)/(1 + (gm + gmb)·ro) (Razavi, Design of Analog CMOS ICs, common-gate stage)', () => {
    const gm = 1.3e-3, gmb = 0.2e-3, ro = 30e3;
    for (const RD of [0, 5e3, 200e3]) {
      const h = new Hand();
      mos(h, 'm1', 'd', '0', 'x', gm, gmb, ro);
      if (RD > 0) h.R('rd', 'd', '0', RD); else h.V('vdd', 'd', '0');
      const sys = h.build();
      const expected = (RD + ro) / (1 + (gm + gmb) * ro);
      expect(zAt(sys, 'x') / expected).toBeCloseTo(1, 12);
    }
  });
});

describe('open-circuit time constants of a common-source stage', () => {
  // Gray & Meyer (Analysis and Design of Analog ICs, OCTC of the CE/CS stage):
  // τgs = RS·Cgs, τgd = Cgd·(RS + RL' + gm·RS·RL'), τout = RL'·Cout, RL' = RL ∥ ro.
  const RS = 10e3, gm = 2e-3, ro = 50e3, RL = 20e3, Cgs = 200e-15, Cgd = 30e-15, Cdb = 60e-15, CL = 500e-15;
  const h = new Hand().V('vin', 'src', '0').R('rs', 'src', 'g', RS);
  mos(h, 'm1', 'out', 'g', '0', gm, 0, ro);
  h.R('rl', 'out', '0', RL).C('cgs', 'g', '0', Cgs).C('cgd', 'g', 'out', Cgd).C('cdb', 'out', '0', Cdb).C('cl', 'out', '0', CL);
  const sys = h.build('vin', 'out');
  const RLp = 1 / (1 / RL + 1 / ro);

  it('each τ and Στ match the hand formulas', () => {
    const r = openCircuitTimeConstants(sys);
    const tau = Object.fromEntries(r.caps.map((c) => [c.part, c.tau!]));
    expect(tau.cgs / (RS * Cgs)).toBeCloseTo(1, 12);
    expect(tau.cgd / (Cgd * (RS + RLp + gm * RS * RLp))).toBeCloseTo(1, 12);
    expect(tau.cdb / (RLp * Cdb)).toBeCloseTo(1, 12);
    expect(tau.cl / (RLp * CL)).toBeCloseTo(1, 12);
    const sum = RS * Cgs + Cgd * (RS + RLp + gm * RS * RLp) + RLp * (Cdb + CL);
    expect(r.sumTau! / sum).toBeCloseTo(1, 12);
    expect(r.bandwidthHz! * 2 * Math.PI * sum).toBeCloseTo(1, 12);
  });

  it('node table: capacitance touching each node, Z·C and the slowest node marked (common practice)', () => {
    const rows = nodeTimeConstants(sys, dcImpedances(sys));
    const out = rows.find((r) => r.node === 'out')!;
    const g = rows.find((r) => r.node === 'g')!;
    expect(out.farads).toBeCloseTo(Cgd + Cdb + CL, 25);
    expect(g.farads).toBeCloseTo(Cgs + Cgd, 25);
    expect(out.tau! / (RLp * (Cgd + Cdb + CL))).toBeCloseTo(1, 12);
    expect(g.tau! / (RS * (Cgs + Cgd))).toBeCloseTo(1, 12);
    // out: ≈ 14.3 kΩ·590 fF ≈ 8.4 ns; g: 10 kΩ·230 fF = 2.3 ns → out is the slowest node.
    expect(rows.filter((r) => r.slowest).map((r) => r.node)).toEqual(['out']);
    expect(out.poleHz! * 2 * Math.PI * out.tau!).toBeCloseTo(1, 12);
  });

  it('an integrating node makes Στ unbounded with a reason, not NaN', () => {
    const s2 = new Hand().V('vin', 'in', '0').G('g1', 'x', '0', 'in', '0', 1e-3).C('c1', 'x', '0', 1e-12).R('r', 'in', 'y', 1e3).C('c2', 'y', '0', 1e-12).build('vin', 'x');
    const r = openCircuitTimeConstants(s2);
    expect(r.sumTau).toBeNull();
    expect(r.bandwidthHz).toBeNull();
    expect(r.reason).toMatch(/unbounded/);
    expect(r.caps.find((c) => c.part === 'c2')!.tau! / 1e-9).toBeCloseTo(1, 12);
    const rows = nodeTimeConstants(s2, dcImpedances(s2));
    expect(rows.find((x) => x.node === 'x')).toMatchObject({ ohms: null, tau: null, poleHz: 0, slowest: true });
  });
});

describe('open-circuit time constants and the poles', () => {
  // Gray & Searle 1969: Στ over all capacitors equals b1, the s-coefficient of
  // det(G + sC)/det(G) = Π(1 − s/p_i), so Στ = −Σ 1/p_i over the finite poles.
  for (const seed of [1, 2, 3]) {
    it(`random active RC network ${seed}: Στ = −Σ 1/p`, () => {
      const r = rng(seed);
      const h = new Hand().V('vin', 'in', '0').R('rin', 'in', 'a0', 1e3 + 1e4 * r());
      const nodes = ['a0', 'a1', 'a2', 'a3', 'a4', 'a5'];
      nodes.forEach((a, i) => {
        const b = nodes[(i + 1) % nodes.length];
        h.R(`rg${i}`, a, '0', 1e3 + 1e5 * r()).C(`cg${i}`, a, '0', 1e-13 + 1e-12 * r());
        h.C(`cc${i}`, a, b, 1e-14 + 1e-13 * r());
        h.G(`g${i}`, b, '0', a, '0', 2e-5 * r());
      });
      const sys = h.build('vin', 'a5');
      const sumTau = openCircuitTimeConstants(sys).sumTau!;
      const poles = computePoles(sys).poles;
      let b1 = 0;
      for (const p of poles) b1 += -p.re / (p.re * p.re + p.im * p.im); // Re(−1/p), pairs add up real
      expect(sumTau / b1).toBeCloseTo(1, 9);
    });
  }
});
