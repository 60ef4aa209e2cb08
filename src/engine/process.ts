// Built-in process cards for bias-based MOS parts.
// The numbers of "demo180-invented" are INVENTED for illustration: they are of a plausible order
// for a 0.18 µm-class CMOS process but are not any real foundry's data.
import type { DeviceCard, ProcessCard } from './types';

export const DEFAULT_PROCESS_NAME = 'demo180-invented';

export const BUILTIN_PROCESSES: Record<string, ProcessCard> = {
  [DEFAULT_PROCESS_NAME]: {
    name: DEFAULT_PROCESS_NAME,
    n: { kPrime: 310e-6, cox: 8.3e-3, lambdaL: 0.09e-6, cov: 0.37e-9, cj: 0.95e-9, eta: 0.21 },
    p: { kPrime: 68e-6, cox: 8.3e-3, lambdaL: 0.11e-6, cov: 0.34e-9, cj: 1.05e-9, eta: 0.24 },
  },
};

const DEVICE_FIELDS: (keyof DeviceCard)[] = ['kPrime', 'cox', 'lambdaL', 'cov', 'cj', 'eta'];

/** Resolve the netlist's `process` field: absent → the default card; a name → a built-in card;
 *  an object → checked field by field. On failure `problem` says which field is wrong. */
export function resolveProcess(p: unknown): { card?: ProcessCard; problem?: { field: string; message: string } } {
  if (p === undefined) return { card: BUILTIN_PROCESSES[DEFAULT_PROCESS_NAME] };
  if (typeof p === 'string') {
    const card = BUILTIN_PROCESSES[p];
    if (card) return { card };
    const known = Object.keys(BUILTIN_PROCESSES).join(', ');
    return { problem: { field: 'process', message: `process: "${p}" is not a built-in process card (known: ${known})` } };
  }
  if (typeof p !== 'object' || p === null) {
    return { problem: { field: 'process', message: 'process: must be a card name or a card object' } };
  }
  const obj = p as Record<string, unknown>;
  for (const pol of ['n', 'p'] as const) {
    const dev = obj[pol];
    if (typeof dev !== 'object' || dev === null) {
      return { problem: { field: `process.${pol}`, message: `process.${pol}: the ${pol}-device card is missing` } };
    }
    for (const f of DEVICE_FIELDS) {
      const v = (dev as Record<string, unknown>)[f];
      if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) {
        return { problem: { field: `process.${pol}.${f}`, message: `process.${pol}.${f}: must be a finite number ≥ 0 in SI units` } };
      }
    }
  }
  const name = typeof obj.name === 'string' && obj.name !== '' ? obj.name : 'inline';
  return { card: { name, n: obj.n as DeviceCard, p: obj.p as DeviceCard } };
}
