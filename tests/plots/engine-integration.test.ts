// The plots fed straight from engine results on one of the example netlists (invented values).
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { analyze, buildMna, type Netlist } from '../../src/engine/index';
import { discoverLoops } from '../../src/engine/feedback/loops';
import { loopMargins } from '../../src/engine/feedback/margins';
import { rootLocus } from '../../src/engine/feedback/locus';
import { stepResponse } from '../../src/engine/feedback/step';
import { compareOff } from '../../src/engine/feedback/compare';
import { bodeInputFrom, loopGainInputFrom, splaneInputFrom, stepInputFrom } from '../../src/plots/fromEngine';
import { bodeModel } from '../../src/plots/model/bodeModel';
import { loopGainModel } from '../../src/plots/model/loopGainModel';
import { splaneModel } from '../../src/plots/model/splaneModel';
import { stepModel } from '../../src/plots/model/stepModel';
import { upperRoots, rootHz } from '../../src/plots/model/bodeModel';
import { byRole, crossingX, linearPx, tickPx } from './sceneProbe';

const netlist = JSON.parse(readFileSync(new URL('../../src/examples/netlists/two-stage-miller-unity.json', import.meta.url), 'utf8')) as Netlist;
const result = analyze(netlist);
const sys = buildMna(netlist).system!;

describe('plots from engine results (two-stage Miller example)', () => {
  it('Bode: every in-band pole and zero of the analysis is marked', () => {
    const input = bodeInputFrom(result, 'Vin → out')!;
    const s = bodeModel(input);
    const lo = input.hz[0], hi = input.hz[input.hz.length - 1];
    const inBand = (r: { re: number; im: number }) => { const f = rootHz(r); return f >= lo && f <= hi; };
    expect(byRole(s, 'marker', 'pole')).toHaveLength(upperRoots(result.poles).filter(inBand).length);
    expect(byRole(s, 'marker', 'zero')).toHaveLength(upperRoots(result.zeros).filter(inBand).length);
    expect(byRole(s, 'marker', 'pole').length).toBeGreaterThan(0);
  });

  it('loop gain: the crossover of the engine margins sits where the plotted |T| crosses 0 dB, near gm1/(2π·Cc) (Gray & Meyer)', () => {
    const d = discoverLoops(sys, { freqsHz: Array.from({ length: 61 }, (_, i) => 10 ** (2 + i / 6)) });
    const loop = d.loops.find((l) => l.key === 'G1.gm') ?? d.loops[0];
    expect(loop).toBeDefined();
    const m = loopMargins(sys, loop.key);
    expect(m.status).toBe('ok');
    const s = loopGainModel(loopGainInputFrom(loop, m));
    const cross = byRole(s, 'line', 'crossover')[0];
    const xCurve = crossingX(byRole(s, 'path', 'curve-mag')[0].runs, linearPx(s, 'y', 'mag', 0))!;
    expect(Math.abs(cross.x1 - xCurve)).toBeLessThan(2); // sweep of 6 points per decade, interpolated
    // Gray & Meyer: ωu ≈ gm1/Cc = 100 µS / 1 pF → 15.9 MHz; read off the 1 MHz and 1 GHz ticks, within 25 %
    const x1M = tickPx(s, 'x', 'phase', '1 MHz'), ppd = (tickPx(s, 'x', 'phase', '1 GHz') - x1M) / 3;
    const fRead = 1e6 * 10 ** ((cross.x1 - x1M) / ppd);
    expect(Math.abs(Math.log(fRead / (100e-6 / (2 * Math.PI * 1e-12))))).toBeLessThan(Math.log(1.25));
    expect(byRole(s, 'text', 'phase-margin-label')[0].text).toBe(`PM ${Number(m.phaseMarginDeg!.toFixed(1))}°`);
  });

  it('root locus: the k = 1 marks fall on the analysis poles', () => {
    const locus = rootLocus(sys, 'G1.gm');
    expect(locus.status).toBe('ok');
    const s = splaneModel(splaneInputFrom(result, locus), { view: 'signed-log' });
    const poles = byRole(s, 'marker', 'pole');
    const drawn = byRole(s, 'marker', 'locus-drawn');
    expect(drawn.length).toBe(result.poles.length);
    for (const d of drawn) expect(Math.min(...poles.map((p) => Math.hypot(p.x - d.x, p.y - d.y)))).toBeLessThan(0.5);
  });

  it('compare mode: one arrow per matched pole pair', () => {
    const cmp = compareOff(sys, ['G1.gm']);
    const s = splaneModel(splaneInputFrom(result, null, cmp, ['loop on', 'G1 off']));
    const matched = cmp.poles.filter((p) => p.before && p.after).length;
    expect(byRole(s, 'path', 'migration').length).toBeLessThanOrEqual(matched);
    expect(byRole(s, 'marker', 'pole-a')).toHaveLength(cmp.poles.filter((p) => p.before).length);
  });

  it('step: settling marks for every tolerance the engine reached', () => {
    const st = stepResponse(sys);
    const s = stepModel(stepInputFrom(st, 'Vin → out'));
    const reached = st.settling.filter((x) => x.seconds !== null && x.seconds >= st.t[0] && x.seconds <= st.t[st.t.length - 1]).length;
    expect(byRole(s, 'line', 'settling')).toHaveLength(reached);
    expect(reached).toBeGreaterThan(0);
  });
});
