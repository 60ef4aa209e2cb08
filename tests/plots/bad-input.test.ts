import { describe, it, expect } from 'vitest';
import { bodeModel } from '../../src/plots/model/bodeModel';
import { loopGainModel } from '../../src/plots/model/loopGainModel';
import { impedanceModel } from '../../src/plots/model/impedanceModel';
import { splaneModel } from '../../src/plots/model/splaneModel';
import { stepModel } from '../../src/plots/model/stepModel';
import { hoverAt } from '../../src/plots/model/hover';
import { toSvg } from '../../src/plots/toSvg';
import type { Scene } from '../../src/plots/model/scene';

// Junk and edge-case inputs must give a drawable scene with notes: no exception, no NaN/Infinity in the file.
const junkHz = [NaN, -5, 0, 1, 10, Infinity, 100, 1000];
const junkVals = [NaN, 3, null, 1, -Infinity, 2, Infinity, 0];

function clean(s: Scene) {
  const svg = toSvg(s);
  expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  for (let x = 0; x <= s.width; x += 37) for (let y = 0; y <= s.height; y += 41) hoverAt(s, x, y);
}

describe('bad input', () => {
  it('frequency plots tolerate NaN, infinite, negative and missing samples', () => {
    clean(bodeModel({ hz: junkHz, magDb: junkVals, phaseDeg: junkVals, poles: [{ re: NaN, im: 0 }, { re: -Infinity, im: 1 }, { re: 0, im: 0 }], zeros: [{ re: 1e99, im: -1e99 }] }));
    clean(bodeModel({ hz: [1, 2], magDb: [5], phaseDeg: [] }));
    clean(loopGainModel({ hz: junkHz, magDb: junkVals, phaseDeg: junkVals, margins: { unityGainHz: NaN, phaseMarginDeg: Infinity, phaseCrossHz: -1, gainMarginDb: NaN } }));
    clean(loopGainModel({ hz: [], magDb: [], phaseDeg: [], margins: null }));
    clean(loopGainModel({ hz: [1, 10, 100, 1000], magDb: [20, 0, -20, -40], phaseDeg: [0, -90, -180, -200], margins: { unityGainHz: 10, phaseMarginDeg: Infinity, phaseCrossHz: 100, gainMarginDb: NaN } }));
    clean(impedanceModel({ node: 'x', hz: junkHz, ohms: junkVals, markHz: [NaN, 10] }));
    const flat = impedanceModel({ node: 'y', hz: [1, 10, 100], ohms: [50, 50, 50] });
    clean(flat);
    expect(flat.notes).toEqual([]);
  });

  it('s-plane tolerates non-finite roots, empty and ragged locus data', () => {
    for (const view of ['linear', 'signed-log'] as const) {
      clean(splaneModel({ poles: [{ re: NaN, im: NaN }, { re: 0, im: 0 }], zeros: [{ re: Infinity, im: 0 }], locus: { k: [0, 1], branches: [{ re: [null, NaN], im: [0] }] } }, { view }));
      clean(splaneModel({ poles: [], zeros: [], migrations: [{ before: null, after: null }, { before: { re: -1, im: 0 }, after: { re: -1, im: 0 } }] }, { view }));
      clean(splaneModel({ poles: [{ re: -5, im: 0 }], zeros: [] }, { view }));
    }
  });

  it('step plot tolerates NaN samples, zero final value and bad tolerances', () => {
    clean(stepModel({ t: [0, NaN, 1e-6, 2e-6], y: [0, 1, NaN, 1], finalValue: 1, settling: [{ tolerance: -1, seconds: 5 }, { tolerance: 0.01, seconds: NaN }] }));
    const z = stepModel({ t: [0, 1, 2], y: [0, 0, 0], finalValue: 0, settling: [] });
    clean(z);
    expect(z.notes.join(' ')).toMatch(/final value is 0/);
    clean(stepModel({ t: [0, 1, 2], y: [0, 1, 1], finalValue: 1, settling: [] }, { timeAxis: 'log' }));
  });
});
