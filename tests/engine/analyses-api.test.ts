import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { analyze, type Netlist } from '../../src/engine/index';

const dir = 'src/examples/netlists';
const load = (f: string) => JSON.parse(readFileSync(`${dir}/${f}`, 'utf8')) as Netlist;

// Demo process card numbers (src/engine/process.ts) and the square-law relations of the MOS stamp
// (gm = gmid·Id, gds = (λL/L)·Id, gmb = η·gm; Razavi, Design of Analog CMOS ICs, ch. 2).
const N = { lambdaL: 0.09e-6, eta: 0.21 };

function hasNonFinite(v: unknown): boolean {
  if (typeof v === 'number') return !Number.isFinite(v);
  if (Array.isArray(v)) return v.some(hasNonFinite);
  if (v && typeof v === 'object') return Object.values(v).some(hasNonFinite);
  return false;
}

describe('analyze() on the examples', () => {
  for (const f of readdirSync(dir).filter((x) => x.endsWith('.json'))) {
    it(`${f}: computes without errors, no NaN or Infinity anywhere`, () => {
      const r = analyze(load(f));
      expect(r.issues.filter((i) => i.severity === 'error')).toEqual([]);
      expect(r.ok).toBe(true);
      expect(r.poles.length).toBeGreaterThan(0);
      expect(r.nodes.length).toBe(r.unknowns.nodes);
      expect(hasNonFinite(r)).toBe(false);
      expect(r.caution).toMatch(/small-signal/);
      expect(r.participation.length).toBe(r.poles.length);
    });
  }

  it('cascode current source: DC transfer (test current → v(out)) is ro1 + ro2 + (gm2 + gmb2)·ro1·ro2 (Gray, Hurst, Lewis & Meyer)', () => {
    const gm = 12 * 20e-6;
    const ro1 = 1 / ((N.lambdaL / 1e-6) * 20e-6);
    const ro2 = 1 / ((N.lambdaL / 0.5e-6) * 20e-6);
    const rout = ro1 + ro2 + (gm + N.eta * gm) * ro1 * ro2;
    const r = analyze(load('readout-cascode-source.json'));
    expect(r.dcGain! / rout).toBeCloseTo(1, 10);
    expect(r.nodes.find((n) => n.name === 'out')!.dcOhms! / rout).toBeCloseTo(1, 10);
    // Single dominant pole at the output: Rout·Cout, with Cout the load plus device capacitance.
    const out = r.nodes.find((n) => n.name === 'out')!;
    expect(out.slowest).toBe(true);
  });

  it('regulated cascode: ro1 + ro2 + ((1 + A)·gm2 + gmb2)·ro1·ro2 (Gray, Hurst, Lewis & Meyer)', () => {
    const gm = 12 * 20e-6, A = 100;
    const ro1 = 1 / ((N.lambdaL / 1e-6) * 20e-6);
    const ro2 = 1 / ((N.lambdaL / 0.5e-6) * 20e-6);
    const rout = ro1 + ro2 + ((1 + A) * gm + N.eta * gm) * ro1 * ro2;
    const r = analyze(load('readout-cascode-regulated.json'));
    expect(r.dcGain! / rout).toBeCloseTo(1, 9);
    // Switching the error amplifier off gives back the plain cascode (A = 0).
    const off = analyze(load('readout-cascode-regulated.json'), { off: ['A1'] });
    expect(off.conditions.off).toContain('A1.A0');
    expect(off.dcGain! / (ro1 + ro2 + (gm + N.eta * gm) * ro1 * ro2)).toBeCloseTo(1, 9);
  });

  it('source follower: Rout = 1/(gm + gmb + gds1 + gds2) and gain gm·Rout (Razavi, source follower)', () => {
    const gm = 10 * 100e-6, gmb = N.eta * gm;
    const gds1 = (N.lambdaL / 0.3e-6) * 100e-6, gds2 = (N.lambdaL / 1e-6) * 100e-6;
    const rout = 1 / (gm + gmb + gds1 + gds2);
    const r = analyze(load('follower-sampling-load.json'));
    expect(r.nodes.find((n) => n.name === 'out')!.dcOhms! / rout).toBeCloseTo(1, 10);
    expect(r.dcGain! / (gm * rout)).toBeCloseTo(1, 10);
    // The 2 pF sampling capacitor behind 300 Ω is the slowest node: τ ≈ (Rout + 300 Ω)·2 pF.
    const samp = r.nodes.find((n) => n.name === 'samp')!;
    expect(samp.slowest).toBe(true);
    expect(samp.dcOhms! / (rout + 300)).toBeCloseTo(1, 10);
  });

  it('two-stage amplifier in unity feedback: DC gain A/(1 + A), A = gm1·R1·gm2·R2 (common practice)', () => {
    const A = 100e-6 * 2e6 * 1e-3 * 200e3;
    const r = analyze(load('two-stage-miller-unity.json'));
    expect(r.dcGain! / (A / (1 + A))).toBeCloseTo(1, 10);
    expect(r.poles.every((p) => p.re < 0)).toBe(true);
    // Miller compensation's feedforward path gives one RHP zero at gm2/Cc; unity feedback keeps
    // the forward path's zeros (Gray & Meyer, two-stage op-amp compensation).
    expect(r.zeros.length).toBe(1);
    expect(r.zeros[0].re / (1e-3 / 1e-12)).toBeCloseTo(1, 9);
    expect(r.zeros[0].rhp).toBe(true);
    // Closed-loop bandwidth near the open-loop gain-bandwidth gm1/(2π·Cc) ≈ 15.9 MHz (common
    // practice); the non-dominant pole moves it, so only the order of magnitude is checked.
    expect(r.bandwidthHz!).toBeGreaterThan(8e6);
    expect(r.bandwidthHz!).toBeLessThan(60e6);
  });
});

