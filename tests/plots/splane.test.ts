import { describe, it, expect } from 'vitest';
import { splaneModel } from '../../src/plots/model/splaneModel';
import { hoverAt } from '../../src/plots/model/hover';
import type { LocusInput, PlotRoot } from '../../src/plots/types';
import { byRole } from './sceneProbe';
import type { Scene } from '../../src/plots/model/scene';

const TWO_PI = 2 * Math.PI;
const hz = (re: number, im = 0): PlotRoot => ({ re: TWO_PI * re, im: TWO_PI * im });

function origin(s: Scene): [number, number] {
  return [byRole(s, 'line', 'axis-imag')[0].x1, byRole(s, 'line', 'axis-real')[0].y1];
}

describe('s-plane, signed-log view', () => {
  // ζ = 1/(2Q) = cos θ from the negative real axis (common practice: second-order pole geometry)
  const wn = 1e6, q = 1 / Math.SQRT2;
  const pair = [hz(-wn / (2 * q), wn * Math.sqrt(1 - 1 / (4 * q * q))), hz(-wn / (2 * q), -wn * Math.sqrt(1 - 1 / (4 * q * q)))];
  const s = splaneModel({ poles: [hz(-1e3), hz(-1e9), ...pair], zeros: [hz(2e5)] }, { view: 'signed-log' });

  it('radius counts decades of |s|: 1 kHz and 1 GHz poles are six ring spacings apart; the 1 MHz pair sits on the "1 MHz" ring', () => {
    const [cx, cy] = origin(s);
    const poles = byRole(s, 'marker', 'pole');
    expect(poles).toHaveLength(4);
    const rad = (m: { x: number; y: number }) => Math.hypot(m.x - cx, m.y - cy);
    const rings = byRole(s, 'circle', 'ring-major').map((c) => c.r).sort((a, b) => a - b);
    const spacing = rings[1] - rings[0];
    for (let i = 2; i < rings.length; i++) expect(rings[i] - rings[i - 1]).toBeCloseTo(spacing, 6);
    const slow = poles.find((p) => p.title?.includes('1.00 kHz'))!, fast = poles.find((p) => p.title?.includes('1.00 GHz'))!;
    expect(rad(fast) - rad(slow)).toBeCloseTo(6 * spacing, 6);
    const label = byRole(s, 'text', 'ring-label').find((t) => t.text === '1 MHz')!;
    const ring1M = cx - label.x;
    const pairMarks = poles.filter((p) => p.title?.includes('complex'));
    expect(pairMarks).toHaveLength(2);
    for (const m of pairMarks) expect(rad(m)).toBeCloseTo(ring1M, 6);
  });

  it('angles are kept: the Q = 0.707 pair lies at ±135° on the Q = 1/√2 rays; the RHP zero is right of the jω axis', () => {
    const [cx, cy] = origin(s);
    const pairMarks = byRole(s, 'marker', 'pole').filter((p) => p.title?.includes('complex'));
    const angles = pairMarks.map((m) => (Math.atan2(cy - m.y, m.x - cx) * 180) / Math.PI).sort((a, b) => a - b);
    expect(angles[0]).toBeCloseTo(-135, 6);
    expect(angles[1]).toBeCloseTo(135, 6);
    const rays = byRole(s, 'line', 'q-ray').map((l) => (Math.atan2(cy - l.y2, l.x2 - cx) * 180) / Math.PI);
    expect(rays.some((a) => Math.abs(a - 135) < 1e-6)).toBe(true);
    const z = byRole(s, 'marker', 'zero')[0];
    expect(z.x).toBeGreaterThan(cx);
    expect(z.y).toBeCloseTo(cy, 6);
  });

  it('hover on a pole reads it out in Hz with its kind', () => {
    const slow = byRole(s, 'marker', 'pole').find((p) => p.title?.includes('1.00 kHz'))!;
    const hit = hoverAt(s, slow.x + 2, slow.y - 1)!;
    expect(hit.point.lines[0]).toBe('pole \u22121.00 kHz (real, LHP)');
  });
});

describe('s-plane, linear view', () => {
  it('equal scales: a pole at (−1 ± j1) kHz is as far left of the jω axis as it is above the real axis (Q 0.707)', () => {
    const s = splaneModel({ poles: [hz(-1e3, 1e3), hz(-1e3, -1e3), hz(-3e3)], zeros: [] }, { view: 'linear' });
    const [ox, oy] = origin(s);
    const up = byRole(s, 'marker', 'pole').find((m) => m.y < oy)!;
    expect(ox - up.x).toBeCloseTo(oy - up.y, 6);
    const far = byRole(s, 'marker', 'pole').find((m) => m.title?.includes('3.00 kHz'))!;
    expect((ox - far.x) / (ox - up.x)).toBeCloseTo(3, 6);
    expect(byRole(s, 'circle', 'ring-major')).toHaveLength(0);
  });
});

