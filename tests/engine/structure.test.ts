import { describe, it, expect } from 'vitest';
import { buildMna, expandNetlist } from '../../src/engine/mna';
import { checkStructure } from '../../src/engine/structure';
import type { EngineIssue, Netlist, NetlistPart, OutputSpec } from '../../src/engine/types';

// Each case is a textbook topology fact (Vlach & Singhal ch. 3, MNA solvability: no loops of
// voltage sources, no cut-sets of current sources, no floating nodes).
const net = (parts: NetlistPart[], input?: string, output?: OutputSpec): Netlist => ({ format: 'polesketch-netlist', version: 1, parts, input, output });
const part = (name: string, kind: NetlistPart['kind'], pins: Record<string, string>, values: Record<string, string | number> = {}): NetlistPart => ({ name, kind, pins, values });
const R = (name: string, p: string, n: string, v: string | number = '1k') => part(name, 'resistor', { p, n }, { value: v });
const Cp = (name: string, p: string, n: string, v: string | number = '1p') => part(name, 'capacitor', { p, n }, { value: v });
const V = (name: string, p: string, n: string) => part(name, 'vsource', { p, n });
const I = (name: string, p: string, n: string) => part(name, 'isource', { p, n });
const check = (n: Netlist) => checkStructure(expandNetlist(n));
const errors = (is: EngineIssue[]) => is.filter((i) => i.severity === 'error');

