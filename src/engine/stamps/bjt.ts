// Bipolar hybrid-π model (Gray, Hurst, Lewis & Meyer, "Analysis and Design of Analog Integrated
// Circuits", ch. 1): gm = Ic/VT, rπ = β/gm, ro = VA/Ic, Cπ = gm·τF + Cje, Cμ. npn and pnp share the
// small-signal model (gm·vbe from c to e). Direct values gm, rpi, ro, cpi, cmu override derived ones.
import type { Element } from '../types';
import { capacitance, conductance, vccs, type FieldProblem, type KindSpec, type PartFamily, type Values } from './common';

/** Thermal voltage kT/q at 300 K from the exact SI 2019 values of k and q (≈ 25.85 mV). */
export const VT_300K = (1.380649e-23 * 300) / 1.602176634e-19;

const spec: KindSpec = {
  pins: ['c', 'b', 'e'],
  values: {
    ic: { unit: 'A', quantity: 'a collector current (give its magnitude)', sign: 'positive' },
    beta: { unit: '', quantity: 'a current gain β', sign: 'positive' },
    va: { unit: 'V', quantity: 'an Early voltage (give its magnitude)', sign: 'positive' },
    tf: { unit: 's', quantity: 'a forward transit time', sign: 'nonnegative' },
    cje: { unit: 'F', quantity: 'a capacitance', sign: 'nonnegative' },
    cmu: { unit: 'F', quantity: 'a capacitance', sign: 'nonnegative' },
    gm: { unit: 'S', quantity: 'a transconductance', sign: 'nonnegative' },
    rpi: { unit: 'Ω', quantity: 'an input resistance rπ', sign: 'positive' },
    ro: { unit: 'Ω', quantity: 'an output resistance', sign: 'positive' },
    cpi: { unit: 'F', quantity: 'a capacitance', sign: 'nonnegative' },
  },
  check: (v: Values): FieldProblem[] => {
    const out: FieldProblem[] = [];
    if (v.gm === undefined && v.ic === undefined) out.push({ field: 'gm', message: 'give gm, or the collector current ic' });
    if (v.rpi === undefined && v.beta === undefined) out.push({ field: 'rpi', message: 'give rpi, or the current gain beta' });
    return out;
  },
};

export function bjtSmallSignal(v: Values) {
  const gm = v.gm ?? (v.ic as number) / VT_300K;
  const rpi = v.rpi ?? (gm > 0 ? (v.beta as number) / gm : Infinity);
  const ro = v.ro ?? (v.va !== undefined && v.ic !== undefined ? v.va / v.ic : Infinity);
  const cpi = v.cpi ?? gm * (v.tf ?? 0) + (v.cje ?? 0);
  const cmu = v.cmu ?? 0;
  return { gm, rpi, ro, cpi, cmu };
}

function makeFamily(): PartFamily {
  return {
    spec,
    stamp: (v, ctx): Element[] => {
      const ss = bjtSmallSignal(v);
      const c = ctx.pin('c');
      const b = ctx.pin('b');
      const e = ctx.pin('e');
      const p = ctx.part;
      return [
        ...vccs(p, 'gm', c, e, b, e, ss.gm),
        ...conductance(p, 'gpi', b, e, 1 / ss.rpi),
        ...conductance(p, 'go', c, e, 1 / ss.ro),
        ...capacitance(p, 'cpi', b, e, ss.cpi),
        ...capacitance(p, 'cmu', b, c, ss.cmu),
      ];
    },
  };
}

export const npn = makeFamily();
export const pnp = makeFamily();
