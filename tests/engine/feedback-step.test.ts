import { describe, it, expect } from 'vitest';
import { stepResponse } from '../../src/engine/feedback/step';
import { build, R, Cap, Gm, Vcvs, Vsrc } from './feedback-fixtures';

describe('step response and settling', () => {
  it('single pole: y = A(1 − e^(−t/τ)), settling to ε at τ·ln(1/ε) (common practice)', () => {
    const tau = 1e-9, Rv = 1e3;
    const sys = build([Vsrc('V1', 'in', '0'), Gm('G1', '0', 'out', 'in', '0', 2e-3), R('R', 'out', '0', Rv), Cap('C', 'out', '0', tau / Rv)],
      { input: 'V1', output: { kind: 'voltage', node: 'out' } });
    const r = stepResponse(sys);
    expect(r.status).toBe('ok');
    expect(r.finalValue!).toBeCloseTo(2, 12);
    for (const s of r.settling) expect(s.seconds! / (tau * Math.log(1 / s.tolerance))).toBeCloseTo(1, 3);
    // sample check against the closed form
    for (let i = 0; i < r.t.length; i += 50) expect(Math.abs(r.y[i] - 2 * (1 - Math.exp(-r.t[i] / tau)))).toBeLessThan(2e-5);
    expect(r.overshoot!).toBeLessThan(1e-6);
  });

  it('slow doublet after a fast pole: the tail sets the 0.1 % and 0.01 % settling (partial fractions, common practice)', () => {
    // fast stage p1 = 1e8 rad/s, then a lag network: zero z = 1/(R2·C), pole p = 1/((R1 + R2)·C), 10 % apart
    const p1 = 1e8, R1 = 1e3, R2 = 10e3, Cl = 1e-9, Ra = 1e3;
    const sys = build([
      Vsrc('V1', 'in', '0'), Gm('G1', '0', 'a', 'in', '0', 1 / Ra), R('Ra', 'a', '0', Ra), Cap('Ca', 'a', '0', 1 / (p1 * Ra)),
      Vcvs('E1', 'a2', '0', 'a', '0', 1), R('R1', 'a2', 'out', R1), R('R2', 'out', 'm', R2), Cap('C', 'm', '0', Cl),
    ], { input: 'V1', output: { kind: 'voltage', node: 'out' } });
    const z = 1 / (R2 * Cl), p = 1 / ((R1 + R2) * Cl);
    // H(s) = p1/(s + p1) · (p/z)(s + z)/(s + p); y(t) = 1 + Σ Res[H(s)/s] e^(s_k t)
    const a1 = (p1 * (p / z) * (z - p1)) / ((p - p1) * -p1);
    const a2 = ((p1 / (p1 - p)) * (p / z) * (z - p)) / -p;
    const exact = (t: number) => 1 + a1 * Math.exp(-p1 * t) + a2 * Math.exp(-p * t);
    const r = stepResponse(sys);
    expect(r.status).toBe('ok');
    for (let i = 0; i < r.t.length; i += 37) expect(Math.abs(r.y[i] - exact(r.t[i]))).toBeLessThan(1e-5);
    // tail alone: |a2| e^(−pt) = ε ⇒ t = ln(|a2|/ε)/p (valid once the fast pole has died out)
    for (const s of r.settling) expect(s.seconds! / (Math.log(Math.abs(a2) / s.tolerance) / p)).toBeCloseTo(1, 3);
    expect(r.settling[2].seconds! / r.settling[0].seconds!).toBeGreaterThan(3);
  });

  it('names a missing output instead of failing', () => {
    const sys = build([Vsrc('V1', 'in', '0'), R('R', 'in', '0', 1e3)], { input: 'V1' });
    const r = stepResponse(sys);
    expect(r.status).toBe('no-output');
    expect(r.message).toMatch(/output/);
  });
});
