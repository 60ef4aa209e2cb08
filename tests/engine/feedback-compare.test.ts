import { describe, it, expect } from 'vitest';
import { compareOff } from '../../src/engine/feedback/compare';
import { discoverLoops } from '../../src/engine/feedback/loops';
import { build, R, Cap, Gm, Vsrc } from './feedback-fixtures';

describe('loop on/off (A/B)', () => {
  // Transconductor closed in unity feedback (invented values): gm = 1 mS, R = 10 kΩ, C = 1 pF.
  const gm = 1e-3, Rl = 10e3, Cl = 1e-12;
  const sys = build([Vsrc('V1', 'in', '0'), Gm('G1', '0', 'out', 'in', 'out', gm), R('RL', 'out', '0', Rl), Cap('CL', 'out', '0', Cl)],
    { input: 'V1', output: { kind: 'voltage', node: 'out' } });

  it('unity-feedback transconductor: the node pole is pushed out by 1 + gm·R, gain gm·R/(1 + gm·R) (common practice)', () => {
    // "off" here means the feedback dependence is cut: rewire the same stage open-loop (control from
    // in only) to get the reference, and compare with the loop closed.
    const open = build([Vsrc('V1', 'in', '0'), Gm('G1', '0', 'out', 'in', '0', gm), R('RL', 'out', '0', Rl), Cap('CL', 'out', '0', Cl)],
      { input: 'V1', output: { kind: 'voltage', node: 'out' } });
    const closed = compareOff(sys, []).before;
    const ref = compareOff(open, []).before;
    const T = gm * Rl;
    expect(closed.poles.length).toBe(1);
    expect(closed.poles[0].re / ref.poles[0].re).toBeCloseTo(1 + T, 8);
    expect(closed.poles[0].re).toBeCloseTo(-(1 + T) / (Rl * Cl), -2);
    expect(closed.dcGain!).toBeCloseTo(T / (1 + T), 10);
    // bandwidth of the closed loop = (1 + T)/(2πRC) for one pole (common practice)
    expect(closed.bandwidthHz! * 2 * Math.PI * Rl * Cl / (1 + T)).toBeCloseTo(1, 4);
  });

  it('switching the loop off zeroes its key source and reports what changed', () => {
    const d = discoverLoops(sys);
    const loop = d.loops.find((l) => l.key === 'G1.gm')!;
    const c = compareOff(sys, [loop]);
    expect(c.ok).toBe(true);
    expect(c.off).toEqual(['G1.gm']);
    expect(c.loopsOff).toEqual([loop.id]);
    // with gm = 0 the output is the bare RC: pole 1/(RC), |Z(out)| = R, τ = RC, DC gain 0
    const pc = c.poles.find((p) => p.before && p.after)!;
    expect(pc.ratio!).toBeCloseTo(1 / (1 + gm * Rl), 8);
    const out = c.nodes.find((n) => n.node === 'out')!;
    expect(out.dcOhmsBefore!).toBeCloseTo(Rl / (1 + gm * Rl), 6);
    expect(out.dcOhmsAfter!).toBeCloseTo(Rl, 6);
    expect(out.tauAfter!).toBeCloseTo(Rl * Cl, 18);
    expect(c.dcGain.after).toBe(0);
    expect(c.caution).toMatch(/small-signal/i);
  });

  it('names an unknown source instead of failing', () => {
    const c = compareOff(sys, ['M7.gm']);
    expect(c.ok).toBe(false);
    expect(c.issues[0]).toMatch(/M7\.gm/);
  });
});
