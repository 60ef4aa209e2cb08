import { describe, it, expect } from 'vitest';
import { analyzeFeedback } from '../../src/engine/feedback/index';
import { feedbackReport, takeFeedbackArgs } from '../../src/engine/feedback/cli';
import type { Netlist } from '../../src/engine/types';

// Invented regulated cascode current source, direct small-signal values (no process card).
function regulated(A0: number): Netlist {
  return {
    format: 'polesketch-netlist', version: 1, title: 'regulated cascode (invented values)',
    input: 'Itest', output: { kind: 'voltage', node: 'out' },
    parts: [
      { name: 'Itest', kind: 'isource', pins: { p: 'out', n: '0' }, values: {} },
      { name: 'M1', kind: 'nmos', pins: { d: 'x', g: '0', s: '0' }, values: { gm: '1m', ro: '100k' } },
      { name: 'M2', kind: 'nmos', pins: { d: 'out', g: 'g2', s: 'x' }, values: { gm: '1m', ro: '100k', cgs: '20f' } },
      { name: 'A1', kind: 'amplifier', pins: { out: 'g2', inp: '0', inn: 'x' }, values: { A0: String(A0), p1: '5M', rout: '10k' } },
      { name: 'Cout', kind: 'capacitor', pins: { p: 'out', n: '0' }, values: { value: '200f' } },
      { name: 'Cx', kind: 'capacitor', pins: { p: 'x', n: '0' }, values: { value: '50f' } },
    ],
  };
}

describe('feedback API on an engine netlist', () => {
  it('finds the amplifier loop, keys it at A1.A0 and reports what it holds (Razavi, regulated cascode)', () => {
    const A = 100;
    const r = analyzeFeedback(regulated(A));
    expect(r.ok).toBe(true);
    const g = r.loops.find((l) => l.loop.kind === 'global' && l.loop.key === 'A1.A0')!;
    expect(g).toBeDefined();
    expect(g.loop.nets).toEqual(['g2', 'x']);
    expect(g.regulation.holdsCurrent!.node).toBe('out');
    // output impedance raised by about (1 + A): Blackman factor at out within 5 % of 1 + A
    expect(Math.abs(g.regulation.holdsCurrent!.factor / (1 + A) - 1)).toBeLessThan(0.05);
    expect(g.margins.unityGainHz).not.toBeNull();
    expect(r.caution).toMatch(/small-signal/);
    expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
    for (const l of r.loops) {
      if (l.margins.phaseMarginDeg === null) continue;
      expect(l.margins.phaseMarginDeg).toBeGreaterThan(-180);
      expect(l.margins.phaseMarginDeg).toBeLessThanOrEqual(180);
    }
    // the transfer is Z(out) (test current in): the step settles to its DC value
    expect(r.step!.status).toBe('ok');
    expect(r.step!.settling.map((x) => x.tolerance)).toEqual([1e-2, 1e-3, 1e-4]);
  });

  it('off by part name switches the key source off and names unknown ones', () => {
    const r = analyzeFeedback(regulated(100), { off: ['A1'] });
    expect(r.off).toEqual(['A1.A0']);
    expect(r.loops.some((l) => l.loop.key === 'A1.A0')).toBe(false);
    // a loop id or label names its key first: switching it off zeroes that source
    expect(analyzeFeedback(regulated(100), { off: ['A1.A0>M2.gm'] }).off).toEqual(['A1.A0']);
    expect(analyzeFeedback(regulated(100), { off: ['A1 → M2'] }).off).toEqual(['A1.A0']);
    const bad = analyzeFeedback(regulated(100), { off: ['Q7'] });
    expect(bad.ok).toBe(false);
    expect(bad.issues[0].message).toMatch(/Q7/);
  });

  it('bad netlist input comes back as named issues, not a throw', () => {
    const nl = regulated(100);
    nl.parts[1].values = { gm: 'abc' };
    const r = analyzeFeedback(nl);
    expect(r.ok).toBe(false);
    expect(r.issues.some((i) => i.part === 'M1')).toBe(true);
  });

  it('CLI options: --loops --off A1 --compare --locus A1 give the A/B and the locus', () => {
    const { rest, args } = takeFeedbackArgs(['file.json', '--loops', '--off', 'A1', '--compare', '--locus', 'A1', '--kmax', '5']);
    expect(rest).toEqual(['file.json']);
    const rep = feedbackReport(regulated(100), args!);
    expect(rep.errors).toEqual([]);
    const text = rep.lines.join('\n');
    expect(text).toMatch(/A1\.A0>/);
    expect(text).toMatch(/holds the current into out/);
    expect(text).toMatch(/Off: A1\.A0/);
    expect(text).toMatch(/Root locus of A1\.A0, k = 0 … 5/);
    // switching the regulation off lowers |Z(out)| at DC by about (1 + A) (Razavi)
    const out = rep.json.comparison!.nodes.find((n) => n.node === 'out')!;
    expect(Math.abs(out.dcOhmsBefore! / out.dcOhmsAfter! / 101 - 1)).toBeLessThan(0.05);
    expect(rep.json.locus!.k[rep.json.locus!.k.length - 1]).toBe(5);
    expect(takeFeedbackArgs(['f', '--compare']).args!.problems[0]).toMatch(/--off/);
    expect(takeFeedbackArgs(['f', '--kmax', 'x']).args!.problems[0]).toMatch(/kmax/);
  });
});
