import { describe, it, expect } from 'vitest';
import { Hand } from './analyses-handmna';
import { computePoles } from '../../src/engine/analyses/poles';
import { computeZeros } from '../../src/engine/analyses/zeros';
import { dcTransfer } from '../../src/engine/analyses/transfer';

const sortRe = (xs: { re: number }[]) => xs.map((p) => p.re).sort((a, b) => a - b);

describe('poles of simple stages', () => {
  it('single RC: one pole at −1/RC, no finite zero (common practice)', () => {
    const R = 4.7e3, C = 330e-12;
    const sys = new Hand().V('vin', 'in', '0').R('r1', 'in', 'out', R).C('c1', 'out', '0', C).build('vin', 'out');
    const p = computePoles(sys);
    expect(p.status).toBe('ok');
    expect(p.poles.length).toBe(1);
    expect(p.poles[0].re * R * C).toBeCloseTo(-1, 12);
    expect(p.poles[0].hz * 2 * Math.PI * R * C).toBeCloseTo(1, 12);
    expect(p.poles[0]).toMatchObject({ kind: 'real', q: null, rhp: false });
    expect(computeZeros(sys, p.poles).zeros.length).toBe(0);
  });

  it('two isolated transconductor stages: poles −1/(R1C1) and −1/(R2C2) (common practice)', () => {
    const R1 = 20e3, C1 = 1e-12, R2 = 3e3, C2 = 7e-12;
    const sys = new Hand().V('vin', 'in', '0')
      .G('g1', 'a', '0', 'in', '0', 1e-3).R('r1', 'a', '0', R1).C('c1', 'a', '0', C1)
      .G('g2', 'b', '0', 'a', '0', 2e-3).R('r2', 'b', '0', R2).C('c2', 'b', '0', C2)
      .build('vin', 'b');
    const re = sortRe(computePoles(sys).poles);
    const ref = [-1 / (R1 * C1), -1 / (R2 * C2)].sort((a, b) => a - b);
    expect(re.length).toBe(2);
    re.forEach((v, i) => expect(v / ref[i]).toBeCloseTo(1, 11));
  });

  it('unity negative feedback moves the pole out by (1 + gm·R) and sets gain gm·R/(1 + gm·R) (common practice)', () => {
    const gm = 1e-3, R = 100e3, C = 2e-12;
    // Current gm·(v(in) − v(out)) into out (leaves ground, enters out).
    const sys = new Hand().V('vin', 'in', '0').G('g1', '0', 'out', 'in', 'out', gm).R('r1', 'out', '0', R).C('c1', 'out', '0', C).build('vin', 'out');
    const p = computePoles(sys).poles;
    expect(p.length).toBe(1);
    expect(p[0].re / (-(1 + gm * R) / (R * C))).toBeCloseTo(1, 12);
    expect(dcTransfer(sys).value! / ((gm * R) / (1 + gm * R))).toBeCloseTo(1, 12);
  });
});

describe('common-source stage with source resistance (Razavi, Design of Analog CMOS ICs, CS frequency response)', () => {
  // H(s) = (s·Cgd − gm)·RD / (RS·RD·ξ·s² + [RS(1 + gm·RD)Cgd + RS·Cgs + RD(Cgd + Cdb)]·s + 1),
  // ξ = Cgs·Cgd + Cgs·Cdb + Cgd·Cdb (RD here includes ro: RD = Rload ∥ ro).
  const RS = 5e3, gm = 3e-3, RD = 12e3, Cgs = 150e-15, Cgd = 40e-15, Cdb = 300e-15;
  const sys = new Hand().V('vin', 'src', '0').R('rs', 'src', 'g', RS)
    .G('m1.gm', 'out', '0', 'g', '0', gm).R('rd', 'out', '0', RD)
    .C('cgs', 'g', '0', Cgs).C('cgd', 'g', 'out', Cgd).C('cdb', 'out', '0', Cdb)
    .build('vin', 'out');
  const xi = Cgs * Cgd + Cgs * Cdb + Cgd * Cdb;
  const a2 = RS * RD * xi;
  const a1 = RS * (1 + gm * RD) * Cgd + RS * Cgs + RD * (Cgd + Cdb);

  it('poles satisfy the exact second-order denominator: p1·p2 = 1/a2, p1 + p2 = −a1/a2', () => {
    const p = computePoles(sys).poles;
    expect(p.length).toBe(2);
    expect(p.every((x) => x.kind === 'real' && x.re < 0)).toBe(true);
    expect((p[0].re * p[1].re) * a2).toBeCloseTo(1, 11);
    expect((p[0].re + p[1].re) / (-a1 / a2)).toBeCloseTo(1, 11);
  });

  it('one RHP zero at +gm/Cgd, DC gain −gm·RD', () => {
    const z = computeZeros(sys, computePoles(sys).poles);
    expect(z.status).toBe('ok');
    expect(z.zeros.length).toBe(1);
    expect(z.zeros[0].re / (gm / Cgd)).toBeCloseTo(1, 10);
    expect(z.zeros[0]).toMatchObject({ im: 0, rhp: true, cancelsPole: false });
    expect(dcTransfer(sys).value! / (-gm * RD)).toBeCloseTo(1, 12);
  });
});

