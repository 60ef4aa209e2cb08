import { describe, it, expect } from 'vitest';
import { Hand } from './analyses-handmna';
import { dcTransfer, transferDirect, transferEvaluator } from '../../src/engine/analyses/transfer';
import { logGrid, sweepTransfer, findBandwidth, findUnityGain } from '../../src/engine/analyses/frequency';
import { dcImpedances, impedancesAt, impedancesAtHz } from '../../src/engine/analyses/impedance';
import { factorDc } from '../../src/engine/analyses/dc';
import { rng } from '../seeded'; // mulberry32, common practice

const TWO_PI = 2 * Math.PI;

describe('log grid', () => {
  it('spans both ends with the asked density (common practice)', () => {
    const g = logGrid(1, 1e6, 10);
    expect(g.length).toBe(61);
    expect(g[0]).toBe(1);
    expect(g[60]).toBe(1e6);
    expect(g[10]).toBeCloseTo(10, 10);
  });
  it('returns an empty grid for a bad range instead of NaN', () => {
    expect(logGrid(-1, 10, 10).length).toBe(0);
    expect(Array.from(logGrid(10, 1, 10))).toEqual([10]);
  });
});

describe('single RC low-pass', () => {
  const R = 1e3;
  const C = 1e-9;
  const sys = new Hand().V('vin', 'in', '0').R('r1', 'in', 'out', R).C('c1', 'out', '0', C).build('vin', 'out');
  const fp = 1 / (TWO_PI * R * C); // common practice: f−3dB = 1/(2πRC)

  it('DC gain 1 and H(jω) = 1/(1 + jωRC) on the sweep (common practice)', () => {
    expect(dcTransfer(sys).value).toBeCloseTo(1, 12);
    const ev = transferEvaluator(sys, fp);
    expect(ev.method).toBe('hessenberg');
    const sw = sweepTransfer(ev, logGrid(fp / 1000, fp * 1000, 10));
    sw.hz.forEach((f, i) => {
      const x = f / fp;
      expect(sw.magDb[i]!).toBeCloseTo(-10 * Math.log10(1 + x * x), 9);
      expect(sw.phaseDeg[i]!).toBeCloseTo((-Math.atan(x) * 180) / Math.PI, 8);
    });
  });

  it('−3 dB point at 1/(2πRC) with −45° phase (common practice)', () => {
    const ev = transferEvaluator(sys, fp);
    const sw = sweepTransfer(ev, logGrid(fp / 100, fp * 100, 7));
    const bw = findBandwidth(ev, sw, 1);
    expect(bw.hz! / fp).toBeCloseTo(1, 9);
    expect(bw.phaseDeg!).toBeCloseTo(-45, 6);
    // Gain never reaches 0 dB from above after DC (it starts at exactly 0 dB, then falls).
    const ug = findUnityGain(ev, sw);
    expect(ug.hz === null || ug.hz < fp / 10).toBe(true);
  });

  it('node impedance of the RC node equals R/(1 + jωRC) over frequency (common practice)', () => {
    for (const f of [1, fp / 10, fp, fp * 37, fp * 1e4]) {
      const z = impedancesAt(sys, { re: 0, im: TWO_PI * f }).values[sys.nodeNames.indexOf('out')]!;
      const w = TWO_PI * f * R * C;
      const d = 1 + w * w;
      expect(z.re / (R / d)).toBeCloseTo(1, 10);
      expect(z.im / ((-R * w) / d)).toBeCloseTo(1, 10);
    }
    // The driven node 'in' is held by the (zeroed) voltage source: 0 Ω.
    expect(dcImpedances(sys)[sys.nodeNames.indexOf('in')].ohms).toBeCloseTo(0, 12);
  });
});

