import { describe, it, expect } from 'vitest';
import { analyze } from '../../src/engine/index';
import type { Netlist, NetlistPart, OutputSpec } from '../../src/engine/types';

const net = (parts: NetlistPart[], input: string, output: OutputSpec): Netlist => ({ format: 'polesketch-netlist', version: 1, parts, input, output });
const R = (name: string, p: string, n: string, v: string): NetlistPart => ({ name, kind: 'resistor', pins: { p, n }, values: { value: v } });

describe('unit of the transfer gain', () => {
  it('voltage in, voltage out: V/V (divider ratio R2/(R1 + R2), Ohm\'s law)', () => {
    const r = analyze(net([{ name: 'V1', kind: 'vsource', pins: { p: 'a', n: '0' }, values: {} }, R('R1', 'a', 'b', '1k'), R('R2', 'b', '0', '3k')], 'V1', { kind: 'voltage', node: 'b' }));
    expect(r.gainUnit).toBe('V/V');
    expect(r.dcGain).toBeCloseTo(0.75, 12);
  });
  it('current in, voltage out: Ω (transimpedance = the resistance, Ohm\'s law)', () => {
    const r = analyze(net([{ name: 'I1', kind: 'isource', pins: { p: 'a', n: '0' }, values: {} }, R('R1', 'a', '0', '4.7k')], 'I1', { kind: 'voltage', node: 'a' }));
    expect(r.gainUnit).toBe('Ω');
    expect(Math.abs(r.dcGain!)).toBeCloseTo(4700, 6);
  });
  it('voltage in, current out: S, current in, current out: A/A (current divider, Ohm\'s law; a 0 V source as ammeter)', () => {
    const Vm: NetlistPart = { name: 'Vm', kind: 'vsource', pins: { p: 'b', n: '0' }, values: {} };
    const vi = analyze(net([{ name: 'V1', kind: 'vsource', pins: { p: 'a', n: '0' }, values: {} }, R('R1', 'a', 'b', '2k'), Vm], 'V1', { kind: 'current', part: 'Vm' }));
    expect(vi.gainUnit).toBe('S');
    expect(Math.abs(vi.dcGain!)).toBeCloseTo(1 / 2000, 12);
    const ii = analyze(net([{ name: 'I1', kind: 'isource', pins: { p: 'a', n: '0' }, values: {} }, R('R1', 'a', '0', '1k'), R('R2', 'a', 'b', '3k'), Vm], 'I1', { kind: 'current', part: 'Vm' }));
    expect(ii.gainUnit).toBe('A/A');
    expect(Math.abs(ii.dcGain!)).toBeCloseTo(0.25, 12);
  });
  it('no output chosen: no unit (engine contract)', () => {
    const r = analyze({ format: 'polesketch-netlist', version: 1, parts: [{ name: 'V1', kind: 'vsource', pins: { p: 'a', n: '0' }, values: {} }, R('R1', 'a', '0', '1k')], input: 'V1' });
    expect(r.gainUnit).toBeNull();
  });
});