describe('root locus', () => {
  // Two-pole loop T = k·K0/((1 + s/p1)(1 + s/p2)): closed-loop poles solve
  // s² + (p1 + p2)s + p1·p2·(1 + k·K0) = 0 (textbook root locus of two real poles)
  const p1 = TWO_PI * 1e3, p2 = TWO_PI * 1e5, K0 = 200;
  const roots = (k: number): [PlotRoot, PlotRoot] => {
    const b = p1 + p2, c = p1 * p2 * (1 + k * K0), d = b * b - 4 * c;
    return d >= 0 ? [{ re: (-b + Math.sqrt(d)) / 2, im: 0 }, { re: (-b - Math.sqrt(d)) / 2, im: 0 }]
      : [{ re: -b / 2, im: Math.sqrt(-d) / 2 }, { re: -b / 2, im: -Math.sqrt(-d) / 2 }];
  };
  const k = Array.from({ length: 201 }, (_, i) => i / 20);
  const locus: LocusInput = {
    k, branches: [0, 1].map((j) => ({ re: k.map((v) => roots(v)[j].re), im: k.map((v) => roots(v)[j].im) })),
  };
  const s = splaneModel({ poles: roots(1), zeros: [], locus }, { view: 'linear' });

  it('k = 0 marks sit on the open-loop poles, k = 1 marks on the closed-loop poles, and the end is labelled k = 10', () => {
    const [ox, oy] = origin(s);
    const start = byRole(s, 'marker', 'locus-start');
    expect(start).toHaveLength(2);
    for (const m of start) expect(m.y).toBeCloseTo(oy, 6);
    const xs = start.map((m) => ox - m.x).sort((a, b) => a - b);
    expect(xs[1] / xs[0]).toBeCloseTo(p2 / p1, 6);
    const drawn = byRole(s, 'marker', 'locus-drawn');
    const [r1] = roots(1);
    expect(r1.im).not.toBe(0);
    const up = drawn.find((m) => m.y < oy)!, down = drawn.find((m) => m.y > oy)!;
    expect(up.x).toBeCloseTo(down.x, 6);
    expect((oy - up.y) / (ox - up.x)).toBeCloseTo(Math.abs(r1.im / r1.re), 6);
    // the closed-loop pole marks coincide with the k = 1 marks
    const poles = byRole(s, 'marker', 'pole');
    expect(poles.some((p) => Math.hypot(p.x - up.x, p.y - up.y) < 1e-6)).toBe(true);
    expect(byRole(s, 'marker', 'locus-end')[0].title).toMatch(/^k = 10:/);
    expect(s.notes.join(' ')).toMatch(/k = 0, ◆ k = 1 \(as drawn\), △ k = 10/);
  });

  it('interpolates the k = 1 mark when no sample lands on it', () => {
    const ks = [0, 0.7, 1.3, 2];
    const l2: LocusInput = { k: ks, branches: [{ re: ks.map((v) => -1000 - 1000 * v), im: ks.map(() => 0) }] };
    const s2 = splaneModel({ poles: [], zeros: [], locus: l2 }, { view: 'linear' });
    const [ox] = origin(s2);
    const [start, drawn] = [byRole(s2, 'marker', 'locus-start')[0], byRole(s2, 'marker', 'locus-drawn')[0]];
    expect((ox - drawn.x) / (ox - start.x)).toBeCloseTo(2, 6);
  });
});

describe('compare mode', () => {
  it('arrows run from each A pole to its matched B pole; unmatched poles are named', () => {
    const s = splaneModel({
      poles: [], zeros: [],
      migrations: [{ before: hz(-1e3), after: hz(-5e4) }, { before: hz(-2e6, 1e6), after: hz(-3e6, 2e6) }, { before: hz(-1e8), after: null }],
      compareLabels: ['loop on', 'loop off'],
    });
    const a = byRole(s, 'marker', 'pole-a'), b = byRole(s, 'marker', 'pole-b');
    expect(a).toHaveLength(3);
    expect(b).toHaveLength(2);
    const shafts = byRole(s, 'path', 'migration'), heads = byRole(s, 'path', 'migration-head');
    expect(shafts).toHaveLength(2);
    for (let i = 0; i < 2; i++) {
      expect(shafts[i].runs[0][0]).toBeCloseTo(a[i].x, 6);
      expect(shafts[i].runs[0][1]).toBeCloseTo(a[i].y, 6);
      expect(heads[i].runs[0][0]).toBeCloseTo(b[i].x, 6);
      expect(heads[i].runs[0][1]).toBeCloseTo(b[i].y, 6);
    }
    expect(a[2].title).toMatch(/no match in loop off/);
    expect(b[0].title).toMatch(/^loop off: pole \u221250.0 kHz \(from \u22121.00 kHz\)/);
  });

  it('nothing to draw gives a note', () => {
    const s = splaneModel({ poles: [{ re: NaN, im: 0 }], zeros: [] });
    expect(s.notes.join(' ')).toMatch(/No finite poles or zeros/);
  });
});
