// The feedback engine's fast paths against an independent solver (ml-matrix, real LU on the
// equivalent 2n × 2n real system [[G, −ωC], [ωC, G]] for a complex frequency):
//  - margins' crossing search on the Hessenberg form (reduced.ts, Laub 1981): a = vᵀ(G + jωC)⁻¹u;
//  - the split network worked from the full network's factor (splitBorder.ts, Woodbury + Schur
//    complement): the impedance looking into a part at a node, with the key source in place and
//    removed, on a netlist where that part's pin is moved to a node of its own.
import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { buildMna } from '../../src/engine/index';
import type { MnaSystem } from '../../src/engine/types';
import { PencilAt, scaledG, sourceStamps, uVector, vVector } from '../../src/engine/feedback/pencil';
import { ReducedPencil } from '../../src/engine/feedback/reduced';
import { portFactor, splitNetwork } from '../../src/engine/feedback/portInto';
import { boostedChain } from '../bench/feedback-bench';

/** x = (G + jωC)⁻¹b by ml-matrix on the real 2n system (independent of the engine's LU). */
function refSolve(G: Float64Array, C: Float64Array, n: number, omega: number, b: Float64Array): { re: number[]; im: number[] } {
  const A = new Matrix(2 * n, 2 * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      A.set(i, j, G[i * n + j]); A.set(i, n + j, -omega * C[i * n + j]);
      A.set(n + i, j, omega * C[i * n + j]); A.set(n + i, n + j, G[i * n + j]);
    }
  }
  const rhs = Matrix.zeros(2 * n, 1);
  for (let i = 0; i < n; i++) rhs.set(i, 0, b[i]);
  const x = solve(A, rhs);
  return { re: Array.from({ length: n }, (_, i) => x.get(i, 0)), im: Array.from({ length: n }, (_, i) => x.get(n + i, 0)) };
}

const rel = (a: { re: number; im: number }, b: { re: number; im: number }) =>
  Math.hypot(a.re - b.re, a.im - b.im) / Math.max(Math.hypot(b.re, b.im), 1e-300);

describe('Hessenberg-form loop transmission (margins fast path)', () => {
  it('vᵀ(G + jωC)⁻¹u of every source matches ml-matrix from 1 kHz to 100 GHz on a boosted chain', () => {
    const sys = buildMna(boostedChain(3)).system!;
    const rp = ReducedPencil.of(sys.G, sys.C, sys.n)!;
    expect(rp).not.toBeNull();
    let checked = 0;
    for (const s of sourceStamps(sys)) {
      const rows = [s.cp, s.cn].filter((v) => v >= 0);
      const w = [s.cp >= 0 ? 1 : 0, s.cn >= 0 ? -1 : 0].filter((v) => v !== 0);
      const bt = rp.input(uVector(s, sys.n)), ct = rp.output(rows, w);
      const v = vVector(s, sys.n);
      for (const f of [1e3, 1e6, 1e8, 1e10, 1e11]) {
        const omega = 2 * Math.PI * f;
        const fast = rp.transfer(bt, ct, omega);
        if (!fast) continue; // refused points go to the direct solve
        const x = refSolve(sys.G, sys.C, sys.n, omega, uVector(s, sys.n));
        let re = 0, im = 0;
        for (let i = 0; i < sys.n; i++) { re += v[i] * x.re[i]; im += v[i] * x.im[i]; }
        expect(rel(fast, { re, im })).toBeLessThan(1e-8);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(50);
  });
});

/** The chain with `part`'s `pin` moved to a node "dx" of its own: the impedance at dx is the
 *  impedance looking into the part (the rest of the network stays on the original node). */
function withPinMoved(stages: number, part: string, pin: string): MnaSystem {
  const nl = boostedChain(stages);
  const p = nl.parts.find((x) => x.name === part)!;
  p.pins = { ...p.pins, [pin]: 'dx' };
  return buildMna(nl).system!;
}

describe('split network from the full factor (Woodbury, Schur complement)', () => {
  for (const fHz of [0, 3e7]) {
    it(`impedance into a boosted cascode's drain, key in place and removed, matches ml-matrix at ${fHz} Hz`, () => {
      const sys = buildMna(boostedChain(3)).system!;
      const node = sys.nodeNames.indexOf('o2');
      const omega = 2 * Math.PI * fHz;
      const full = new PencilAt(sys.G, sys.C, sys.n, omega);
      const split = splitNetwork(sys, 'M2b', node, { fHz, full })!;
      expect(split.border).not.toBeNull();
      const ref = withPinMoved(3, 'M2b', 'd');
      const X = ref.nodeNames.indexOf('dx');
      const e = new Float64Array(ref.n); e[X] = 1;
      const z = refSolve(ref.G, ref.C, ref.n, omega, e);
      const zRef = { re: z.re[X], im: z.im[X] };
      expect(rel(split.z, zRef)).toBeLessThan(1e-6);
      // Blackman's factor Z/Z⁰ into the part for the booster and for the cascode's own gm
      for (const key of ['A2.A0', 'M2b.gm']) {
        const pf = portFactor(sys, key, split)!;
        const G0 = scaledG(ref, sourceStamps(ref), { [key]: 0 });
        const z0 = refSolve(G0, ref.C, ref.n, omega, e);
        const z0Ref = { re: z0.re[X], im: z0.im[X] };
        expect(rel(pf.z0, z0Ref)).toBeLessThan(1e-6);
        const q = z0Ref.re * z0Ref.re + z0Ref.im * z0Ref.im;
        const factorRef = { re: (zRef.re * z0Ref.re + zRef.im * z0Ref.im) / q, im: (zRef.im * z0Ref.re - zRef.re * z0Ref.im) / q };
        expect(rel(pf.factor, factorRef)).toBeLessThan(1e-6);
      }
    });
  }
});
