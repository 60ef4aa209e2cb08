import { describe, it, expect } from 'vitest';
import { canonicalNode, isGroundName, validateNetlist } from '../../src/engine/netlist';
import type { EngineIssue } from '../../src/engine/types';

// Netlist checks are specified by the engine contract (src/engine/types.ts): messages name part and field.
function net(parts: unknown[], extra: Record<string, unknown> = {}) {
  return { format: 'polesketch-netlist', version: 1, parts, ...extra };
}
const R = (name: string, p: string, n: string, value: unknown) => ({ name, kind: 'resistor', pins: { p, n }, values: { value } });
const C = (name: string, p: string, n: string, value: unknown) => ({ name, kind: 'capacitor', pins: { p, n }, values: { value } });
const V = (name: string, p: string, n: string) => ({ name, kind: 'vsource', pins: { p, n }, values: { ac: 1 } });
const errors = (issues: EngineIssue[]) => issues.filter((i) => i.severity === 'error');

describe('validateNetlist', () => {
  it('accepts a well-formed divider and returns it', () => {
    const r = validateNetlist(net([V('V1', 'in', '0'), R('R1', 'in', 'out', '1k'), R('R2', 'out', 'gnd', '1k')], {
      input: 'V1', output: { kind: 'voltage', node: 'out' },
    }));
    expect(r.issues).toEqual([]);
    expect(r.netlist?.parts.length).toBe(3);
  });

  it('names part and field for a value that is not an SI number', () => {
    const r = validateNetlist(net([R('R3', 'a', '0', '4.7x')]));
    expect(r.netlist).toBeUndefined();
    expect(r.issues).toContainEqual(expect.objectContaining({
      severity: 'error', code: 'bad-value', part: 'R3', field: 'value',
      message: 'R3.value: "4.7x" is not a number with an SI prefix',
    }));
  });

  it('rejects a negative capacitance and a zero resistance (facts of the trade)', () => {
    const r = validateNetlist(net([C('C2', 'a', '0', '-1p'), R('R1', 'a', '0', 0)]));
    const msgs = errors(r.issues).map((i) => i.message);
    expect(msgs).toContain('C2.value: a capacitance cannot be negative');
    expect(msgs).toContain('R1.value: a resistance must be greater than zero');
  });

  it('rejects a value with the wrong unit and a missing required value', () => {
    const r = validateNetlist(net([R('R1', 'a', '0', '2pF'), { name: 'C1', kind: 'capacitor', pins: { p: 'a', n: '0' }, values: {} }]));
    expect(errors(r.issues)).toContainEqual(expect.objectContaining({ part: 'R1', field: 'value', message: expect.stringMatching(/^R1\.value: .*F.*Ω/) }));
    expect(errors(r.issues)).toContainEqual(expect.objectContaining({ part: 'C1', field: 'value', message: 'C1.value: a capacitance is required for a capacitor' }));
  });

  it('names an unknown kind', () => {
    const r = validateNetlist(net([{ name: 'X1', kind: 'memristor', pins: {}, values: {} }]));
    expect(r.issues[0]).toMatchObject({ code: 'unknown-kind', part: 'X1', field: 'kind' });
    expect(r.issues[0].message).toMatch(/^X1\.kind: "memristor" is not a known kind/);
  });

  it('names a missing pin', () => {
    const r = validateNetlist(net([{ name: 'M1', kind: 'nmos', pins: { d: 'out', s: '0' }, values: { gm: '1m' } }]));
    expect(r.issues).toContainEqual(expect.objectContaining({ code: 'missing-pin', part: 'M1', field: 'pins.g' }));
    expect(r.issues.find((i) => i.code === 'missing-pin')!.message).toMatch(/^M1\.g: /);
  });

  it('accepts an nmos without bulk pin (tied to source)', () => {
    const r = validateNetlist(net([V('V1', 'g', '0'), { name: 'M1', kind: 'nmos', pins: { d: 'd', g: 'g', s: '0' }, values: { gm: '1m' } }, R('RD', 'd', '0', '10k')]));
    expect(errors(r.issues)).toEqual([]);
  });

  it('names duplicate part names', () => {
    const r = validateNetlist(net([R('R1', 'a', '0', '1k'), R('R1', 'a', '0', '2k')]));
    expect(r.issues).toContainEqual(expect.objectContaining({ code: 'duplicate-name', part: 'R1' }));
  });

  it('rejects an input naming an unknown part or a part that is not a source', () => {
    const a = validateNetlist(net([R('R1', 'a', '0', '1k')], { input: 'V9' }));
    expect(a.issues).toContainEqual(expect.objectContaining({ code: 'unknown-part', field: 'input', message: expect.stringContaining('"V9"') }));
    const b = validateNetlist(net([R('R1', 'a', '0', '1k')], { input: 'R1' }));
    expect(b.issues).toContainEqual(expect.objectContaining({ code: 'unknown-part', part: 'R1', field: 'input' }));
  });

  it('rejects an output naming an unknown node, ground, or a part whose current is not an unknown', () => {
    const base = [V('V1', 'in', '0'), R('R1', 'in', 'out', '1k'), R('R2', 'out', '0', '1k')];
    const a = validateNetlist(net(base, { input: 'V1', output: { kind: 'voltage', node: 'nowhere' } }));
    expect(a.issues).toContainEqual(expect.objectContaining({ code: 'unknown-node', field: 'output.node', node: 'nowhere' }));
    const b = validateNetlist(net(base, { input: 'V1', output: { kind: 'voltage', node: 'GND' } }));
    expect(b.issues).toContainEqual(expect.objectContaining({ code: 'unknown-node', field: 'output.node' }));
    const c = validateNetlist(net(base, { input: 'V1', output: { kind: 'current', part: 'R1' } }));
    expect(c.issues).toContainEqual(expect.objectContaining({ code: 'unknown-part', part: 'R1', field: 'output.part' }));
    const d = validateNetlist(net(base, { input: 'V1', output: { kind: 'current', part: 'V1' } }));
    expect(errors(d.issues)).toEqual([]);
    const e = validateNetlist(net(base, { input: 'V1', output: { kind: 'voltage', node: 'out', ref: 'in' } }));
    expect(errors(e.issues)).toEqual([]);
  });

  it('keeps "#" for internal nodes of a part (e.g. A1#1)', () => {
    const r = validateNetlist(net([R('R1', 'A1#1', '0', '1k')]));
    expect(errors(r.issues)).toEqual([expect.objectContaining({ part: 'R1', field: 'pins.p' })]);
  });

  it('treats "0" and "gnd" as the same ground node', () => {
    expect(isGroundName('0')).toBe(true);
    expect(isGroundName('gnd')).toBe(true);
    expect(isGroundName('GND')).toBe(true);
    expect(isGroundName('g')).toBe(false);
    expect(canonicalNode(' gnd ')).toBe('0');
    expect(canonicalNode('out')).toBe('out');
  });

  it('checks the shape: format, version, parts list, non-object input', () => {
    expect(validateNetlist(null).issues[0].code).toBe('bad-value');
    expect(validateNetlist({ format: 'other', version: 2, parts: [] }).issues.map((i) => i.field)).toEqual(['format', 'version']);
    expect(validateNetlist({ format: 'polesketch-netlist', version: 1 }).issues[0].field).toBe('parts');
    expect(validateNetlist(net([42])).issues[0].field).toBe('parts[0]');
  });

  it('checks MOS and BJT value combinations, naming the field', () => {
    const m = validateNetlist(net([{ name: 'M1', kind: 'nmos', pins: { d: 'd', g: 'g', s: '0' }, values: { id: '100u' } }]));
    expect(errors(m.issues)).toContainEqual(expect.objectContaining({ part: 'M1', field: 'gm', message: expect.stringMatching(/^M1\.gm: give gm/) }));
    const q = validateNetlist(net([{ name: 'Q1', kind: 'npn', pins: { c: 'c', b: 'b', e: '0' }, values: { ic: '1m' } }]));
    expect(errors(q.issues)).toContainEqual(expect.objectContaining({ part: 'Q1', field: 'rpi' }));
    const w = validateNetlist(net([{ name: 'M2', kind: 'pmos', pins: { d: 'd', g: 'g', s: '0' }, values: { gm: '1m', w: '2pF' } }]));
    expect(errors(w.issues)).toContainEqual(expect.objectContaining({ part: 'M2', field: 'w' }));
  });

  it('warns about values and pins a kind does not have', () => {
    const r = validateNetlist(net([{ name: 'R1', kind: 'resistor', pins: { p: 'a', n: '0', x: 'b' }, values: { value: '1k', tol: '5' } }]));
    expect(errors(r.issues)).toEqual([]);
    expect(r.issues.map((i) => i.field).sort()).toEqual(['pins.x', 'tol']);
  });

  it('checks an amplifier gain in dB and its poles', () => {
    const ok = validateNetlist(net([{ name: 'A1', kind: 'amplifier', pins: { out: 'o', inp: 'p', inn: 'n' }, values: { A0: '80dB', p1: '10', p2: '10MHz' } }]));
    expect(errors(ok.issues)).toEqual([]);
    const bad = validateNetlist(net([{ name: 'A1', kind: 'amplifier', pins: { out: 'o', inp: 'p', inn: 'n' }, values: { A0: '80dB', p1: '-1' } }]));
    expect(errors(bad.issues)).toContainEqual(expect.objectContaining({ part: 'A1', field: 'p1' }));
  });

  it('checks the process field', () => {
    const a = validateNetlist(net([], { process: 'no-such-card' }));
    expect(a.issues[0]).toMatchObject({ field: 'process' });
    const b = validateNetlist(net([], { process: { name: 'x', n: { kPrime: 1, cox: 1, lambdaL: 1, cov: 1, cj: 1, eta: 0 }, p: { kPrime: 1 } } }));
    expect(b.issues[0]).toMatchObject({ field: 'process.p.cox' });
    expect(validateNetlist(net([], { process: 'demo180-invented' })).issues).toEqual([]);
  });
});

describe('malformed input never throws (engine rule: a status, not an exception)', () => {
  it('validateNetlist and buildMna return issues for junk', async () => {
    const { buildMna } = await import('../../src/engine/mna');
    const junk: unknown[] = [
      undefined, 42, 'x', [], { format: 'polesketch-netlist', version: 1, parts: [null, 1, {}] },
      net([{ name: 'R1', kind: 'resistor', pins: 5, values: 'no' }]),
      net([{ name: 'R1', kind: 'resistor', pins: { p: 1, n: null }, values: { value: {} } }]),
      net([{ name: 'M1', kind: 'nmos', pins: { d: 'd', g: 'g', s: 's', b: '' }, values: { gm: 'abc', w: -1 } }]),
      net([R('R1', 'a', '0', '1k')], { input: 7, output: 'out', process: 3 }),
      net([R('R1', 'a', '0', '1k')], { output: { kind: 'voltage' } }),
    ];
    for (const j of junk) {
      const v = validateNetlist(j);
      expect(v.netlist).toBeUndefined();
      expect(errors(v.issues).length).toBeGreaterThan(0);
      const b = buildMna(j as never);
      expect(b.system).toBeUndefined();
      expect(errors(b.issues).length).toBeGreaterThan(0);
    }
  });
});
