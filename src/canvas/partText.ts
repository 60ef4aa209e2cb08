// The short value line printed next to a placed part (display only; the values stay as typed).
import type { PartRecord } from '../schematic/document';
import type { SymbolDef } from '../schematic/symbols';

const NUMBER_AND_PREFIX = /^([+\-−]?(?:\d+\.?\d*|\.\d+)(?:[eE][+\-]?\d+)?)\s*([qryzafpnuµμmkMGTPEZYRQ]?)$/;

/** "10k" → "10 kΩ", "100u" → "100 µA"; a text already carrying its unit is shown as typed. */
export function withUnit(text: string, unit: string): string {
  const t = text.trim();
  const m = NUMBER_AND_PREFIX.exec(t);
  if (!m || unit === '' || unit.includes('/')) return t;
  const prefix = m[2] === 'u' || m[2] === 'μ' ? 'µ' : m[2];
  return `${m[1]} ${prefix}${unit}`;
}

export function partValueText(part: PartRecord, sym: SymbolDef): string {
  const p = part.params;
  const get = (name: string) => (p[name] ?? '').trim();
  switch (sym.role) {
    case 'supply':
    case 'netLabel':
      return get('net');
    case 'ground':
    case 'output':
      return '';
    case 'input':
      return 'input';
    default:
      break;
  }
  if (part.kind === 'nmos' || part.kind === 'pmos') {
    if ((part.mode ?? 'bias') === 'direct') return get('gm') ? `gm ${withUnit(get('gm'), 'S')}` : '';
    const id = get('id');
    const wl = get('w') && get('l') ? `${get('w')}/${get('l')}` : '';
    return [id && withUnit(id, 'A'), wl].filter(Boolean).join('\n');
  }
  if (part.kind === 'npn' || part.kind === 'pnp') return get('ic') ? `Ic ${withUnit(get('ic'), 'A')}` : '';
  if (part.kind === 'amplifier') return get('A0') ? `A0 ${get('A0')}` : '';
  if (part.kind === 'vccs') return get('gm') ? `gm ${withUnit(get('gm'), 'S')}` : '';
  if (part.kind === 'vcvs') return get('gain') ? `×${get('gain')}` : '';
  if (part.kind === 'vsource' || part.kind === 'isource') return part.isInput ? 'input' : '';
  const first = sym.params[0];
  return first ? withUnit(get(first.name), first.unit) : '';
}
