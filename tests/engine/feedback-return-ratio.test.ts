import { describe, it, expect } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { returnRatios, returnRatioDirect } from '../../src/engine/feedback/returnRatio';
import { sourceStamps } from '../../src/engine/feedback/pencil';
import { build, R, Cap, Gm, Vcvs, Vsrc, nmos } from './feedback-fixtures';

/** DC solve with ml-matrix (independent library) of the hand-built system. */
function dcSolve(sys: ReturnType<typeof build>): number[] {
  const rows = Array.from({ length: sys.n }, (_, i) => Array.from(sys.G.slice(i * sys.n, (i + 1) * sys.n)));
  return solve(new Matrix(rows), Matrix.columnVector(Array.from(sys.b))).to1DArray();
}

describe('return ratio (Bode)', () => {
  const gm = 1e-3, Rl = 10e3, Cl = 1e-12;
  const follower = build([Vsrc('V1', 'in', '0'), Gm('G1', '0', 'out', 'in', 'out', gm), R('RL', 'out', '0', Rl), Cap('CL', 'out', '0', Cl)],
    { input: 'V1', output: { kind: 'voltage', node: 'out' } });

  it('transconductor in unity feedback: T = gm·R at DC, gain gm·R/(1 + gm·R)', () => {
    const [t] = returnRatios(follower);
    // common practice: loop gain of a transconductor closed around its load is gm·R.
    expect(t.dc.status).toBe('ok');
    expect(t.dc.value!.re).toBeCloseTo(gm * Rl, 10);
    expect(t.dc.value!.im).toBeCloseTo(0, 12);
    const x = dcSolve(follower);
    // common practice: closed-loop gain T/(1 + T).
    expect(x[follower.nodeNames.indexOf('out')]).toBeCloseTo((gm * Rl) / (1 + gm * Rl), 10);
  });

  it('over frequency follows gm·R/(1 + jωRC) (common practice, single-pole loop)', () => {
    const f = [1e6, 15.9e6, 1e9];
    const [t] = returnRatios(follower, { freqsHz: f });
    f.forEach((fHz, i) => {
      const w = 2 * Math.PI * fHz;
      const den = 1 + (w * Rl * Cl) ** 2;
      const re = (gm * Rl) / den;
      const im = (-gm * Rl * w * Rl * Cl) / den;
      expect(t.points[i].value!.re).toBeCloseTo(re, 9);
      expect(t.points[i].value!.im).toBeCloseTo(im, 9);
    });
  });

  it('non-inverting amplifier: T = A·β with divider loading, gain A/(1 + Aβ)', () => {
    const A = 1000, Ro = 100, R1 = 90e3, R2 = 10e3;
    const sys = build([Vsrc('V1', 'in', '0'), Vcvs('E1', 'x', '0', 'in', 'fb', A, 'A0'), R('Ro', 'x', 'out', Ro),
      R('R1', 'out', 'fb', R1), R('R2', 'fb', '0', R2)], { input: 'V1' });
    const [t] = returnRatios(sys);
    // exact for this network: the divider sees Ro in series (Thevenin of the source).
    expect(t.id).toBe('E1.A0');
    expect(t.dc.value!.re).toBeCloseTo((A * R2) / (Ro + R1 + R2), 8);
    // common practice A·β (β = R2/(R1 + R2)), valid when R1 + R2 ≫ Ro: within 0.2 %.
    expect(Math.abs(t.dc.value!.re / (A * 0.1) - 1)).toBeLessThan(2e-3);
    const x = dcSolve(sys);
    const out = x[sys.nodeNames.indexOf('out')];
    // common practice: closed-loop gain A/(1 + Aβ) ≈ 9.90 (Ro loading moves it by < 0.2 %).
    expect(Math.abs(out / (A / (1 + A * 0.1)) - 1)).toBeLessThan(2e-3);
  });

  it('Sherman–Morrison route equals the literal Bode measurement on a two-stage MOS network', () => {
    const sys = build([
      Vsrc('V1', 'in', '0'),
      ...nmos('M1', 'a', 'in', 's1', 2e-3, 50e3, 3e-4),
      R('RS', 's1', '0', 1e3), R('RD1', 'a', '0', 20e3),
      ...nmos('M2', 'out', 'a', '0', 4e-3, 30e3),
      R('RF', 'out', 's1', 8e3), Cap('CF', 'out', 'a', 0.3e-12), Cap('CA', 'a', '0', 0.2e-12), Cap('CO', 'out', '0', 1e-12),
    ], { input: 'V1' });
    const stamps = sourceStamps(sys);
    const f = [0, 1e5, 3e8, 5e9];
    const swept = returnRatios(sys, { freqsHz: f.slice(1) });
    for (const [k, s] of stamps.entries()) {
      for (const [i, fHz] of f.entries()) {
        const direct = returnRatioDirect(sys, sys.G, s, 2 * Math.PI * fHz);
        const viaSm = i === 0 ? swept[k].dc : swept[k].points[i - 1];
        // self-consistency of two independent routes (Sherman & Morrison 1950 vs Bode's definition).
        expect(viaSm.value!.re).toBeCloseTo(direct.value!.re, 8);
        expect(viaSm.value!.im).toBeCloseTo(direct.value!.im, 8);
      }
    }
  });

  it('a source whose control is grounded reports no-control, and a scaled-off source closes no loop', () => {
    const sys = build([Vsrc('V1', 'in', '0'), Gm('G1', '0', 'out', 'in', 'out', gm), Gm('G2', 'out', '0', '0', '0', 1e-3), R('RL', 'out', '0', Rl)], { input: 'V1' });
    const r = returnRatios(sys);
    expect(r[1].dc.status).toBe('no-control');
    const off = returnRatios(sys, { scale: { 'G1.gm': 0 } });
    expect(off[0].dc.status).toBe('no-control');
    expect(off[0].dc.value!.re).toBe(0);
  });
});
