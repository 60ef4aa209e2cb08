import { describe, it, expect } from 'vitest';
import { returnRatios } from '../../src/engine/feedback/returnRatio';
import { discoverLoops } from '../../src/engine/feedback/loops';
import { blackmanAt } from '../../src/engine/feedback/blackman';
import { loopMargins } from '../../src/engine/feedback/margins';
import { analyzeFeedbackSystem } from '../../src/engine/feedback/index';
import { build, R, Cap, Gm, Vsrc, Isrc } from './feedback-fixtures';

describe('bad or degenerate networks give statuses, not NaN or throws', () => {
  it('ideal diode-connected device alone on its node: return ratio unbounded, named', () => {
    // gm from d to ground with control d − 0 and nothing else at d except a capacitor: with gm removed
    // the node has no DC path, so T → ∞ at DC (common practice: T = gm·Z with Z = ∞)
    const sys = build([Isrc('I1', 'd', '0'), Gm('M1', 'd', '0', 'd', '0', 1e-3), Cap('C', 'd', '0', 1e-12)], { input: 'I1' });
    const [t] = returnRatios(sys, { freqsHz: [1e6] });
    expect(t.dc.status).toBe('infinite');
    expect(t.dc.value).toBeNull();
    expect(t.message).toMatch(/M1\.gm/);
    // at 1 MHz the capacitor gives the node an impedance: T = gm/(jωC) (common practice)
    const w = 2 * Math.PI * 1e6;
    expect(t.points[0].value!.re).toBeCloseTo(0, 6);
    expect(t.points[0].value!.im).toBeCloseTo(-1e-3 / (w * 1e-12), 6);
    const d = discoverLoops(sys);
    expect(JSON.stringify(d.loops)).not.toMatch(/NaN|Infinity/);
  });

  it('a node with no path to ground at all: Blackman reports singular with a message', () => {
    const sys = build([Vsrc('V1', 'in', '0'), Gm('G1', 'a', '0', 'in', '0', 1e-3), R('R', 'a', 'b', 1e3)], { input: 'V1' });
    const b = blackmanAt(sys, 'G1.gm');
    expect(b.status).toBe('singular');
    expect(b.message).toMatch(/singular/);
    const m = loopMargins(sys, 'G1.gm');
    expect(m.status).not.toBe('ok');
    const r = analyzeFeedbackSystem(sys);
    expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
  });

  it('positive feedback is flagged, not given a phase margin', () => {
    // transconductor closed around its load with the wrong sign: T = −gm·R
    const sys = build([Vsrc('V1', 'in', '0'), Gm('G1', 'out', '0', 'in', 'out', 1e-3), R('RL', 'out', '0', 500), Cap('CL', 'out', '0', 1e-12)], { input: 'V1' });
    const [t] = returnRatios(sys);
    expect(t.dc.value!.re).toBeCloseTo(-0.5, 12);
    const m = loopMargins(sys, 'G1.gm');
    expect(m.status).toBe('positive-feedback');
    expect(m.phaseMarginDeg).toBeNull();
  });

  it('no controlled sources: no loops, nothing thrown', () => {
    const sys = build([Vsrc('V1', 'in', '0'), R('R', 'in', 'out', 1e3), Cap('C', 'out', '0', 1e-12)], { input: 'V1', output: { kind: 'voltage', node: 'out' } });
    const r = analyzeFeedbackSystem(sys);
    expect(r.loops).toEqual([]);
    expect(r.ok).toBe(true);
  });
});
