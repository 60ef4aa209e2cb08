import { describe, it, expect } from 'vitest';
import { Hand } from './analyses-handmna';
import { computePoles } from '../../src/engine/analyses/poles';
import { poleParticipation } from '../../src/engine/analyses/participation';

describe('pole participation', () => {
  it('a one-way cascade has participation 1 of each pole at its own node (Pérez-Arriaga, Verghese & Schweppe 1982: triangular systems)', () => {
    const R1 = 20e3, C1 = 1e-12, R2 = 3e3, C2 = 7e-12;
    const sys = new Hand().V('vin', 'in', '0')
      .G('g1', 'a', '0', 'in', '0', 1e-3).R('r1', 'a', '0', R1).C('c1', 'a', '0', C1)
      .G('g2', 'b', '0', 'a', '0', 2e-3).R('r2', 'b', '0', R2).C('c2', 'b', '0', C2)
      .build('vin', 'b');
    const poles = computePoles(sys).poles;
    const part = poleParticipation(sys, poles);
    expect(part.length).toBe(2);
    for (const [i, p] of poles.entries()) {
      const expected = Math.abs(p.re * R1 * C1 + 1) < 1e-6 ? 'a' : 'b';
      expect(part[i].method).toBe('left-right');
      expect(part[i].nodes[0].node).toBe(expected);
      expect(part[i].nodes[0].share).toBeCloseTo(1, 8);
    }
  });

  it('shares over the nodes sum to 1 and a conjugate pair shares one entry (common practice)', () => {
    // Series RLC, R = 1 Ω, L = 1 H, C = 1 F: poles −½ ± j·√3/2 (common practice).
    const sys = new Hand().V('vs', 'src', '0').R('r', 'src', 'm', 1).L('l', 'm', 'out', 1).C('c', 'out', '0', 1).build('vs', 'out');
    const poles = computePoles(sys).poles;
    expect(poles.length).toBe(2);
    expect(poles[0].q!).toBeCloseTo(1, 10);
    const part = poleParticipation(sys, poles, { top: 10 });
    const sum = part[0].nodes.reduce((s, x) => s + x.share, 0);
    expect(sum).toBeCloseTo(1, 12);
    expect(part[1].nodes).toEqual(part[0].nodes);
  });

  it('the CS stage: the dominant pole lives at the loaded output, the second at the gate (Razavi, CS stage dominant-pole view)', () => {
    const sys = new Hand().V('vin', 'src', '0').R('rs', 'src', 'g', 1e3)
      .G('m1', 'out', '0', 'g', '0', 2e-3).R('rd', 'out', '0', 20e3)
      .C('cgs', 'g', '0', 50e-15).C('cgd', 'g', 'out', 5e-15).C('cl', 'out', '0', 2e-12)
      .build('vin', 'out');
    const poles = computePoles(sys).poles;
    const part = poleParticipation(sys, poles);
    expect(part[0].nodes[0].node).toBe('out');
    expect(part[1].nodes[0].node).toBe('g');
  });
});
