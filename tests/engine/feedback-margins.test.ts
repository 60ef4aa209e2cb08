import { describe, it, expect } from 'vitest';
import { loopMargins } from '../../src/engine/feedback/margins';
import { build, R, Cap, Gm, Vsrc } from './feedback-fixtures';

// Two-stage Miller-compensated amplifier in unity feedback (invented values).
function twoStage(gm1: number, gm2: number, Cc: number, C1: number, CL: number) {
  return build([
    Vsrc('V1', 'in', '0'),
    Gm('G1', 'a', '0', 'in', 'out', gm1), R('R1', 'a', '0', 1e6), Cap('C1', 'a', '0', C1),
    Gm('G2', 'out', '0', 'a', '0', gm2), R('R2', 'out', '0', 1e5), Cap('CL', 'out', '0', CL),
    Cap('Cc', 'a', 'out', Cc),
  ], { input: 'V1', output: { kind: 'voltage', node: 'out' } });
}

describe('loop margins', () => {
  it('two-stage Miller amplifier: PM within 2° of 90° − atan(ωu/p2) − atan(ωu/z) (Gray & Meyer)', () => {
    const gm1 = 1e-4, gm2 = 2e-3, Cc = 0.5e-12, C1 = 50e-15, CL = 1e-12;
    const m = loopMargins(twoStage(gm1, gm2, Cc, C1, CL), 'G1.gm');
    expect(m.status).toBe('ok');
    const wu = 2 * Math.PI * m.unityGainHz!;
    // Gray & Meyer, Analysis and Design of Analog ICs, Miller compensation: p2 ≈ gm2·Cc/(C1·CL + Cc(C1 + CL)), z = gm2/Cc
    const p2 = (gm2 * Cc) / (C1 * CL + Cc * (C1 + CL));
    const z = gm2 / Cc;
    const pm = 90 - (Math.atan(wu / p2) + Math.atan(wu / z)) * (180 / Math.PI);
    expect(Math.abs(m.phaseMarginDeg! - pm)).toBeLessThan(2);
    // Gray & Meyer: ωu ≈ gm1/Cc
    expect(Math.abs(wu / (gm1 / Cc) - 1)).toBeLessThan(0.1);
  });

  it('single-pole loop: PM ≈ 90°, crossover at gm·R/(2πRC) (common practice), no gain margin', () => {
    const sys = build([Vsrc('V1', 'in', '0'), Gm('G1', '0', 'out', 'in', 'out', 1e-3), R('RL', 'out', '0', 100e3), Cap('CL', 'out', '0', 1e-12)], { input: 'V1' });
    const m = loopMargins(sys, 'G1.gm');
    const T0 = 100;
    // exact for one pole: |T| = 1 at ω = p·sqrt(T0² − 1)
    const fu = Math.sqrt(T0 * T0 - 1) / (2 * Math.PI * 100e3 * 1e-12);
    expect(m.unityGainHz! / fu).toBeCloseTo(1, 8);
    expect(m.phaseMarginDeg!).toBeCloseTo(90 + (Math.atan(1 / Math.sqrt(T0 * T0 - 1)) * 180) / Math.PI, 6);
    expect(m.gainMarginDb).toBeNull();
  });

  it('three equal poles: phase −180° at ω = √3·p, gain margin 20·log10(8/T0) (common practice)', () => {
    // three cascaded inverting-free transconductance stages with equal RC, closed around the first
    const T0 = 4, g = Math.cbrt(T0) / 1e4;
    const sys = build([
      Vsrc('V1', 'in', '0'),
      Gm('G1', '0', 'a', 'in', 'c', g), R('Ra', 'a', '0', 1e4), Cap('Ca', 'a', '0', 1e-12),
      Gm('G2', '0', 'b', 'a', '0', g), R('Rb', 'b', '0', 1e4), Cap('Cb', 'b', '0', 1e-12),
      Gm('G3', '0', 'c', 'b', '0', g), R('Rc', 'c', '0', 1e4), Cap('Cc', 'c', '0', 1e-12),
    ], { input: 'V1' });
    const m = loopMargins(sys, 'G1.gm');
    const p = 1 / (1e4 * 1e-12);
    expect((2 * Math.PI * m.phaseCrossHz!) / (Math.sqrt(3) * p)).toBeCloseTo(1, 6);
    expect(m.gainMarginDb!).toBeCloseTo(20 * Math.log10(8 / T0), 6);
  });

  it('unknown key is named', () => {
    const m = loopMargins(twoStage(1e-4, 2e-3, 1e-12, 1e-13, 1e-12), 'X.gm');
    expect(m.status).toBe('unknown-source');
    expect(m.message).toMatch(/X\.gm/);
  });
});
