// Degenerate circuits give named errors (or correct figures), never NaN or a throw: through the
// engine netlist the CLI reads, through the live path (the worker's two stages), and drawn.
// MNA solvability facts from Vlach & Singhal, "Computer Methods for Circuit Analysis and
// Design", ch. 3: no loop of voltage sources, no cut-set of current sources, no floating node.
import { describe, expect, it } from 'vitest';
import { analyze, type Netlist, type NetlistPart } from '../../src/engine/index';
import { analyzeFeedback } from '../../src/engine/feedback/index';
import { runStage1, runStage2 } from '../../src/worker/compute';
import type { PartId } from '../../src/schematic/document';
import { createLiveStore } from '../../src/live/store';
import { drawing, part, pt } from '../schematic/build';
import { csStage } from '../live/fixtures';
import { checkLive, nonFinitePaths, syncRunner } from './appChecks';

const net = (parts: NetlistPart[], input?: string, out?: string): Netlist =>
  ({ format: 'polesketch-netlist', version: 1, parts, input, output: out ? { kind: 'voltage', node: out } : undefined });
const P = (name: string, kind: NetlistPart['kind'], pins: Record<string, string>, values: Record<string, string | number> = {}): NetlistPart => ({ name, kind, pins, values });
const R = (name: string, p: string, n: string, v: string | number = '1k') => P(name, 'resistor', { p, n }, { value: v });
const C = (name: string, p: string, n: string, v = '1p') => P(name, 'capacitor', { p, n }, { value: v });
const V = (name: string, p: string, n = '0') => P(name, 'vsource', { p, n });
const I = (name: string, p: string, n = '0') => P(name, 'isource', { p, n });
const amp = (A0: string | number, inn: string) => P('A1', 'amplifier', { out: 'a', inp: 'in', inn }, { A0, p1: '1k' });

/** Every path a netlist takes in the app: analyze, the feedback analysis, the worker's stages. */
function everyPath(nl: Netlist) {
  const req = { runId: 1, netlist: nl, frequencyHz: 0, offSources: [], offLoops: [] };
  const out = { a: analyze(nl), f: analyzeFeedback(nl), s1: runStage1(req), s2: runStage2(req) };
  expect(nonFinitePaths(out)).toEqual([]);
  for (const i of [...out.a.issues, ...out.f.issues]) expect(i.message).not.toMatch(/internal problem|NaN|undefined/);
  return out;
}

const ERRORS: [string, Netlist, Record<string, string>, RegExp][] = [
  ['a floating node', net([V('V1', 'in'), R('R1', 'in', '0'), R('R2', 'b', 'c')], 'V1', 'in'),
    { code: 'floating-node', node: 'b' }, /no path to ground/],
  ['a loop of voltage sources', net([V('V1', 'in'), V('V2', 'in'), R('R1', 'in', 'a'), R('R2', 'a', '0')], 'V1', 'a'),
    { code: 'vsource-loop', part: 'V2' }, /loop of voltage sources/],
  ['a cut-set of current sources', net([I('I1', 'x'), V('V1', 'in'), R('R1', 'in', 'a'), R('R2', 'a', '0')], 'V1', 'a'),
    { code: 'isource-cutset', node: 'x', part: 'I1' }, /I1/],
  ['a 0 Ω resistor', net([V('V1', 'in'), R('R1', 'in', 'a', 0), R('R2', 'a', '0')], 'V1', 'a'),
    { code: 'bad-value', part: 'R1', field: 'value' }, /greater than zero/],
  ['an amplifier of infinite gain (typed "inf")', net([V('V1', 'in'), amp('inf', 'a'), R('RL', 'a', '0')], 'V1', 'a'),
    { code: 'bad-value', part: 'A1', field: 'A0' }, /infinite value cannot be analysed/],
  ['an amplifier of infinite gain (typed "1e400")', net([V('V1', 'in'), amp('1e400', 'a'), R('RL', 'a', '0')], 'V1', 'a'),
    { code: 'bad-value', part: 'A1', field: 'A0' }, /too large to represent/],
  // open loop, gain 1e300: nothing finite sets the output (singular to working precision)
  ['an open-loop amplifier of gain 1e300', net([V('V1', 'in'), amp(1e300, '0'), R('RL', 'a', '0')], 'V1', 'a'),
    { code: 'singular', part: 'A1' }, /A1/],
];

describe('degenerate engine netlists: a named error on every path', () => {
  for (const [what, nl, where, re] of ERRORS) {
    it(what, () => {
      const { a, f, s1 } = everyPath(nl);
      expect(a.ok).toBe(false);
      expect(s1.ok).toBe(false);
      expect(f.ok).toBe(false);
      const err = a.issues.find((i) => i.severity === 'error')!;
      expect(err).toMatchObject(where);
      expect(err.message).toMatch(re);
      expect(a.poles).toEqual([]);
      expect(a.dcGain).toBeNull();
    });
  }
});

