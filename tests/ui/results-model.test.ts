// Pure helpers of the results panels: pole rows (pairs once, carriers), A/B pole pairing and
// node changes, loop grouping and warnings, number text.
import { describe, it, expect } from 'vitest';
import { analyze } from '../../src/engine/index';
import type { AnalysisResult, Netlist } from '../../src/engine/index';
import { analyzeFeedback } from '../../src/engine/feedback/index';
import type { FeedbackResult } from '../../src/engine/feedback/index';
import { poleRows, polesOfNet } from '../../src/panels/results/poleRows';
import { compareResults, migrationsOf } from '../../src/panels/results/compareModel';
import { loopGroups, groupOf, PM_WARN_DEG } from '../../src/panels/results/loopRows';
import { fmtRatio, fmtHz, fmtOhms, fmtNum, toDb, NONE } from '../../src/panels/results/format';
import { impedanceInput, gainUnit } from '../../src/panels/results/plotInputs';
import regulatedJson from '../../src/examples/netlists/readout-cascode-regulated.json';
const regulated = regulatedJson as unknown as Netlist;

// Series RLC driven by a source, output across C: H = 1/(s²LC + sRC + 1); ωn = 1/√(LC),
// Q = (1/R)·√(L/C) (textbook second-order section).
function rlc(r: string): Netlist {
  return {
    format: 'polesketch-netlist', version: 1, input: 'V1', output: { kind: 'voltage', node: 'out' },
    parts: [
      { name: 'V1', kind: 'vsource', pins: { p: 'in', n: '0' }, values: {} },
      { name: 'R1', kind: 'resistor', pins: { p: 'in', n: 'm' }, values: { value: r } },
      { name: 'L1', kind: 'inductor', pins: { p: 'm', n: 'out' }, values: { value: '1u' } },
      { name: 'C1', kind: 'capacitor', pins: { p: 'out', n: '0' }, values: { value: '1n' } },
    ],
  };
}

describe('pole rows', () => {
  it('show a conjugate pair once with its Q, and carriers by share', () => {
    const r = analyze(rlc('10'));
    const rows = poleRows(r.poles, r.participation);
    expect(r.poles).toHaveLength(2);
    expect(rows).toHaveLength(1);
    expect(rows[0].indices).toHaveLength(2);
    expect(rows[0].pole.im).toBeGreaterThan(0);
    const wn = 1 / Math.sqrt(1e-6 * 1e-9);
    expect(rows[0].pole.hz).toBeCloseTo(wn / (2 * Math.PI), 0);
    expect(rows[0].pole.q!).toBeCloseTo((1 / 10) * Math.sqrt(1e-6 / 1e-9), 6);
    expect(rows[0].carriers.length).toBeGreaterThan(0);
    const byNet = polesOfNet(rows);
    for (const c of rows[0].carriers) expect(byNet.get(c.node)).toEqual([rows[0].id]);
  });

  it('keep two real poles apart when Q < 0.5 (overdamped section)', () => {
    const r = analyze(rlc('1k')); // Q = 0.0316 < 1/2: two real poles (textbook)
    const rows = poleRows(r.poles, r.participation);
    expect(rows).toHaveLength(2);
    expect(rows.every((x) => x.pole.kind === 'real')).toBe(true);
  });
});

describe('A/B comparison', () => {
  it('pairs each pole with its continuation and reads the move as a ratio', () => {
    const a = analyze(rlc('10'));
    const b = analyze(rlc('20'));
    const c = compareResults(a, b);
    // Same L and C: ωn unchanged (1/√(LC)), Q halves.
    expect(c.poles).toHaveLength(1);
    expect(c.poles[0].ratio!).toBeCloseTo(1, 9);
    expect(c.poles[0].b!.q! / c.poles[0].a!.q!).toBeCloseTo(0.5, 6);
    // DC gain of the section is 1 in both (the capacitor is open at DC).
    expect(c.dcGain.a).toBeCloseTo(1, 9);
    expect(c.dcGain.ratio).toBeCloseTo(1, 9);
    // Migrations cover both members of the pair, conjugate to each other.
    const m = migrationsOf(c);
    expect(m).toHaveLength(2);
    expect(m[1].before!.im).toBeCloseTo(-m[0].before!.im, 3);
  });

  it('a pair that turns into two real poles: one is paired, the other is new', () => {
    const a = analyze(rlc('10'));
    const b = analyze(rlc('1k'));
    const c = compareResults(a, b);
    expect(c.poles).toHaveLength(2);
    expect(c.poles.filter((p) => p.a && p.b)).toHaveLength(1);
    expect(c.poles.filter((p) => !p.a && p.b)).toHaveLength(1);
  });

  it('node rows present only in one result are marked', () => {
    const a = analyze(rlc('10'));
    const b: AnalysisResult = { ...a, nodes: a.nodes.filter((n) => n.name !== 'm') };
    const c = compareResults(a, b);
    expect(c.nodes.find((n) => n.node === 'm')!.only).toBe('a');
  });
});

