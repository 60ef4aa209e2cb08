// The worker's feedback stage takes the poles, zeros and bandwidth of the run's complete result.
// This checks the app's own contract: the figures are taken (the off sets of both stages agree,
// so the reuse condition holds) and the feedback result is the one computed without them.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runOverlayStage, runStage2 } from '../../src/worker/compute';
import type { RunRequest } from '../../src/worker/protocol';
import { knownFigures } from '../../src/engine/feedback/index';
import type { Netlist } from '../../src/engine/types';

const regulated = JSON.parse(readFileSync('src/examples/netlists/readout-cascode-regulated.json', 'utf8')) as Netlist;

describe('feedback stage after the complete stage', () => {
  for (const off of [false, true]) {
    it(`regulated cascode example, ${off ? 'booster loop off' : 'all loops on'}`, () => {
      const base: RunRequest = { runId: 1, netlist: regulated, frequencyHz: 0, offSources: [], offLoops: [] };
      const loop = runStage2(base).feedback.loops[0].loop;
      const req: RunRequest = off ? { ...base, offSources: [loop.key], offLoops: [loop.id] } : base;
      const complete = runOverlayStage(req).complete();
      const withKnown = runStage2(req, complete).feedback;
      const alone = runStage2(req).feedback;
      const known = knownFigures(complete, complete.conditions.off);
      expect(known?.poles?.poles.length).toBe(complete.poles.length);
      expect([...known!.off].sort()).toEqual([...withKnown.off].sort());
      expect(withKnown.loops.map((l) => [l.loop.id, l.regulation.summary])).toEqual(alone.loops.map((l) => [l.loop.id, l.regulation.summary]));
      expect(withKnown.boosters.map((b) => b.verdict)).toEqual(alone.boosters.map((b) => b.verdict));
      expect(withKnown.doublets?.doublets.length).toBe(alone.doublets?.doublets.length);
    });
  }
});
