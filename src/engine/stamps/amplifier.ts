// Differential amplifier macro: out = A0 · H(s) · (v(inp) − v(inn)), H = one or two real poles.
// Realised as a chain (each stage a VCCS into 1 Ω ∥ C with C = 1/(2π·p), so the stage's DC gain is
// its gm and its pole is at p):
//   <part>.A0     VCCS gm = A0 from inp − inn into <part>#1 (1 Ω, C for p1)   — carries all DC gain
//   <part>.stage2 VCCS gm = 1 from <part>#1 into <part>#2 (1 Ω, C for p2)      — only when p2 is given
//   <part>.out    output: ideal VCVS of gain 1 (rout = 0) or its Norton form gm = 1/rout ∥ 1/rout.
import type { Element } from '../types';
import { capacitance, conductance, vccs, type FieldProblem, type PartFamily, type StampContext } from './common';

const UNIT_R = 1; // Ω, internal stage resistance

function poleStage(ctx: StampContext, label: string, poleHz: number | undefined): { node: number; els: Element[] } {
  const node = ctx.internal(label);
  const els = conductance(ctx.part, `r${label}`, node, -1, 1 / UNIT_R);
  if (poleHz !== undefined) els.push(...capacitance(ctx.part, `pole${label}`, node, -1, 1 / (2 * Math.PI * poleHz * UNIT_R)));
  return { node, els };
}

export const amplifier: PartFamily = {
  spec: {
    pins: ['out', 'inp', 'inn'],
    values: {
      A0: { unit: 'gain', quantity: 'a DC gain', sign: 'any', required: true },
      p1: { unit: 'Hz', quantity: 'a pole frequency', sign: 'positive' },
      p2: { unit: 'Hz', quantity: 'a pole frequency', sign: 'positive' },
      rout: { unit: 'Ω', quantity: 'an output resistance', sign: 'nonnegative' },
    },
    check: (v): FieldProblem[] =>
      v.p2 !== undefined && v.p1 === undefined
        ? [{ field: 'p2', message: 'p2 is given without p1; give the first pole as p1', severity: 'error' }]
        : [],
  },
  stamp: (v, ctx) => {
    const els: Element[] = [];
    const s1 = poleStage(ctx, '1', v.p1);
    els.push(...vccs(ctx.part, 'A0', -1, s1.node, ctx.pin('inp'), ctx.pin('inn'), v.A0 as number), ...s1.els);
    let last = s1.node;
    if (v.p2 !== undefined) {
      const s2 = poleStage(ctx, '2', v.p2);
      els.push(...vccs(ctx.part, 'stage2', -1, s2.node, last, -1, 1 / UNIT_R), ...s2.els);
      last = s2.node;
    }
    const out = ctx.pin('out');
    const rout = v.rout ?? 0;
    if (rout === 0) {
      els.push({ type: 'vcvs', id: `${ctx.part}.out`, part: ctx.part, role: 'out', p: out, n: -1, cp: last, cn: -1, gain: 1, branch: ctx.branch(`${ctx.part}.out`) });
    } else {
      // Norton form of (v(last) in series with rout): inject v(last)/rout into out, 1/rout to ground.
      els.push(...vccs(ctx.part, 'out', -1, out, last, -1, 1 / rout), ...conductance(ctx.part, 'rout', out, -1, 1 / rout));
    }
    return els;
  },
};
