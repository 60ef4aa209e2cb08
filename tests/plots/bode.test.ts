import { describe, it, expect } from 'vitest';
import { bodeModel } from '../../src/plots/model/bodeModel';
import { loopGainModel } from '../../src/plots/model/loopGainModel';
import { complexToCurve } from '../../src/plots/model/freqPanels';
import { hoverAt } from '../../src/plots/model/hover';
import { byRole, crossingX, linearPx, logGrid, tickPx, yAtX } from './sceneProbe';

const TWO_PI = 2 * Math.PI;
const deg = (r: number) => (r * 180) / Math.PI;

/** A0 / Π(1 + s/pᵢ) at s = j2πf (poles in Hz). */
function poleProduct(A0: number, polesHz: number[], hz: number[]) {
  return complexToCurve(hz, hz.map((f) => {
    let re = A0, im = 0;
    for (const p of polesHz) {
      const dr = 1, di = f / p, d2 = dr * dr + di * di;
      [re, im] = [(re * dr + im * di) / d2, (im * dr - re * di) / d2];
    }
    return { re, im };
  }));
}

describe('Bode model', () => {
  const hz = logGrid(1, 1e6, 40);
  const curve = poleProduct(100, [1e3], hz);
  const scene = bodeModel({ ...curve, label: 'V1 → out', poles: [{ re: -TWO_PI * 1e3, im: 0 }], zeros: [] });

  it('single pole: the −3 dB point of the drawn curve lands at the pole mark, at the "1 kHz" tick (textbook: |H(jωp)| = A0/√2)', () => {
    const mag = byRole(scene, 'path', 'curve-mag')[0];
    const y3 = linearPx(scene, 'y', 'mag', 40 - 10 * Math.log10(2));
    const xCurve = crossingX(mag.runs, y3)!;
    const pole = byRole(scene, 'marker', 'pole');
    expect(pole).toHaveLength(1);
    const xTick = tickPx(scene, 'x', 'phase', '1 kHz');
    expect(Math.abs(pole[0].x - xTick)).toBeLessThan(0.01);
    expect(Math.abs(xCurve - pole[0].x)).toBeLessThan(0.5);
  });

  it('single pole: the drawn phase is −45° at the pole and the magnitude falls 20 dB per decade above it (textbook)', () => {
    const ph = byRole(scene, 'path', 'curve-phase')[0];
    const x = tickPx(scene, 'x', 'phase', '1 kHz');
    expect(Math.abs(yAtX(ph.runs, x)! - linearPx(scene, 'y', 'phase', -45))).toBeLessThan(0.5);
    const mag = byRole(scene, 'path', 'curve-mag')[0];
    const y100k = yAtX(mag.runs, tickPx(scene, 'x', 'phase', '100 kHz'))!;
    const y1M = yAtX(mag.runs, tickPx(scene, 'x', 'phase', '1 MHz'))!;
    const dbPerPx = 20 / (linearPx(scene, 'y', 'mag', 0) - linearPx(scene, 'y', 'mag', 20));
    expect((y1M - y100k) * dbPerPx).toBeCloseTo(20, 1);
  });

  it('hover read-out gives the nearest sample: at the pole, f = 1.00 kHz and |H| = 36.99 dB', () => {
    const x = tickPx(scene, 'x', 'phase', '1 kHz');
    const c = scene.clips.find((k) => k.id === 'phase')!;
    const hit = hoverAt(scene, x + 0.3, c.y + 10)!;
    expect(hit.track).toBe('curve');
    expect(hit.point.lines).toEqual(['f = 1.00 kHz', '|H| = 36.99 dB', '∠H = \u221245°']);
    const onMark = hoverAt(scene, x, byRole(scene, 'marker', 'pole')[0].y)!;
    expect(onMark.track).toBe('roots');
    expect(onMark.point.lines[0]).toMatch(/^pole at 1\.00 kHz \(real, LHP\)/);
  });

  it('a complex pair is marked once at ωn/2π with its Q; an RHP zero is filled and labelled; s = 0 and out-of-band roots are noted', () => {
    const wn = TWO_PI * 1e4, q = 2;
    const s = bodeModel({
      ...curve,
      poles: [{ re: -wn / (2 * q), im: wn * Math.sqrt(1 - 1 / (4 * q * q)) }, { re: -wn / (2 * q), im: -wn * Math.sqrt(1 - 1 / (4 * q * q)) }, { re: 0, im: 0 }],
      zeros: [{ re: TWO_PI * 1e5, im: 0 }, { re: -TWO_PI * 1e9, im: 0 }],
    });
    const poles = byRole(s, 'marker', 'pole');
    expect(poles).toHaveLength(1);
    expect(Math.abs(poles[0].x - tickPx(s, 'x', 'phase', '10 kHz'))).toBeLessThan(0.01);
    expect(byRole(s, 'text', 'pole-q')[0].text).toBe('Q 2.0');
    const z = byRole(s, 'marker', 'zero');
    expect(z).toHaveLength(1);
    expect(z[0].style.fill).not.toBe('none');
    expect(byRole(s, 'text', 'zero-rhp')[0].text).toBe('RHP');
    expect(s.notes.join(' ')).toMatch(/1 root at s = 0.*1 root outside the plotted band/);
  });

  it('a sweep without samples yields a note, not a crash', () => {
    const s = bodeModel({ hz: [], magDb: [], phaseDeg: [] });
    expect(s.notes[0]).toMatch(/No frequency sweep/);
    const s2 = bodeModel({ hz: [1, 10, 100], magDb: [null, null, null], phaseDeg: [null, null, null] });
    expect(s2.notes.join(' ')).toMatch(/undefined at every sample/);
  });
});

