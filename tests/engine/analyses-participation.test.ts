import { describe, it, expect } from 'vitest';
import { Hand } from './analyses-handmna';
import { computePoles } from '../../src/engine/analyses/poles';
import { poleParticipation } from '../../src/engine/analyses/participation';
import { modalSolver } from '../../src/engine/analyses/modal';
import { eigenvectorPair } from '../../src/engine/linalg/eigvec';

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

  it('vectors from the shared Hessenberg reduction match full inverse iteration per pole (Wilkinson 1965)', () => {
    // Doubly terminated 5th-order ladder with a buffer stage: complex pairs, an inductor branch, a source branch.
    const h = new Hand().V('vs', 'src', '0').R('rs', 'src', 'n1', 1);
    const g = [0.618, 1.618, 2, 1.618, 0.618];
    h.C('c1', 'n1', '0', g[0]).L('l2', 'n1', 'n2', g[1]).C('c3', 'n2', '0', g[2]).L('l4', 'n2', 'n3', g[3]).C('c5', 'n3', '0', g[4]).R('rl', 'n3', '0', 1);
    h.G('gb', 'o', '0', 'n3', '0', 2).R('ro', 'o', '0', 1).C('co', 'o', '0', 0.1);
    const sys = h.build('vs', 'o');
    const poles = computePoles(sys).poles;
    const m = modalSolver(sys.G, sys.C, sys.n)!;
    const A = sys.G.map((v) => -v);
    for (const p of poles) {
      const q = m.vectors(p)!;
      const e = eigenvectorPair(A, sys.C, sys.n, p);
      expect(q.residual).toBeLessThan(1e-12);
      for (let k = 0; k < sys.n; k++) {
        expect(Math.abs(Math.hypot(q.rightRe[k], q.rightIm[k]) - Math.hypot(e.rightRe[k], e.rightIm[k]))).toBeLessThan(1e-9);
        expect(Math.abs(Math.hypot(q.leftRe[k], q.leftIm[k]) - Math.hypot(e.leftRe[k], e.leftIm[k]))).toBeLessThan(1e-9);
      }
    }
  });

  it('stiff cascade (τ = 1e-12 … 1 s): every pole still lives entirely at its own node (fast vectors fall back where unreliable)', () => {
    const h = new Hand().V('vin', 's0', '0');
    for (let k = 0; k <= 12; k++) h.G(`g${k}`, `s${k + 1}`, '0', `s${k}`, '0', 1e-3).R(`r${k}`, `s${k + 1}`, '0', 1e3).C(`c${k}`, `s${k + 1}`, '0', Math.pow(10, -12 + k) / 1e3);
    const sys = h.build('vin', 's13');
    const poles = computePoles(sys).poles;
    const part = poleParticipation(sys, poles);
    poles.forEach((p, i) => {
      // Stage k has τ = 10^(−12+k) at node s(k+1): the node index is log10(τ) + 13.
      const own = `s${Math.round(Math.log10(-1 / p.re)) + 13}`;
      expect(part[i].nodes[0].node).toBe(own);
      expect(part[i].nodes[0].share).toBeCloseTo(1, 6);
    });
  });
});