describe('doubly terminated Butterworth LC ladders', () => {
  // Element values g_k = 2·sin((2k − 1)π/(2n)) with R_S = R_L = 1 (standard closed form; Zverev,
  // Handbook of Filter Synthesis, Butterworth tables). Poles: s_k = exp(jπ(2k + n − 1)/(2n)).
  function ladder(n: number, r0 = 1, w0 = 1) {
    const h = new Hand().V('vs', 'src', '0').R('rs', 'src', 'n1', r0);
    let node = 1;
    for (let k = 1; k <= n; k++) {
      const g = 2 * Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
      if (k % 2 === 1) h.C(`c${k}`, `n${node}`, '0', g / (r0 * w0));
      else { h.L(`l${k}`, `n${node}`, `n${node + 1}`, (g * r0) / w0); node++; }
    }
    h.R('rl', `n${node}`, '0', r0);
    return h.build('vs', `n${node}`);
  }

  for (let n = 3; n <= 7; n++) {
    it(`order ${n}: poles on the unit circle at the Butterworth angles`, () => {
      const p = computePoles(ladder(n)).poles;
      expect(p.length).toBe(n);
      const angles = p.map((x) => Math.atan2(x.im, x.re)).sort((a, b) => a - b);
      const ref = Array.from({ length: n }, (_, k) => Math.atan2(Math.sin((Math.PI * (2 * k + n + 1)) / (2 * n)), Math.cos((Math.PI * (2 * k + n + 1)) / (2 * n)))).sort((a, b) => a - b);
      for (const x of p) expect(Math.hypot(x.re, x.im)).toBeCloseTo(1, 10);
      angles.forEach((a, i) => expect(a).toBeCloseTo(ref[i], 9));
      // Largest pole Q of a Butterworth filter: 1/(2·sin(π/(2n))) (common practice).
      const qMax = Math.max(...p.map((x) => x.q ?? 0));
      expect(qMax).toBeCloseTo(1 / (2 * Math.sin(Math.PI / (2 * n))), 8);
      // Doubly terminated, equal resistors: DC gain 1/2; an all-pole (ladder) response has no
      // finite zeros (common practice).
      expect(dcTransfer(ladder(n)).value!).toBeCloseTo(0.5, 12);
      expect(computeZeros(ladder(n), p).zeros).toEqual([]);
    });
  }

  it('order 5 scaled to 50 Ω and 10 MHz keeps the poles at 2π·10 MHz (frequency and impedance scaling)', () => {
    const w0 = 2 * Math.PI * 10e6;
    const p = computePoles(ladder(5, 50, w0)).poles;
    for (const x of p) expect(x.hz / 10e6).toBeCloseTo(1, 9);
  });
});

describe('stiff and degenerate cases', () => {
  it('buffered RC ladder with time constants 1e-12 s … 1 s: every pole at −1/τ (common practice)', () => {
    const h = new Hand().V('vin', 's0', '0');
    const taus: number[] = [];
    for (let k = 0; k <= 12; k++) {
      const tau = Math.pow(10, -12 + k);
      taus.push(tau);
      h.G(`g${k}`, `s${k + 1}`, '0', `s${k}`, '0', 1e-3).R(`r${k}`, `s${k + 1}`, '0', 1e3).C(`c${k}`, `s${k + 1}`, '0', tau / 1e3);
    }
    const sys = h.build('vin', 's13');
    const re = sortRe(computePoles(sys).poles);
    const ref = taus.map((t) => -1 / t).sort((a, b) => a - b);
    expect(re.length).toBe(13);
    re.forEach((v, i) => expect(v / ref[i]).toBeCloseTo(1, 8));
    // Each stage inverts with gain gm·R = 1: 13 stages give DC gain −1 (common practice).
    expect(dcTransfer(sys).value!).toBeCloseTo(-1, 10);
  });

  it('a node reached only through a capacitor is a pole at s = 0 (ideal integrator), not an error', () => {
    const sys = new Hand().V('vin', 'in', '0').G('g1', 'x', '0', 'in', '0', 1e-3).C('c1', 'x', '0', 1e-12)
      .G('g2', 'y', '0', 'x', '0', 1e-3).R('r2', 'y', '0', 1e3).C('c2', 'y', '0', 1e-12).build('vin', 'y');
    const p = computePoles(sys);
    expect(p.status).toBe('ok');
    expect(p.originCount).toBe(1);
    expect(p.poles[0]).toMatchObject({ kind: 'origin', re: 0, im: 0, hz: 0 });
    expect(p.poles[1].re * 1e3 * 1e-12).toBeCloseTo(-1, 10);
  });

  it('zeros of a transfer that is identically zero are reported, not computed (Rosenbrock pencil singular)', () => {
    // The output node is driven by nothing connected to the input.
    const sys = new Hand().V('vin', 'in', '0').R('r1', 'in', 'a', 1e3).C('c1', 'a', '0', 1e-12)
      .R('r2', 'b', '0', 1e3).C('c2', 'b', '0', 1e-12).build('vin', 'b');
    const z = computeZeros(sys, computePoles(sys).poles);
    expect(z.status).toBe('identically-zero');
    expect(z.zeros).toEqual([]);
    expect(z.reason).toMatch(/does not respond/);
  });

  it('a mode the output cannot see shows up as a zero flagged as cancelling its pole', () => {
    // Node b hangs off the input but the output is node a: the b pole cancels in H(s).
    const sys = new Hand().V('vin', 'in', '0').R('r1', 'in', 'a', 1e3).C('c1', 'a', '0', 1e-12)
      .G('g2', 'b', '0', 'in', '0', 1e-3).R('r2', 'b', '0', 2e3).C('c2', 'b', '0', 3e-12).build('vin', 'a');
    const p = computePoles(sys).poles;
    const z = computeZeros(sys, p);
    expect(p.length).toBe(2);
    expect(z.zeros.length).toBe(1);
    expect(z.zeros[0].re * 2e3 * 3e-12).toBeCloseTo(-1, 8);
    expect(z.zeros[0].cancelsPole).toBe(true);
  });
});