describe('loop groups', () => {
  const fb = analyzeFeedback(regulated);
  it('group the cycles of the regulated cascode by their key source', () => {
    const groups = loopGroups(fb);
    const keys = groups.map((g) => g.key);
    expect(new Set(keys).size).toBe(keys.length);
    const booster = groups.find((g) => g.key === 'A1.A0')!;
    expect(booster.cycles.length).toBe(fb.loops.filter((l) => l.loop.key === 'A1.A0').length);
    expect(booster.cycles[0].members.length).toBeLessThanOrEqual(booster.cycles[booster.cycles.length - 1].members.length);
    expect(booster.holds.join(' ')).toMatch(/holds the current into out/);
    expect(groupOf(groups, booster.cycles[booster.cycles.length - 1].id)).toBe(booster);
    expect(groupOf(groups, 'A1.A0')).toBe(booster);
    expect(groupOf(groups, 'no such loop')).toBeNull();
  });

  it('a loop open at DC (T(0) at roundoff) shows T(0) = 0 and no positive-feedback warning', () => {
    // The booster loop of the regulated cascode has no gain at DC: the open drain (ideal current
    // source load) carries no incremental current, so T(0) = 0 (from memory); a roundoff-sized
    // negative T(0) must not be called positive feedback.
    const booster = loopGroups(fb).find((x) => x.key === 'A1.A0')!;
    expect(booster.dcLoopGain).toBe(0);
    expect(booster.label).toMatch(/→/);
    expect(booster.band!.fromHz).toBeGreaterThan(0);
    const base = fb.loops.find((l) => l.loop.key === 'A1.A0')!;
    const tiny = (re: number): FeedbackResult => ({
      ...fb, boosters: [],
      loops: [{ ...base, margins: { ...base.margins, status: 'positive-feedback', message: 'T at DC is negative', dc: { re, im: 0 }, phaseMarginDeg: null, gainMarginDb: null } }],
    });
    const g = loopGroups(tiny(-2.75e-17))[0];
    expect(g.dcLoopGain).toBe(0);
    expect(g.warnings).toEqual([]);
    // a real negative T(0) is positive feedback and is flagged
    const p = loopGroups(tiny(-3))[0];
    expect(p.dcLoopGain).toBe(-3);
    expect(p.warnings).toContain('T at DC is negative');
  });

  it('flag a phase margin under 45° and a failed booster placement', () => {
    const base = fb.loops.find((l) => l.loop.key === 'A1.A0')!;
    const bad: FeedbackResult = {
      ...fb,
      loops: [{ ...base, margins: { ...base.margins, phaseMarginDeg: 30, gainMarginDb: 4 } }],
      boosters: fb.boosters.map((b) => ({ ...b, loopId: base.loop.id, ok: false, verdict: 'booster unity gain below the closed-loop bandwidth' })),
    };
    const g = loopGroups(bad)[0];
    expect(g.warnings.some((w) => w.includes(`under ${PM_WARN_DEG}°`))).toBe(true);
    expect(g.warnings.some((w) => w.includes('under 6 dB'))).toBe(true);
    expect(g.warnings).toContain('booster unity gain below the closed-loop bandwidth');
    const fine: FeedbackResult = { ...bad, loops: [{ ...base, margins: { ...base.margins, phaseMarginDeg: 60, gainMarginDb: 12 } }], boosters: [] };
    expect(loopGroups(fine)[0].warnings).toEqual([]);
  });
});

describe('number text and plot inputs', () => {
  it('ratios, SI figures and dashes for undefined values', () => {
    expect(fmtRatio(48)).toBe('× 48.0');
    expect(fmtRatio(1 / 47)).toBe('÷ 47.0');
    expect(fmtRatio(null)).toBe(NONE);
    expect(fmtRatio(0)).toBe(NONE);
    // SI prefixes (BIPM SI brochure, Table 7)
    expect(fmtHz(15.9155e6)).toBe('15.9 MHz');
    expect(fmtOhms(3.75e9)).toBe('3.75 GΩ');
    expect(fmtHz(null)).toBe(NONE);
    expect(fmtNum(Number.NaN)).toBe(NONE);
    expect(toDb(100)).toBeCloseTo(40, 12); // 20·log10(100) = 40 dB
  });

  it('impedance input is the magnitude of the node sweep; gain unit follows the source kind', () => {
    const r = analyze(rlc('10'), { impedanceSweep: true });
    const d = impedanceInput(r, 'out')!;
    const k = r.impedanceSweep!.nodes.indexOf('out');
    const z = r.impedanceSweep!.values[k][0]!;
    expect(d.ohms[0]).toBeCloseTo(Math.hypot(z.re, z.im), 9);
    expect(gainUnit(rlc('10'), r).unit).toBe('V/V');
    const rr = analyze(regulated);
    expect(gainUnit(regulated, rr).unit).toBe('Ω'); // current in, voltage out
  });
});