describe('checkStructure', () => {
  it('accepts a clean stage with no issues at all', () => {
    const n = net([V('V1', 'in', '0'), R('R1', 'in', 'out'), Cp('C1', 'out', '0')], 'V1', { kind: 'voltage', node: 'out' });
    expect(check(n)).toEqual([]);
    expect(buildMna(n).system).toBeDefined();
  });

  it('names a floating node (no path to ground through any element)', () => {
    const is = check(net([V('V1', 'in', '0'), R('R1', 'in', '0'), R('R2', 'x', 'y'), R('R3', 'y', 'x')]));
    expect(errors(is)).toEqual([expect.objectContaining({ code: 'floating-node', node: 'x' })]);
    expect(errors(is)[0].message).toMatch(/"x", "y"/);
  });

  it('a node whose only path to ground is capacitive is accepted (pole at s = 0)', () => {
    const n = net([V('V1', 'in', '0'), Cp('C1', 'in', 'x'), Cp('C2', 'x', '0'), part('M1', 'nmos', { d: 'out', g: 'x', s: '0' }, { gm: '1m' }), R('RD', 'out', '0')], 'V1', { kind: 'voltage', node: 'out' });
    expect(errors(check(n))).toEqual([]);
    expect(buildMna(n).system).toBeDefined();
  });

  it('names the vsource closing a loop of voltage sources', () => {
    const is = check(net([V('V1', 'a', '0'), V('V2', 'a', '0'), R('R1', 'a', '0')]));
    expect(errors(is)).toEqual([expect.objectContaining({ code: 'vsource-loop', part: 'V2' })]);
  });

  it('names a vcvs output in a loop with a vsource, and a source shorted on itself', () => {
    const a = check(net([V('V1', 'a', '0'), part('E1', 'vcvs', { p: 'a', n: '0', cp: 'b', cn: '0' }, { gain: 2 }), R('R1', 'b', '0')]));
    expect(errors(a)).toEqual([expect.objectContaining({ code: 'vsource-loop', part: 'E1' })]);
    const b = check(net([V('V1', 'a', 'a'), R('R1', 'a', '0')]));
    expect(errors(b)).toContainEqual(expect.objectContaining({ code: 'vsource-loop', part: 'V1' }));
  });

  it('two amplifier outputs tied together form a loop', () => {
    const amp = (name: string) => part(name, 'amplifier', { out: 'o', inp: 'in', inn: '0' }, { A0: 100 });
    const is = check(net([V('V1', 'in', '0'), amp('A1'), amp('A2')]));
    expect(errors(is)).toContainEqual(expect.objectContaining({ code: 'vsource-loop', part: 'A2' }));
  });

  it('an inductor across a vsource is only a warning (short at DC)', () => {
    const is = check(net([V('V1', 'a', '0'), part('L1', 'inductor', { p: 'a', n: '0' }, { value: '1u' })], 'V1', { kind: 'current', part: 'L1' }));
    expect(errors(is)).toEqual([]);
    expect(is).toContainEqual(expect.objectContaining({ severity: 'warning', code: 'vsource-loop', part: 'L1' }));
  });

  it('names a cut-set of current sources (node fed only by an ideal current source)', () => {
    const is = check(net([I('I1', 'x', '0'), V('V1', 'in', '0'), R('R1', 'in', '0')]));
    expect(errors(is)).toEqual([expect.objectContaining({ code: 'isource-cutset', node: 'x', part: 'I1' })]);
  });

  it('names a group of nodes joined to the rest only through two current sources', () => {
    const is = check(net([I('I1', 'a', '0'), I('I2', '0', 'b'), R('R1', 'a', 'b'), Cp('C1', 'a', 'b'), V('V1', 'in', '0'), R('R2', 'in', '0')]));
    expect(errors(is)).toEqual([expect.objectContaining({ code: 'isource-cutset', node: 'a' })]);
    expect(errors(is)[0].message).toMatch(/I1, I2/);
  });

  it('warns about a pin that shares its node with no other pin, naming part and pin', () => {
    const is = check(net([V('V1', 'in', '0'), R('R1', 'in', '0'), R('R2', 'in', 'dangle')]));
    expect(errors(is)).toEqual([]);
    expect(is).toEqual([expect.objectContaining({ severity: 'warning', code: 'unconnected-pin', part: 'R2', field: 'pins.n', node: 'dangle' })]);
    expect(is[0].message).toMatch(/^R2\.n: /);
  });

  it('asks for an input when an output is requested', () => {
    const is = check(net([R('R1', 'a', '0'), R('R2', 'a', '0')], undefined, { kind: 'voltage', node: 'a' }));
    expect(errors(is)).toEqual([expect.objectContaining({ code: 'no-input' })]);
  });

  it('numeric check names a node nothing determines: ideal transconductor into no load', () => {
    // Passes the graph checks (the gm output ties "out" to ground) yet G + sC is singular for all s:
    // no element current depends on v(out).
    const n = net([V('V1', 'g', '0'), part('M1', 'nmos', { d: 'out', g: 'g', s: '0' }, { gm: '1m' }), part('M2', 'nmos', { d: 'x', g: 'g', s: '0' }, { gm: '1m' }), R('R1', 'x', '0')], 'V1', { kind: 'voltage', node: 'out' });
    const is = check(n);
    expect(errors(is)).toEqual([expect.objectContaining({ code: 'singular', node: 'out' })]);
    expect(buildMna(n).system).toBeUndefined();
  });

  it('numeric check names a branch part: a unity vcvs whose output drives its own control', () => {
    // v(a) − 1·v(a) = 0 leaves the branch row empty for every s (Vlach & Singhal: degenerate MNA row).
    const n = net([part('E1', 'vcvs', { p: 'a', n: '0', cp: 'a', cn: '0' }, { gain: 1 }), R('R1', 'a', '0')]);
    expect(errors(check(n))).toEqual([expect.objectContaining({ code: 'singular', part: 'E1' })]);
    const ok = net([part('E1', 'vcvs', { p: 'a', n: '0', cp: 'a', cn: '0' }, { gain: 2 }), R('R1', 'a', '0')]);
    expect(errors(check(ok))).toEqual([]);
  });

  it('numeric check accepts stiff but sound circuits (wide value spread, amplifier internal nodes)', () => {
    const n = net([
      V('V1', 'in', '0'),
      part('A1', 'amplifier', { out: 'o', inp: 'in', inn: 'fb' }, { A0: '120dB', p1: '1', p2: '100M' }),
      R('RF', 'o', 'fb', '1G'), R('RG', 'fb', '0', '1'), Cp('CL', 'o', '0', '1f'),
      part('M1', 'nmos', { d: 'd', g: 'o', s: '0' }, { id: '1u', gmid: 25, w: '100u', l: '10u' }), R('RD', 'd', '0', '1G'),
    ], 'V1', { kind: 'voltage', node: 'd' });
    expect(errors(check(n))).toEqual([]);
  });

  it('a gyrator (two VCCS) is not mistaken for a cut-set and is not singular', () => {
    const n = net([
      I('I1', 'a', '0'),
      part('G1', 'vccs', { p: 'a', n: '0', cp: 'b', cn: '0' }, { gm: '1m' }),
      part('G2', 'vccs', { p: 'b', n: '0', cp: '0', cn: 'a' }, { gm: '1m' }),
      Cp('C1', 'b', '0'),
    ], 'I1', { kind: 'voltage', node: 'a' });
    expect(errors(check(n))).toEqual([]);
  });
});
