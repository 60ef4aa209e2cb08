// Controlled sources. VCCS: gm·(v(cp) − v(cn)) leaves node p and enters node n (types.ts).
// VCVS: v(p) − v(n) = gain·(v(cp) − v(cn)), with its output current as a branch unknown.
import type { Element } from '../types';
import { vccs as vccsElement, type PartFamily } from './common';

export const vccs: PartFamily = {
  spec: { pins: ['p', 'n', 'cp', 'cn'], values: { gm: { unit: 'S', quantity: 'a transconductance', sign: 'any', required: true } } },
  stamp: (v, ctx) => vccsElement(ctx.part, 'gm', ctx.pin('p'), ctx.pin('n'), ctx.pin('cp'), ctx.pin('cn'), v.gm as number),
};

export const vcvs: PartFamily = {
  spec: { pins: ['p', 'n', 'cp', 'cn'], values: { gain: { unit: 'gain', quantity: 'a voltage gain', sign: 'any', required: true } } },
  stamp: (v, ctx): Element[] => [{
    type: 'vcvs', id: `${ctx.part}.gain`, part: ctx.part, role: 'gain',
    p: ctx.pin('p'), n: ctx.pin('n'), cp: ctx.pin('cp'), cn: ctx.pin('cn'), gain: v.gain as number, branch: ctx.branch(ctx.part),
  }],
};
