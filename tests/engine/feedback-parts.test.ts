import { describe, it, expect } from 'vitest';
import { det, complex, matrix } from 'mathjs';
import type { Complex } from 'mathjs';
import { discoverLoops } from '../../src/engine/feedback/loops';
import { buildPartGraph, partClosures, partCycleGain, localGain } from '../../src/engine/feedback/partGraph';
import { build, R, Cap, Gm, Vsrc, nmos } from './feedback-fixtures';

// Regulated cascode with body effect and gate–source capacitances, so M2 has two sources (gm, gmb)
// and the booster's output reaches its input x also through M2's Cgs (a parallel path).
function regulatedWithBody(A: number, RL: number) {
  const Ra = 10e3;
  return build([
    ...nmos('M1', 'x', '0', '0', 1e-3, 100e3),
    ...nmos('M2', 'out', 'gx', 'x', 1e-3, 100e3, 2e-4),
    Gm('A1', '0', 'gx', '0', 'x', A / Ra, 'A0'), R('A1.ro', 'gx', '0', Ra),
    R('RL', 'out', '0', RL),
    Cap('Cgs2', 'gx', 'x', 30e-15), Cap('Cx', 'x', '0', 50e-15), Cap('Cg', 'gx', '0', 100e-15), Cap('Co', 'out', '0', 200e-15),
  ]);
}