describe('loop gain model', () => {
  it('single-pole loop: crossover where the curve crosses 0 dB at fp·√(T0²−1); PM bar from −180° to −180° + PM (common practice)', () => {
    const T0 = 100, fp = 1e3;
    const hz = logGrid(1, 1e7, 40);
    const fu = fp * Math.sqrt(T0 * T0 - 1);
    const pm = 180 - deg(Math.atan(fu / fp));
    const s = loopGainModel({ ...poleProduct(T0, [fp], hz), label: 'G1', margins: { unityGainHz: fu, phaseMarginDeg: pm, phaseCrossHz: null, gainMarginDb: null } });
    const cross = byRole(s, 'line', 'crossover')[0];
    const xCurve = crossingX(byRole(s, 'path', 'curve-mag')[0].runs, linearPx(s, 'y', 'mag', 0))!;
    expect(Math.abs(cross.x1 - xCurve)).toBeLessThan(0.5);
    const bar = byRole(s, 'line', 'phase-margin')[0];
    expect(Math.abs(bar.y1 - linearPx(s, 'y', 'phase', -180))).toBeLessThan(0.01);
    expect(Math.abs(bar.y2 - linearPx(s, 'y', 'phase', -180 + pm))).toBeLessThan(0.01);
    // the bar's top meets the drawn phase curve
    expect(Math.abs(yAtX(byRole(s, 'path', 'curve-phase')[0].runs, bar.x1)! - bar.y2)).toBeLessThan(0.5);
    expect(byRole(s, 'text', 'phase-margin-label')[0].text).toBe('PM 90.6°');
    expect(byRole(s, 'line', 'gain-margin')).toHaveLength(0);
    expect(s.notes.join(' ')).toMatch(/no gain margin/);
  });

  it('three equal poles, T0 = 4: ∠T = −180° at √3·p and GM = 20·log10(8/T0) = 6.02 dB (common practice)', () => {
    const T0 = 4, fp = 1e5;
    const hz = logGrid(1e2, 1e8, 50);
    const curve = poleProduct(T0, [fp, fp, fp], hz);
    // phase must be unwrapped past −180° (down to −270°)
    const last = curve.phaseDeg[curve.phaseDeg.length - 1]!;
    expect(last).toBeLessThan(-260);
    const x = Math.sqrt(T0 ** (2 / 3) - 1); // |T| = 1 at ω/p = x
    const margins = { unityGainHz: fp * x, phaseMarginDeg: 180 - 3 * deg(Math.atan(x)), phaseCrossHz: fp * Math.sqrt(3), gainMarginDb: 20 * Math.log10(8 / T0) };
    const s = loopGainModel({ ...curve, margins });
    const gm = byRole(s, 'line', 'gain-margin')[0];
    expect(Math.abs(gm.y1 - linearPx(s, 'y', 'mag', 0))).toBeLessThan(0.01);
    expect(Math.abs(gm.y2 - linearPx(s, 'y', 'mag', -margins.gainMarginDb))).toBeLessThan(0.01);
    expect(Math.abs(yAtX(byRole(s, 'path', 'curve-mag')[0].runs, gm.x1)! - gm.y2)).toBeLessThan(0.5);
    expect(byRole(s, 'text', 'gain-margin-label')[0].text).toBe('GM 6 dB');
    const phCross = byRole(s, 'marker', 'phase-cross-mark')[0];
    expect(Math.abs(yAtX(byRole(s, 'path', 'curve-phase')[0].runs, phCross.x)! - phCross.y)).toBeLessThan(0.5);
    const hit = hoverAt(s, phCross.x, phCross.y)!;
    expect(hit.track).toBe('margins');
    expect(hit.point.lines[1]).toBe('gain margin 6 dB');
  });

  it('no crossover: says so and draws no margin bars', () => {
    const hz = logGrid(1, 1e6, 20);
    const s = loopGainModel({ ...poleProduct(0.5, [1e3], hz), margins: { status: 'no-crossover', unityGainHz: null, phaseMarginDeg: null, phaseCrossHz: null, gainMarginDb: null } });
    expect(byRole(s, 'line', 'phase-margin')).toHaveLength(0);
    expect(s.notes.join(' ')).toMatch(/does not cross 1/);
  });
});