describe('single-pole amplifier from a VCCS', () => {
  // in → gm → out with R ∥ C: H = −gm·R/(1 + sRC). Unity gain at f_p·√(A0² − 1) (common practice).
  const gm = 2e-3, R = 50e3, C = 2e-12;
  const sys = new Hand().V('vin', 'in', '0').G('g1', 'out', '0', 'in', '0', gm).R('r1', 'out', '0', R).C('c1', 'out', '0', C).build('vin', 'out');
  const A0 = gm * R;
  const fp = 1 / (TWO_PI * R * C);

  it('DC gain −gm·R, unity-gain frequency and phase from the closed form (common practice)', () => {
    expect(dcTransfer(sys).value! / -A0).toBeCloseTo(1, 12);
    const ev = transferEvaluator(sys);
    const sw = sweepTransfer(ev, logGrid(1e3, 1e12, 5));
    const ug = findUnityGain(ev, sw);
    const fu = fp * Math.sqrt(A0 * A0 - 1);
    expect(ug.hz! / fu).toBeCloseTo(1, 9);
    // Inverting: phase starts at 180° and falls toward 90°; at f_u it is 180° − atan(f_u/f_p).
    expect(ug.phaseDeg!).toBeCloseTo(180 - (Math.atan(fu / fp) * 180) / Math.PI, 6);
    const bw = findBandwidth(ev, sw, dcTransfer(sys).value);
    expect(bw.hz! / fp).toBeCloseTo(1, 9);
  });

  it('the fast Hessenberg evaluation agrees with a direct complex solve (Laub 1981)', () => {
    const ev = transferEvaluator(sys);
    for (const f of [0.1, 1e5, 3.3e7, 1e11]) {
      const a = ev.atHz(f)!;
      const b = transferDirect(sys, { re: 0, im: TWO_PI * f })!;
      expect(Math.hypot(a.re - b.re, a.im - b.im) / Math.hypot(b.re, b.im)).toBeLessThan(1e-10);
    }
  });

  it('reports no input / no output by name instead of a number', () => {
    const noIn = new Hand().V('vin', 'in', '0').R('r', 'in', 'out', 1).build(undefined, 'out');
    expect(dcTransfer(noIn)).toMatchObject({ value: null, status: 'no-input' });
    const noOut = new Hand().V('vin', 'in', '0').R('r', 'in', 'out', 1).build('vin');
    expect(dcTransfer(noOut)).toMatchObject({ value: null, status: 'no-output' });
  });
});

describe('open at DC', () => {
  it('an ideal integrator node is open at DC and makes the DC gain unbounded (common practice)', () => {
    // VCCS into a capacitor only: H(s) = −gm/(sC).
    const sys = new Hand().V('vin', 'in', '0').G('g1', 'x', '0', 'in', '0', 1e-3).C('c1', 'x', '0', 1e-12).build('vin', 'x');
    const dc = factorDc(sys);
    expect(dc.status).toBe('integrating');
    const z = dcImpedances(sys, dc);
    expect(z[sys.nodeNames.indexOf('x')]).toMatchObject({ ohms: null, openAtDc: true });
    expect(dcTransfer(sys, dc)).toMatchObject({ value: null, status: 'unbounded' });
    // Frequency-dependent values are still there: Z_x = 1/(jωC).
    const f = 1e6;
    const zx = impedancesAtHz(sys, f).values[sys.nodeNames.indexOf('x')]!;
    expect(zx.re).toBeCloseTo(0, 6);
    expect(zx.im / (-1 / (TWO_PI * f * 1e-12))).toBeCloseTo(1, 10);
  });

  it('a capacitive divider has a bounded DC limit C1/(C1 + C2) though G is singular (common practice)', () => {
    const C1 = 3e-12, C2 = 1e-12;
    const sys = new Hand().V('vin', 'in', '0').R('r1', 'in', 'a', 1e3).C('c1', 'a', 'x', C1).C('c2', 'x', '0', C2).build('vin', 'x');
    const dc = factorDc(sys);
    expect(dc.status).toBe('integrating');
    expect(dcTransfer(sys, dc).value!).toBeCloseTo(C1 / (C1 + C2), 12);
    const z = dcImpedances(sys, dc);
    expect(z[sys.nodeNames.indexOf('x')].openAtDc).toBe(true);
    // Node a sees r1 to the (shorted) source; the capacitors are open at DC.
    expect(z[sys.nodeNames.indexOf('a')].ohms! / 1e3).toBeCloseTo(1, 12);
  });
});