describe('degenerate but solvable: correct figures, nulls with reasons', () => {
  it('a lone capacitor driven by a current: one pole at s = 0, the DC gain unbounded (ideal integrator)', () => {
    // v = i/(sC): a single pole at the origin, |Z(jω)| = 1/(ωC) (textbook integrator)
    const { a } = everyPath(net([I('I1', 'a'), C('C1', 'a', '0', '1p')], 'I1', 'a'));
    expect(a.ok).toBe(true);
    expect(a.poles).toHaveLength(1);
    expect(a.poles[0].kind).toBe('origin');
    expect(a.poleInfo).toMatchObject({ originCount: 1, infiniteCount: 0 });
    expect(a.dcGain).toBeNull();
    expect(a.reasons.dcGain).toMatch(/s = 0/);
    const node = a.nodes.find((n) => n.name === 'a')!;
    expect(node.openAtDc).toBe(true);
    const f = a.conditions.frequencyHz!;
    expect(node.z!.mag * 2 * Math.PI * f * 1e-12).toBeCloseTo(1, 9);
  });

  it('a lone capacitor with nothing else: no input, no figures, one integrator pole, no NaN', () => {
    const { a } = everyPath(net([C('C1', 'a', '0', '1p')]));
    expect(a.poles.map((p) => p.kind)).toEqual(['origin']);
    expect(a.reasons.dcGain).toMatch(/no input/);
    expect(a.issues).toContainEqual(expect.objectContaining({ code: 'unconnected-pin', part: 'C1' }));
  });

  it('a follower of gain 1e300: closed-loop gain A/(1+A) = 1 (textbook feedback)', () => {
    const { a } = everyPath(net([V('V1', 'in'), amp(1e300, 'a'), R('RL', 'a', '0')], 'V1', 'a'));
    expect(a.ok).toBe(true);
    expect(a.dcGain).toBeCloseTo(1, 12);
  });
});

function live(doc: ReturnType<typeof drawing>) {
  const store = createLiveStore({ runner: syncRunner(() => true) });
  store.actions.submit(doc);
  const st = store.getState();
  store.actions.dispose();
  expect(checkLive(st)).toEqual([]);
  return st;
}

describe('degenerate drawings: the live store shows named errors at their place', () => {
  it('a lone capacitor on ground: its open pin is marked where it is', () => {
    const st = live(drawing([part('capacitor', 'C1', 0, 0), part('ground', 'GND1', 0, 30)]));
    expect(st.status).toBe('error');
    expect(st.issues.find((i) => i.severity === 'error')).toMatchObject({ code: 'unconnected-pin', part: 'part:c1', x: 0, y: -30 });
  });

  it('an island of parts with no path to ground: floating-net at the island', () => {
    const doc = csStage();
    doc.parts['part:rx' as PartId] = part('resistor', 'RX', 400, 100);
    doc.parts['part:ry' as PartId] = part('resistor', 'RY', 500, 100);
    doc.wires['wire:i1' as `wire:${string}`] = { id: 'wire:i1', points: [pt(400, 70), pt(400, 50), pt(500, 50), pt(500, 70)] };
    doc.wires['wire:i2' as `wire:${string}`] = { id: 'wire:i2', points: [pt(400, 130), pt(400, 150), pt(500, 150), pt(500, 130)] };
    const st = live(doc);
    expect(st.status).toBe('error');
    const f = st.issues.find((i) => i.code === 'floating-net' && i.severity === 'error')!;
    expect(f.message).toMatch(/no path to ground/);
    expect(f.x).not.toBeNull();
  });

  it('two voltage sources on one net (a loop of voltage sources): outputs-shorted at the second', () => {
    const doc = drawing([
      part('vsource', 'V1', 0, 0, { isInput: true }), part('vsource', 'V2', 100, 0),
      part('ground', 'GND1', 0, 30), part('ground', 'GND2', 100, 30), part('resistor', 'R1', 200, 0),
      part('ground', 'GND3', 200, 30),
    ], [['t', pt(0, -30), pt(100, -30), pt(200, -30)]]);
    const st = live(doc);
    expect(st.status).toBe('error');
    expect(st.issues.find((i) => i.code === 'outputs-shorted')).toMatchObject({ severity: 'error', part: 'part:v2' });
  });

  it('a 0 Ω load in the common-source stage: bad-value at R1, the old result not shown', () => {
    const st = live(csStage('0'));
    expect(st.status).toBe('error');
    expect(st.issues.find((i) => i.code === 'bad-value')).toMatchObject({ part: 'part:r1', field: 'value' });
    expect(st.result).toBeNull();
  });
});