describe('part-level loops', () => {
  it('regulated cascode: exactly one global loop A1 → M2 and the local loop of M2 (Gray, Hurst, Lewis & Meyer, regulated cascode)', () => {
    const A = 40, RL = 100e3;
    const d = discoverLoops(regulatedWithBody(A, RL));
    const global = d.loops.filter((l) => l.kind === 'global');
    expect(global.length).toBe(1);
    const g = global[0];
    expect(g.parts).toEqual(['A1', 'M2']);
    expect(g.label).toBe('A1 → M2');
    expect(g.key).toBe('A1.A0');
    expect(g.members.map((m) => m.id)).toEqual(['A1.A0', 'M2.gm']);
    expect(g.sources.map((m) => m.id)).toEqual(['A1.A0', 'M2.gm', 'M2.gmb']);
    expect(g.nets).toEqual(['gx', 'x']);
    // A1's own path back to x through Cgs2 is the same loop as drawn: folded in, not listed apart
    expect(g.variants).toContain('A1');
    const local = d.loops.filter((l) => l.kind === 'local');
    expect(local.map((l) => l.parts)).toEqual([['M2']]);
    expect(d.loops.length).toBe(2);
    // booster loop broken at A1 (hand nodal analysis of the small-signal model, common practice):
    // T = A·gm2 / (gm2 + gmb2 + 1/ro1 + 1/ro2 + RL/(ro1·ro2)) — A times a divider factor
    const gm2 = 1e-3, gmb2 = 2e-4, go = 1e-5;
    expect(g.returnRatioDc.value!.re).toBeCloseTo((A * gm2) / (gm2 + gmb2 + 2 * go + RL * go * go), 8);
  });

  it('part gains factor the determinant: det(I − D) = det(I − D_AA)·det(I − D_MM)·(1 + T_cycle) (Schur complement; checked with mathjs det)', () => {
    const sys = regulatedWithBody(40, 100e3);
    const d = discoverLoops(sys, { freqsHz: [1e6, 3e8] });
    const g = d.graph;
    const pg = buildPartGraph(g);
    const cl = partClosures(g, pg);
    const N = g.stamps.length;
    const a = pg.parts.indexOf('A1'), m = pg.parts.indexOf('M2');
    expect(pg.parts.length).toBe(2); // M1's control is grounded: it closes no loop
    for (let fi = 0; fi < g.fHz.length; fi++) {
      const rows = Array.from({ length: N }, (_, i) => Array.from({ length: N }, (_, j) =>
        complex((i === j ? 1 : 0) - g.re[fi][i * N + j], -g.im[fi][i * N + j])));
      const full = det(matrix(rows)) as unknown as Complex;
      const la = localGain(cl, a, fi), lm = localGain(cl, m, fi), t = partCycleGain(g, pg, cl, [a, m], fi)!;
      const mul = (x: { re: number; im: number }, y: { re: number; im: number }) => ({ re: x.re * y.re - x.im * y.im, im: x.re * y.im + x.im * y.re });
      const prod = mul(mul({ re: 1 + la.re, im: la.im }, { re: 1 + lm.re, im: lm.im }), { re: 1 + t.re, im: t.im });
      const scale = Math.hypot(full.re, full.im);
      expect(Math.abs(prod.re - full.re) / scale).toBeLessThan(1e-10);
      expect(Math.abs(prod.im - full.im) / scale).toBeLessThan(1e-10);
    }
  });

  it('degenerated common-source stage: its local loop gm·Rs·ro/(ro + Rs + RD) (common practice, Gm = gm/(1 + gm·Rs) for ro → ∞)', () => {
    const gm = 2e-3, ro = 50e3, Rs = 1e3, RD = 10e3;
    const sys = build([Vsrc('V1', 'in', '0'), ...nmos('M1', 'd', 'in', 's', gm, ro), R('RS', 's', '0', Rs), R('RD', 'd', '0', RD)], { input: 'V1' });
    const d = discoverLoops(sys);
    expect(d.loops.length).toBe(1);
    expect(d.loops[0].kind).toBe('local');
    expect(d.loops[0].nets).toEqual(['s']);
    expect(d.loops[0].cycleGainDc.re).toBeCloseTo((gm * Rs * ro) / (ro + Rs + RD), 9);
  });

  it('diode-connected device: local loop gm·(ro ∥ R), so its node sits at 1/gm ∥ ro ∥ R (common practice)', () => {
    const gm = 1e-3, ro = 40e3, Rb = 20e3;
    const sys = build([Vsrc('V1', 'in', '0'), R('Rin', 'in', 'd', Rb), ...nmos('M1', 'd', 'd', '0', gm, ro)], { input: 'V1' });
    const d = discoverLoops(sys);
    expect(d.loops.length).toBe(1);
    expect(d.loops[0].kind).toBe('local');
    expect(d.loops[0].cycleGainDc.re).toBeCloseTo(gm / (1 / ro + 1 / Rb), 9);
  });

  it('two-stage Miller amplifier in unity feedback: the global loop gm1R1·gm2R2 and the Miller local loop only at high frequency (Gray & Meyer, Miller compensation)', () => {
    const gm1 = 100e-6, R1 = 2e6, gm2 = 1e-3, R2 = 200e3;
    const sys = build([
      Vsrc('Vin', 'in', '0'),
      Gm('G1', 'x', '0', 'in', 'out', gm1), R('R1', 'x', '0', R1), Cap('C1', 'x', '0', 50e-15),
      Gm('G2', 'out', '0', 'x', '0', gm2), R('R2', 'out', '0', R2), Cap('CL', 'out', '0', 2e-12),
      Cap('Cc', 'x', 'out', 1e-12),
    ], { input: 'Vin' });
    const d = discoverLoops(sys);
    const global = d.loops.filter((l) => l.kind === 'global');
    expect(global.length).toBe(1);
    expect(global[0].parts).toEqual(['G1', 'G2']);
    expect(global[0].returnRatioDc.value!.re).toBeCloseTo(gm1 * R1 * gm2 * R2, 4);
    const miller = d.loops.filter((l) => l.kind === 'local');
    expect(miller.map((l) => l.parts[0])).toEqual(['G2']);
    expect(miller[0].cycleGainDc.re).toBe(0); // closed only through Cc: nothing at DC
    expect(miller[0].band!.fromHz).toBeGreaterThan(0);
    // the first stage's own path through Cc to its inverting input is the same loop: folded into it
    expect(global[0].variants).toContain('G1');
  });
});

describe('loop return ratios read from the coupling graph', () => {
  it('equal Bode\'s definition applied literally (source removed, unit control, returned control; Bode 1945)', async () => {
    const { returnRatioDirect } = await import('../../src/engine/feedback/returnRatio');
    const { sourceStamps } = await import('../../src/engine/feedback/pencil');
    const sys = regulatedWithBody(40, 100e3);
    const d = discoverLoops(sys, { freqsHz: [1e5, 1e7, 1e9] });
    const stamps = sourceStamps(sys);
    for (const l of d.loops) {
      const s = stamps.find((x) => x.id === l.key)!;
      const pts = [l.returnRatio.dc, ...l.returnRatio.points];
      d.fHz.forEach((f, i) => {
        const ref = returnRatioDirect(sys, sys.G, s, 2 * Math.PI * f).value!;
        const got = pts[i].value!;
        expect(Math.hypot(got.re - ref.re, got.im - ref.im) / Math.hypot(ref.re, ref.im)).toBeLessThan(1e-9);
      });
    }
  });
});