describe('checks against independent libraries', () => {
  function randomStage(seed: number) {
    const r = rng(seed);
    const h = new Hand().V('vin', 'in', '0');
    const nodes = ['n0', 'n1', 'n2', 'n3', 'n4', 'n5', 'n6'];
    h.R('rin', 'in', 'n0', 1e3);
    nodes.forEach((a, i) => {
      h.R(`rg${i}`, a, '0', 1e3 + 1e5 * r()).C(`cg${i}`, a, '0', 1e-13 + 1e-12 * r());
      const b = nodes[(i + 1) % nodes.length];
      h.R(`rs${i}`, a, b, 1e3 + 1e5 * r()).C(`cs${i}`, a, b, 1e-14 * r());
      if (i > 0) h.G(`g${i}`, b, '0', a, '0', 1e-4 * r());
    });
    return h.build('vin', 'n6');
  }

  it('DC node impedances equal the diagonal of G⁻¹ from ml-matrix (independent library)', async () => {
    const { Matrix, inverse } = await import('ml-matrix');
    const sys = randomStage(3);
    const n = sys.n;
    const rows = Array.from({ length: n }, (_, i) => Array.from(sys.G.slice(i * n, i * n + n)));
    const inv = inverse(new Matrix(rows));
    const z = dcImpedances(sys);
    // Node "in" is held by the (zeroed) source: 0 Ω there, so compare with a 1 Ω floor.
    for (let k = 0; k < sys.nodeCount; k++) expect(Math.abs(z[k].ohms! - inv.get(k, k)) / Math.max(Math.abs(inv.get(k, k)), 1)).toBeLessThan(1e-9);
    expect(dcTransfer(sys).value! / inv.get(sys.nodeNames.indexOf('n6'), n - 1)).toBeCloseTo(1, 9);
  });

  it('node impedances and the transfer at s = jω equal a mathjs complex inverse (independent library)', async () => {
    const math = await import('mathjs');
    const sys = randomStage(5);
    const n = sys.n;
    const w = TWO_PI * 3.3e6;
    const M = math.matrix(Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => math.complex(sys.G[i * n + j], w * sys.C[i * n + j]))));
    const inv = math.inv(M) as unknown as { get(idx: number[]): { re: number; im: number } };
    const z = impedancesAt(sys, { re: 0, im: w });
    for (let k = 0; k < sys.nodeCount; k++) {
      const ref = inv.get([k, k]);
      const got = z.values[k]!;
      expect(Math.hypot(got.re - ref.re, got.im - ref.im) / Math.max(Math.hypot(ref.re, ref.im), 1)).toBeLessThan(1e-9);
    }
    const ev = transferEvaluator(sys);
    const h = ev.at({ re: 0, im: w })!;
    const ref = inv.get([sys.nodeNames.indexOf('n6'), n - 1]);
    expect(Math.hypot(h.re - ref.re, h.im - ref.im) / Math.hypot(ref.re, ref.im)).toBeLessThan(1e-9);
  });

  it('fast sweep equals the direct solve over 16 decades on a stiff ladder (τ = 1e-12 … 1 s) (Laub 1981 method vs direct LU)', () => {
    const h = new Hand().V('vin', 's0', '0');
    for (let k = 0; k <= 12; k++) {
      h.R(`ra${k}`, `s${k}`, `s${k + 1}`, 1e3).C(`c${k}`, `s${k + 1}`, '0', Math.pow(10, -12 + k) / 1e3);
    }
    const sys = h.build('vin', 's13');
    const ev = transferEvaluator(sys);
    for (const f of logGrid(1e-3, 1e13, 2)) {
      const a = ev.atHz(f)!;
      const b = transferDirect(sys, { re: 0, im: TWO_PI * f })!;
      const mag = Math.hypot(b.re, b.im);
      if (mag < 1e-250) continue;
      expect(Math.hypot(a.re - b.re, a.im - b.im) / mag).toBeLessThan(1e-7);
    }
    expect(dcTransfer(sys).value!).toBeCloseTo(1, 12); // passive RC ladder: DC gain 1 (common practice)
  });
});
