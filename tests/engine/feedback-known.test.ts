// The feedback analysis may take the poles, zeros and bandwidth that the small-signal analysis has
// already worked out for the same network (the live view runs that first). This checks the
// engine's own contract (common practice: reused figures must not change the answer): with those
// figures the feedback result is the one it computes alone, and figures worked out with other
// sources off are not used.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/engine/index';
import type { Netlist } from '../../src/engine/types';
import { analyzeFeedback, knownFigures } from '../../src/engine/feedback/index';
import type { FeedbackResult } from '../../src/engine/feedback/index';
import { boostedChain } from '../bench/feedback-bench';

const regulated = JSON.parse(readFileSync('src/examples/netlists/readout-cascode-regulated.json', 'utf8')) as Netlist;

// (identical stages give repeated poles, which two eigenvalue runs place alike only to about 1e-7)
const rel = (a: number | null, b: number | null) => (a === null || b === null ? (a === b ? 0 : Infinity) : Math.abs(a - b) / Math.max(Math.abs(b), 1e-300));

/** `clear`: compare only doublets spaced closer than this; a pair near the edge of the 10 % rule
 *  may be matched to a neighbouring pole instead when the pole lists differ in the last digits. */
function expectSame(withKnown: FeedbackResult, alone: FeedbackResult, clear = Infinity) {
  expect(withKnown.loops.map((l) => l.loop.id)).toEqual(alone.loops.map((l) => l.loop.id));
  expect(withKnown.boosters.map((b) => b.ok)).toEqual(alone.boosters.map((b) => b.ok));
  withKnown.boosters.forEach((b, i) => expect(rel(b.mainBandwidthHz, alone.boosters[i].mainBandwidthHz)).toBeLessThan(1e-6));
  const near = (r: FeedbackResult) => (r.doublets?.doublets ?? []).filter((d) => d.spacing < clear);
  expect(near(withKnown).length).toBe(near(alone).length);
  near(withKnown).forEach((d, i) => expect(rel(d.poleHz, near(alone)[i].poleHz)).toBeLessThan(1e-6));
  const p1 = withKnown.slowestPole?.pole, p0 = alone.slowestPole?.pole;
  expect(rel(p1 ? Math.hypot(p1.re, p1.im) : null, p0 ? Math.hypot(p0.re, p0.im) : null)).toBeLessThan(1e-6);
  const s1 = withKnown.step?.settling ?? [], s0 = alone.step?.settling ?? [];
  expect(s1.length).toBe(s0.length);
  s1.forEach((s, i) => expect(rel(s.seconds, s0[i].seconds)).toBeLessThan(1e-6));
}

describe('feedback analysis with figures already known', () => {
  for (const [name, nl] of [['regulated cascode example', regulated], ['boosted chain of 4 stages', boostedChain(4)]] as const) {
    it(`${name}: the same result as computed alone, loops on`, () => {
      const r = analyze(nl);
      const known = knownFigures(r, r.conditions.off);
      expect(known?.poles?.poles.length).toBeGreaterThan(0);
      expectSame(analyzeFeedback(nl, { known }), analyzeFeedback(nl));
    });
  }

  it('with a loop off: figures computed with that loop off are used, others are not', () => {
    const nl = boostedChain(4);
    const key = analyzeFeedback(nl).loops[0].loop.key;
    const rOff = analyze(nl, { off: [key] });
    const alone = analyzeFeedback(nl, { off: [key] });
    expectSame(analyzeFeedback(nl, { off: [key], known: knownFigures(rOff, rOff.conditions.off) }), alone, 0.01);
    // a deliberately wrong bandwidth shows whether the known figures were taken
    const rOn = analyze(nl);
    const wrongOn = { ...knownFigures(rOn, rOn.conditions.off)!, bandwidthHz: 1 };
    expect(analyzeFeedback(nl, { off: [key], known: wrongOn }).boosters.map((b) => b.mainBandwidthHz)).toEqual(alone.boosters.map((b) => b.mainBandwidthHz));
    const wrongOff = { ...knownFigures(rOff, rOff.conditions.off)!, bandwidthHz: 1 };
    const taken = analyzeFeedback(nl, { off: [key], known: wrongOff }).boosters;
    expect(taken.length).toBeGreaterThan(0);
    expect(taken.every((b) => b.mainBandwidthHz === 1)).toBe(true);
  });
});