describe('analyze() conditions and bad input', () => {
  it('input/output overrides are applied and recorded', () => {
    const r = analyze(load('sensor-cs-miller.json'), { output: { kind: 'voltage', node: 'gate' }, frequencyHz: 1e6 });
    expect(r.conditions.output).toEqual({ kind: 'voltage', node: 'gate' });
    expect(r.conditions.frequencyHz).toBe(1e6);
    // v(gate)/v(sensor) at DC is 1: no DC current in the gate (common practice).
    expect(r.dcGain!).toBeCloseTo(1, 12);
  });

  it('scaling a transconductance scales the CS stage gain (gain ∝ gm, common practice)', () => {
    const base = analyze(load('sensor-cs-miller.json'));
    const half = analyze(load('sensor-cs-miller.json'), { scale: { 'M1.gm': 0.5 } });
    expect(half.conditions.scaled).toEqual({ 'M1.gm': 0.5 });
    expect(half.dcGain! / base.dcGain!).toBeCloseTo(0.5, 12);
  });

  // The next four check input handling against the engine's own contract (types.ts), not numbers.
  it('structural errors give named issues and no numbers', () => {
    const bad = load('sensor-cs-miller.json');
    bad.parts.push({ name: 'Cfloat', kind: 'capacitor', pins: { p: 'island', n: 'island2' }, values: { value: '1p' } });
    const r = analyze(bad);
    expect(r.ok).toBe(false);
    expect(r.poles).toEqual([]);
    expect(r.dcGain).toBeNull();
    expect(r.issues.some((i) => i.severity === 'error' && /island/.test(i.message))).toBe(true);
  });

  it('a bad value names the part and field', () => {
    const bad = load('sensor-cs-miller.json');
    bad.parts[1].values.value = 'lots';
    const r = analyze(bad);
    expect(r.ok).toBe(false);
    expect(r.issues.some((i) => i.part === 'Rsens' && i.field === 'value')).toBe(true);
  });

  it('unknown names in off/scale/input are reported by name', () => {
    const r = analyze(load('sensor-cs-miller.json'), { off: ['M9'] });
    expect(r.ok).toBe(false);
    expect(r.issues.some((i) => /M9/.test(i.message))).toBe(true);
    const r2 = analyze(load('sensor-cs-miller.json'), { input: 'Rsens' });
    expect(r2.ok).toBe(false);
    expect(r2.issues.some((i) => i.field === 'input')).toBe(true);
  });

  it('an integrator gives a pole at s = 0, open-at-DC node, and null DC gain with a reason', () => {
    const net: Netlist = {
      format: 'polesketch-netlist', version: 1, input: 'V1', output: { kind: 'voltage', node: 'x' },
      parts: [
        { name: 'V1', kind: 'vsource', pins: { p: 'in', n: '0' }, values: {} },
        { name: 'G1', kind: 'vccs', pins: { p: 'x', n: '0', cp: 'in', cn: '0' }, values: { gm: '1m' } },
        { name: 'C1', kind: 'capacitor', pins: { p: 'x', n: '0' }, values: { value: '1p' } },
      ],
    };
    const r = analyze(net);
    expect(r.ok).toBe(true);
    expect(r.poles[0].kind).toBe('origin');
    expect(r.dcGain).toBeNull();
    expect(r.reasons.dcGain).toMatch(/integrator/);
    expect(r.nodes.find((n) => n.name === 'x')).toMatchObject({ dcOhms: null, openAtDc: true });
    // |H| = gm/(ωC): unity gain at gm/(2πC) ≈ 159 MHz (common practice).
    expect(r.unityGainHz! / (1e-3 / (2 * Math.PI * 1e-12))).toBeCloseTo(1, 8);
    expect(hasNonFinite(r)).toBe(false);
  });

  it('bad analysis options get a named warning or are bounded, never NaN', () => {
    const r = analyze(load('sensor-cs-miller.json'), { frequencyHz: Number.NaN, sweep: { fMin: 1e-30, fMax: 1e30, perDecade: 1e9 } });
    expect(r.ok).toBe(true);
    expect(r.issues.some((i) => i.field === 'frequencyHz' && i.severity === 'warning')).toBe(true);
    expect(r.sweep!.hz.length).toBeLessThanOrEqual(4001);
    expect(hasNonFinite(r)).toBe(false);
  });

  it('impedanceSweep on request: every node over the sweep grid, equal to the direct solve (one LU per f; Kailath, partial fractions)', async () => {
    const { buildMna } = await import('../../src/engine/mna');
    const { impedancesAt } = await import('../../src/engine/analyses/impedance');
    const net = load('follower-sampling-load.json');
    const r = analyze(net, { impedanceSweep: true });
    const sw = r.impedanceSweep!;
    expect(sw.hz).toEqual(r.sweep!.hz);
    expect(sw.nodes).toEqual(r.nodes.map((n) => n.name));
    const sys = buildMna(net).system!;
    for (const i of [0, 17, sw.hz.length - 1]) {
      const ref = impedancesAt(sys, { re: 0, im: 2 * Math.PI * sw.hz[i] }).values;
      ref.forEach((z, k) => {
        const got = sw.values[k][i]!;
        expect(Math.hypot(got.re - z!.re, got.im - z!.im)).toBeLessThanOrEqual(1e-6 * Math.max(Math.hypot(z!.re, z!.im), 1e-3));
      });
    }
    expect(hasNonFinite(r)).toBe(false);
    expect(analyze(net).impedanceSweep).toBeNull();
  });

  it('current output: the source branch current into R is −1/R per volt (MNA branch-current convention, types.ts)', () => {
    const net: Netlist = {
      format: 'polesketch-netlist', version: 1, input: 'V1', output: { kind: 'current', part: 'V1' },
      parts: [
        { name: 'V1', kind: 'vsource', pins: { p: 'a', n: '0' }, values: {} },
        { name: 'R1', kind: 'resistor', pins: { p: 'a', n: '0' }, values: { value: '2k' } },
      ],
    };
    const r = analyze(net);
    expect(r.ok).toBe(true);
    expect(r.dcGain! * 2e3).toBeCloseTo(-1, 12);
  });

  it('no input chosen: poles and nodes are computed, the transfer figures are null with reasons', () => {
    const net = load('sensor-cs-miller.json');
    delete net.input;
    delete net.output; // an output without an input is a structural error (structure.ts)
    const r = analyze(net);
    expect(r.ok).toBe(true);
    expect(r.poles.length).toBe(2);
    expect(r.dcGain).toBeNull();
    expect(r.reasons.dcGain).toMatch(/no input/);
    expect(r.sweep).toBeNull();
    expect(r.zeroInfo.status).toBe('no-input');
    expect(r.nodes.length).toBe(3);
  });

  it('an undamped LC tank: poles ±j/√(LC), Q reported as null (unbounded), never Infinity (common practice)', () => {
    const net: Netlist = {
      format: 'polesketch-netlist', version: 1, input: 'I1', output: { kind: 'voltage', node: 't' },
      parts: [
        { name: 'I1', kind: 'isource', pins: { p: 't', n: '0' }, values: {} },
        { name: 'L1', kind: 'inductor', pins: { p: 't', n: '0' }, values: { value: '1u' } },
        { name: 'C1', kind: 'capacitor', pins: { p: 't', n: '0' }, values: { value: '1n' } },
      ],
    };
    const r = analyze(net);
    expect(r.ok).toBe(true);
    expect(r.poles.length).toBe(2);
    for (const p of r.poles) {
      expect(p.re).toBe(0);
      expect(p.q).toBeNull();
      expect(p.kind).toBe('complex');
      expect(p.omegaN * Math.sqrt(1e-6 * 1e-9)).toBeCloseTo(1, 9);
    }
    expect(hasNonFinite(r)).toBe(false);
  });

  it('cascaded ideal integrators (double pole at s = 0): numbers where defined, DC figures empty with a named warning', () => {
    const net: Netlist = {
      format: 'polesketch-netlist', version: 1, input: 'V1', output: { kind: 'voltage', node: 'y' },
      parts: [
        { name: 'V1', kind: 'vsource', pins: { p: 'in', n: '0' }, values: {} },
        { name: 'G1', kind: 'vccs', pins: { p: 'x', n: '0', cp: 'in', cn: '0' }, values: { gm: '1m' } },
        { name: 'C1', kind: 'capacitor', pins: { p: 'x', n: '0' }, values: { value: '1p' } },
        { name: 'G2', kind: 'vccs', pins: { p: 'y', n: '0', cp: 'x', cn: '0' }, values: { gm: '1m' } },
        { name: 'C2', kind: 'capacitor', pins: { p: 'y', n: '0' }, values: { value: '1p' } },
      ],
    };
    const r = analyze(net);
    expect(r.ok).toBe(true);
    expect(r.issues.some((i) => i.severity === 'warning' && i.node === 'y')).toBe(true);
    expect(r.poles.map((p) => p.kind)).toEqual(['origin', 'origin']);
    expect(r.dcGain).toBeNull();
    // H = gm²/(sC)²: |H| = 1 at gm/(2πC) ≈ 159 MHz (common practice).
    expect(r.unityGainHz! / (1e-3 / (2 * Math.PI * 1e-12))).toBeCloseTo(1, 8);
    expect(hasNonFinite(r)).toBe(false);
  });

  it('an output that does not respond to the input: DC gain 0, no sweep, reasons given (Rosenbrock pencil singular)', () => {
    const net: Netlist = {
      format: 'polesketch-netlist', version: 1, input: 'V1', output: { kind: 'voltage', node: 'far' },
      parts: [
        { name: 'V1', kind: 'vsource', pins: { p: 'in', n: '0' }, values: {} },
        { name: 'R1', kind: 'resistor', pins: { p: 'in', n: '0' }, values: { value: '1k' } },
        { name: 'R2', kind: 'resistor', pins: { p: 'far', n: '0' }, values: { value: '1k' } },
        { name: 'C2', kind: 'capacitor', pins: { p: 'far', n: '0' }, values: { value: '1p' } },
      ],
    };
    const r = analyze(net);
    expect(r.ok).toBe(true);
    expect(r.dcGain).toBe(0);
    expect(r.sweep).toBeNull();
    expect(r.bandwidthHz).toBeNull();
    expect(r.reasons.bandwidthHz).toMatch(/does not respond/);
    expect(r.zeroInfo.status).toBe('identically-zero');
  });
});
