// MOSFET small-signal model (nmos and pmos alike): gm·vgs and gmb·vbs from d to s, gds, and
// Cgs, Cgd, Cdb, Csb. Values are given directly, or derived from bias + geometry + process card with
// the square-law model (Razavi, "Design of Analog CMOS Integrated Circuits", ch. 2; Sedra & Smith):
//   gm  = gmid·Id,  or 2·Id/Vov,  or √(2·k'·(W/L)·Id)      (saturation, square law)
//   Vov = 2/gmid (implied by the square law when gm/Id is given)
//   gds = λ·Id with λ = lambdaL / L;   gmb = eta·gm
//   Cgs = ⅔·W·L·Cox + W·Cov;   Cgd = W·Cov;   Cdb = Csb = W·cj
// Direct values override derived ones. The process card is used only when the part gives id, w or
// l; a part with only direct values gets no body effect, no gds and no capacitance it did not name.
// The bulk pin, when absent, is tied to the source (then gmb and Csb drop out).
import type { Element } from '../types';
import { capacitance, conductance, vccs, type FieldProblem, type KindSpec, type PartFamily, type Values } from './common';

const spec: KindSpec = {
  pins: ['d', 'g', 's'],
  optionalPins: ['b'],
  values: {
    gm: { unit: 'S', quantity: 'a transconductance', sign: 'nonnegative' },
    gmb: { unit: 'S', quantity: 'a body transconductance', sign: 'nonnegative' },
    gds: { unit: 'S', quantity: 'an output conductance', sign: 'nonnegative' },
    ro: { unit: 'Ω', quantity: 'an output resistance', sign: 'positive' },
    cgs: { unit: 'F', quantity: 'a capacitance', sign: 'nonnegative' },
    cgd: { unit: 'F', quantity: 'a capacitance', sign: 'nonnegative' },
    cdb: { unit: 'F', quantity: 'a capacitance', sign: 'nonnegative' },
    csb: { unit: 'F', quantity: 'a capacitance', sign: 'nonnegative' },
    id: { unit: 'A', quantity: 'a drain current (give its magnitude)', sign: 'positive' },
    gmid: { unit: '1/V', quantity: 'a gm/Id ratio', sign: 'positive' },
    vov: { unit: 'V', quantity: 'an overdrive voltage (give its magnitude)', sign: 'positive' },
    w: { unit: 'm', quantity: 'a width', sign: 'positive' },
    l: { unit: 'm', quantity: 'a length', sign: 'positive' },
  },
  check: (v: Values): FieldProblem[] => {
    const out: FieldProblem[] = [];
    const biasGm = v.id !== undefined && (v.gmid !== undefined || v.vov !== undefined || (v.w !== undefined && v.l !== undefined));
    if (v.gm === undefined && !biasGm) {
      out.push({ field: 'gm', message: 'give gm, or id together with gmid, vov, or w and l' });
    }
    if (v.gds !== undefined && v.ro !== undefined) out.push({ field: 'ro', message: 'both gds and ro are given; gds is used', severity: 'warning' });
    if (v.gmid !== undefined && v.vov !== undefined) out.push({ field: 'vov', message: 'both gmid and vov are given; gmid is used', severity: 'warning' });
    return out;
  },
};

/** Small-signal values of one device, derived per the relations in the header. */
export function mosSmallSignal(v: Values, dev: { kPrime: number; cox: number; lambdaL: number; cov: number; cj: number; eta: number }) {
  const usesProcess = v.id !== undefined || v.w !== undefined || v.l !== undefined;
  let gm = v.gm;
  if (gm === undefined && v.id !== undefined) {
    if (v.gmid !== undefined) gm = v.gmid * v.id;
    else if (v.vov !== undefined) gm = (2 * v.id) / v.vov;
    else if (v.w !== undefined && v.l !== undefined) gm = Math.sqrt(2 * dev.kPrime * (v.w / v.l) * v.id);
  }
  const gmv = gm ?? 0;
  const gmb = v.gmb ?? (usesProcess ? dev.eta * gmv : 0);
  const gds = v.gds ?? (v.ro !== undefined ? 1 / v.ro : v.id !== undefined && v.l !== undefined ? (dev.lambdaL / v.l) * v.id : 0);
  const w = v.w;
  const cgs = v.cgs ?? (w !== undefined && v.l !== undefined ? (2 / 3) * w * v.l * dev.cox + w * dev.cov : 0);
  const cgd = v.cgd ?? (w !== undefined ? w * dev.cov : 0);
  const cdb = v.cdb ?? (w !== undefined ? w * dev.cj : 0);
  const csb = v.csb ?? (w !== undefined ? w * dev.cj : 0);
  return { gm: gmv, gmb, gds, cgs, cgd, cdb, csb };
}

function makeFamily(polarity: 'n' | 'p'): PartFamily {
  return {
    spec,
    stamp: (v, ctx): Element[] => {
      const ss = mosSmallSignal(v, ctx.process[polarity]);
      const d = ctx.pin('d');
      const g = ctx.pin('g');
      const s = ctx.pin('s');
      const b = ctx.hasPin('b') ? ctx.pin('b') : s;
      const p = ctx.part;
      return [
        ...vccs(p, 'gm', d, s, g, s, ss.gm),
        ...vccs(p, 'gmb', d, s, b, s, ss.gmb),
        ...conductance(p, 'gds', d, s, ss.gds),
        ...capacitance(p, 'cgs', g, s, ss.cgs),
        ...capacitance(p, 'cgd', g, d, ss.cgd),
        ...capacitance(p, 'cdb', d, b, ss.cdb),
        ...capacitance(p, 'csb', s, b, ss.csb),
      ];
    },
  };
}

export const nmos = makeFamily('n');
export const pmos = makeFamily('p');
