// Resistor, capacitor, inductor (MNA stamps: Ho, Ruehli & Brennan 1975; Vlach & Singhal, ch. 3).
// An inductor keeps its current as an unknown: v(p) − v(n) − s·L·i = 0.
import type { Element } from '../types';
import { capacitance, conductance, type PartFamily } from './common';

export const resistor: PartFamily = {
  spec: { pins: ['p', 'n'], values: { value: { unit: 'Ω', quantity: 'a resistance', sign: 'positive', required: true } } },
  stamp: (v, ctx) => conductance(ctx.part, 'r', ctx.pin('p'), ctx.pin('n'), 1 / (v.value as number)),
};

export const capacitor: PartFamily = {
  spec: { pins: ['p', 'n'], values: { value: { unit: 'F', quantity: 'a capacitance', sign: 'nonnegative', required: true } } },
  stamp: (v, ctx) => capacitance(ctx.part, 'c', ctx.pin('p'), ctx.pin('n'), v.value as number),
};

export const inductor: PartFamily = {
  spec: { pins: ['p', 'n'], values: { value: { unit: 'H', quantity: 'an inductance', sign: 'nonnegative', required: true } } },
  stamp: (v, ctx): Element[] => [
    { type: 'inductance', part: ctx.part, role: 'l', a: ctx.pin('p'), b: ctx.pin('n'), l: v.value as number, branch: ctx.branch(ctx.part) },
  ],
};
