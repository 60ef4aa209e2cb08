import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { analyze, type Netlist } from '../../src/engine/index';

// A cascade of common-source stages with direct small-signal values: stage k drives the next
// gate, with Cgs/Cgd/Cdb. Its DC gain is the product of the stage gains −gm·(RL ∥ ro), up to
// 1e16 here: far beyond 1/ulp's share that a careless pivot order can afford.
function cascade(stages: number, gm = 1e-3, rl = 20e3, gds = 20e-6): Netlist {
  const parts: Netlist['parts'] = [
    { name: 'Vin', kind: 'vsource', pins: { p: 'in', n: '0' }, values: {} },
    { name: 'Rs', kind: 'resistor', pins: { p: 'in', n: 'g0' }, values: { value: '1k' } },
  ];
  for (let k = 0; k < stages; k++) {
    const g = `g${k}`, d = `g${k + 1}`;
    parts.push(
      { name: `M${k}`, kind: 'nmos', pins: { d, g, s: '0' }, values: { gm: String(gm), gds: String(gds), cgs: '100f', cgd: '10f', cdb: '20f' } },
      { name: `RL${k}`, kind: 'resistor', pins: { p: d, n: '0' }, values: { value: String(rl) } },
    );
  }
  return { format: 'polesketch-netlist', version: 1, parts, input: 'Vin', output: { kind: 'voltage', node: `g${stages}` } };
}

describe('high-gain cascades keep their DC figures', () => {
  it.each([6, 10, 14])('%i stages: DC gain = Π(−gm·(RL ∥ ro)), every drain sees RL ∥ ro (common practice: cascade gain, Ohm)', (stages) => {
    const gm = 1e-3, rl = 20e3, gds = 20e-6;
    const r = analyze(cascade(stages, gm, rl, gds));
    expect(r.ok).toBe(true);
    const rOut = 1 / (1 / rl + gds);
    const expected = Math.pow(-gm * rOut, stages);
    expect(r.dcGain).not.toBeNull();
    expect(Math.abs(r.dcGain! - expected)).toBeLessThan(1e-9 * Math.abs(expected));
    for (let k = 1; k <= stages; k++) {
      const row = r.nodes.find((n) => n.name === `g${k}`)!;
      expect(row.openAtDc).toBe(false);
      expect(Math.abs(row.dcOhms! - rOut)).toBeLessThan(1e-9 * rOut);
    }
    // No phantom integrator: G is regular, so no pole sits at s = 0.
    expect(r.poleInfo.originCount).toBe(0);
    expect(r.zeroInfo.status).not.toBe('identically-zero');
    expect(r.bandwidthHz).not.toBeNull();
    // Low on the sweep the response is the DC gain (common practice).
    const first = r.sweep!.magDb[0]!;
    expect(Math.abs(first - 20 * Math.log10(Math.abs(expected)))).toBeLessThan(0.01);
  });

  it('poles double precision cannot place are named in a warning; the shipped examples get none (Higham & Higham 1998 condition number)', () => {
    const shaky = analyze(cascade(22));
    const w = shaky.issues.find((i) => i.code === 'ill-conditioned');
    expect(w).toBeDefined();
    expect(w!.severity).toBe('warning');
    expect(w!.node).toMatch(/^g\d+$/);
    const dir = join(__dirname, '../../src/examples/netlists');
    for (const f of readdirSync(dir).filter((x) => x.endsWith('.json'))) {
      const r = analyze(JSON.parse(readFileSync(join(dir, f), 'utf8')) as Netlist);
      expect(r.issues.filter((i) => i.code === 'ill-conditioned')).toEqual([]);
    }
  });
});
