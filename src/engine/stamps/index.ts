// Registry of part families by netlist kind.
import type { PartKind } from '../types';
import type { PartFamily } from './common';
import { capacitor, inductor, resistor } from './passive';
import { vccs, vcvs } from './controlled';
import { amplifier } from './amplifier';
import { isource, vsource } from './sources';
import { nmos, pmos } from './mos';
import { npn, pnp } from './bjt';

export const FAMILIES: Record<PartKind, PartFamily> = {
  resistor, capacitor, inductor, vccs, vcvs, amplifier, vsource, isource, nmos, pmos, npn, pnp,
};

export function isPartKind(k: unknown): k is PartKind {
  return typeof k === 'string' && Object.prototype.hasOwnProperty.call(FAMILIES, k);
}
