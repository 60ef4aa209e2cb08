// Independent sources. In the small-signal system a vsource is a branch (short when not the input)
// and an isource adds nothing but, when it is the input, the right-hand side b (see mna.ts).
import type { Element } from '../types';
import type { PartFamily } from './common';

export const vsource: PartFamily = {
  spec: { pins: ['p', 'n'], values: {}, ignored: ['ac', 'dc'] },
  stamp: (_v, ctx): Element[] => [{ type: 'vsource', part: ctx.part, role: 'v', p: ctx.pin('p'), n: ctx.pin('n'), branch: ctx.branch(ctx.part) }],
};

export const isource: PartFamily = {
  spec: { pins: ['p', 'n'], values: {}, ignored: ['ac', 'dc'] },
  stamp: (_v, ctx): Element[] => [{ type: 'isource', part: ctx.part, role: 'i', p: ctx.pin('p'), n: ctx.pin('n') }],
};
