import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { analyze, analyzeStaged, type Netlist } from '../../src/engine/index';

const dir = join(__dirname, '../../src/examples/netlists');
const examples = readdirSync(dir).filter((f) => f.endsWith('.json')).map((f) => [f, JSON.parse(readFileSync(join(dir, f), 'utf8')) as Netlist] as const);

const rc = (r: string, c: string): Netlist => ({
  format: 'polesketch-netlist', version: 1, input: 'Vin', output: { kind: 'voltage', node: 'out' },
  parts: [
    { name: 'Vin', kind: 'vsource', pins: { p: 'in', n: '0' }, values: {} },
    { name: 'Rs', kind: 'resistor', pins: { p: 'in', n: 'out' }, values: { value: r } },
    { name: 'Rl', kind: 'resistor', pins: { p: 'out', n: '0' }, values: { value: r } },
    { name: 'Cl', kind: 'capacitor', pins: { p: 'out', n: '0' }, values: { value: c } },
  ],
});

describe('analyzeStaged: overlay first, the rest on the same factorisations', () => {
  // Consistency with analyze() (engine contract: the staged result is the same result).
  it.each(examples)('%s: complete() equals analyze(), first carries the same poles and DC node figures', (_name, net) => {
    const whole = analyze(net);
    const staged = analyzeStaged(net);
    expect(staged.first.stage).toBe('overlay');
    const done = staged.complete();
    expect(done).toEqual(whole);
    expect(staged.first.poles).toEqual(whole.poles);
    expect(staged.first.nodes.map((r) => [r.name, r.dcOhms, r.farads, r.tau, r.poleHz, r.slowest]))
      .toEqual(whole.nodes.map((r) => [r.name, r.dcOhms, r.farads, r.tau, r.poleHz, r.slowest]));
    // The first stage leaves the later figures empty rather than guessing them.
    expect(staged.first.zeros).toEqual([]);
    expect(staged.first.sweep).toBeNull();
    expect(staged.first.participation).toEqual([]);
  });

  it('RC divider: first stage has Z(DC) = R ∥ R and the pole 1/(2π·(R∥R)·C) (common practice)', () => {
    const s = analyzeStaged(rc('10k', '1p'));
    const out = s.first.nodes.find((r) => r.name === 'out')!;
    expect(out.dcOhms).toBeCloseTo(5e3, 6);
    expect(s.first.poles[0].hz).toBeCloseTo(1 / (2 * Math.PI * 5e3 * 1e-12), 0);
    expect(out.z).toBeNull(); // no frequency asked: the column waits for the bandwidth
    const done = s.complete();
    expect(done.bandwidthHz).toBeCloseTo(1 / (2 * Math.PI * 5e3 * 1e-12), 0);
    expect(done.nodes.find((r) => r.name === 'out')!.z).not.toBeNull();
  });

  it('with a frequency asked, the first stage already has the impedance column there (common practice: R ∥ 1/jωC)', () => {
    const f = 1e7;
    const s = analyzeStaged(rc('10k', '1p'), { frequencyHz: f });
    const z = s.first.nodes.find((r) => r.name === 'out')!.z!;
    const wrc = 2 * Math.PI * f * 5e3 * 1e-12;
    expect(z.mag).toBeCloseTo(5e3 / Math.sqrt(1 + wrc * wrc), 6);
    expect(s.first.conditions.frequencyHz).toBe(f);
  });

  it('a structural error comes back at once from both stages, naming the node (engine contract)', () => {
    const net = rc('10k', '1p');
    net.parts.push({ name: 'Cf', kind: 'capacitor', pins: { p: 'float', n: 'float2' }, values: { value: '1p' } });
    const s = analyzeStaged(net);
    expect(s.first.ok).toBe(false);
    expect(s.first.issues.some((i) => i.severity === 'error' && /float/.test(i.message))).toBe(true);
    expect(s.complete()).toEqual(s.first);
  });
});
