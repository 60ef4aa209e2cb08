// A loop through a whole chain of gain-boosted cascode stages (overall resistive feedback) must be
// listed, with the chains that pass a device through its booster folded into it as variants, and
// must not be folded into a short local loop of one stage. Expectations: the loop is the signal path
// M1a → M1b → M2a → … (common practice: a global feedback loop through every gain stage); its cycle
// gain at DC is far above the detection threshold (each stage gains gm·ro-order, from memory).
import { describe, expect, it } from 'vitest';
import { buildMna } from '../../src/engine/index';
import { discoverLoops } from '../../src/engine/feedback/index';
import { boostedChain } from '../bench/feedback-bench';

describe('loop through a whole boosted chain', () => {
  for (const stages of [3, 12]) {
    it(`${stages} stages: the whole-chain loop is found, listed first, booster detours folded in`, () => {
      const sys = buildMna(boostedChain(stages)).system!;
      const d = discoverLoops(sys);
      const devices = Array.from({ length: stages }, (_, k) => [`M${k + 1}a`, `M${k + 1}b`]).flat();
      const chain = d.loops.find((l) => l.parts.length === devices.length && devices.every((p) => l.parts.includes(p)));
      expect(chain, d.loops.map((l) => l.label).join('; ')).toBeDefined();
      // in signal order: each device is followed by the next one along the chain (cyclically)
      const at = chain!.parts.indexOf('M1a');
      const inOrder = [...chain!.parts.slice(at), ...chain!.parts.slice(0, at)];
      expect(inOrder).toEqual(devices);
      expect(chain!.kind).toBe('global');
      // the largest loop of the stage: it comes first and is kept under the cap
      expect(d.loops[0].id).toBe(chain!.id);
      expect(chain!.peakCycleGain).toBeGreaterThan(1e3);
      // a pass through a booster (Mka → Ak → Mkb) is the same loop, listed as its variant (on the short
      // chain, where the enumeration reaches every such pass)
      if (stages === 3) expect(chain!.variants.some((v) => v.split('>').some((p) => p.startsWith('A')))).toBe(true);
      // no short loop swallowed the chain: no variant of a one- or two-part loop runs through every device
      for (const l of d.loops) {
        if (l.parts.length > 2) continue;
        for (const v of l.variants) expect(devices.every((p) => v.split('>').includes(p))).toBe(false);
      }
    });
  }
});
