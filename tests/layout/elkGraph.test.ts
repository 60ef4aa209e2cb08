import { describe, expect, it } from 'vitest';
import { toElkGraph, ELK_SIDE } from '../../src/layout/elkGraph';
import { buildModel } from '../../src/layout/model';
import { joinRoute } from '../../src/layout/applyLayout';
import { Occupancy } from '../../src/layout/occupancy';
import { mazeRoute } from '../../src/layout/maze';
import { drawing, part, pt } from '../schematic/build';

function stage() {
  return drawing(
    [part('input', 'IN1', 0, 100), part('nmos', 'M1', 100, 100), part('resistor', 'R1', 110, 10), part('supply', 'VR1', 110, -20),
      part('ground', 'GND1', 110, 130), part('output', 'OUT1', 200, 60)],
    [['w1', pt(20, 100), pt(80, 100)], ['w2', pt(110, 40), pt(110, 70)], ['w3', pt(110, 60), pt(180, 60)]],
  );
}

describe('document → ELK graph', () => {
  it('uses elk.-prefixed option keys with string values (ELK JSON format, common practice)', () => {
    const g = toElkGraph(stage(), buildModel(stage()));
    expect(g.layoutOptions['elk.algorithm']).toBe('layered');
    expect(g.layoutOptions['elk.direction']).toBe('RIGHT');
    expect(g.layoutOptions['elk.edgeRouting']).toBe('ORTHOGONAL');
    expect(g.layoutOptions['elk.spacing.nodeNode']).toMatch(/^\d+$/);
    expect(g.layoutOptions['elk.layered.spacing.nodeNodeBetweenLayers']).toMatch(/^\d+$/);
    const all = [g.layoutOptions, ...g.children.map((c) => c.layoutOptions ?? {}), ...g.children.flatMap((c) => (c.ports ?? []).map((p) => p.layoutOptions))];
    for (const o of all) for (const [k, v] of Object.entries(o)) { expect(k.startsWith('elk.')).toBe(true); expect(typeof v).toBe('string'); }
  });

  it('makes each moving part a node with fixed-side ports at its pins; rails become stubs, not nodes', () => {
    const doc = stage();
    const g = toElkGraph(doc, buildModel(doc));
    expect(g.children.map((c) => c.id).sort()).toEqual(['part:in1', 'part:m1', 'part:out1', 'part:r1']);
    for (const c of g.children) expect(c.layoutOptions?.['elk.portConstraints']).toBe('FIXED_SIDE');
    const m1 = g.children.find((c) => c.id === 'part:m1')!;
    // nMOS pins: drain up, gate left, source down (symbols/nmos.json); bulk hidden (tied to source).
    expect(Object.fromEntries(m1.ports!.map((p) => [p.id, p.layoutOptions['elk.port.side']]))).toEqual({
      'part:m1#d': 'NORTH', 'part:m1#g': 'WEST', 'part:m1#s': 'SOUTH',
    });
    expect(ELK_SIDE.right).toBe('EAST');
    expect(g.children.find((c) => c.id === 'part:in1')!.layoutOptions?.['elk.layered.layering.layerConstraint']).toBe('FIRST');
    expect(g.children.find((c) => c.id === 'part:out1')!.layoutOptions?.['elk.layered.layering.layerConstraint']).toBe('LAST');
    // Edges only for signal nets: input→gate, and the drain net (R1.n, OUT1.p from M1.d or back).
    const ends = g.edges.map((e) => [e.sources[0], e.targets[0]].sort().join(' '));
    expect(ends).toContain('part:in1#p part:m1#g');
    expect(g.edges.length).toBe(3);
    expect(g.edges.some((e) => e.sources[0] === 'part:in1#p')).toBe(true); // the input drives its net
    // Node boxes sit on the grid and hold every pin.
    for (const c of g.children) {
      expect(c.width % 10).toBe(0);
      for (const p of c.ports!) { expect(p.x).toBeGreaterThanOrEqual(0); expect(p.x).toBeLessThanOrEqual(c.width); }
    }
  });
});

describe('rebuilding wires on the grid', () => {
  it('joins a snapped route to pins that ELK slid along their side', () => {
    const w = joinRoute({ x: 0, y: 10, side: 'right' }, { x: 100, y: 40, side: 'left' }, [{ x: 50, y: 20 }, { x: 50, y: 30 }]);
    expect(w[0]).toEqual({ x: 0, y: 10 });
    expect(w[w.length - 1]).toEqual({ x: 100, y: 40 });
    for (let i = 1; i < w.length; i++) expect(w[i].x === w[i - 1].x || w[i].y === w[i - 1].y).toBe(true);
  });

  it('lets wires of two nets cross at right angles but never run along or end on each other', () => {
    const occ = new Occupancy();
    occ.addWire([pt(0, 50), pt(100, 50)], 'a');
    expect(occ.wireFits([pt(50, 0), pt(50, 100)], 'b')).toBe(true); // crossing, no vertex: no connection
    expect(occ.wireFits([pt(50, 0), pt(50, 50)], 'b')).toBe(false); // would make a T-junction
    expect(occ.wireFits([pt(20, 50), pt(80, 50)], 'b')).toBe(false); // runs along
    expect(occ.wireFits([pt(20, 50), pt(20, 80)], 'a')).toBe(true); // same net may join
    occ.addBody({ x: 200, y: 0, width: 30, height: 30 });
    expect(occ.wireFits([pt(190, 10), pt(240, 10)], 'b')).toBe(false); // through a symbol
  });

  it('routes around a body and across another net with the maze router (Lee 1961)', () => {
    const occ = new Occupancy();
    occ.addBody({ x: 40, y: -20, width: 40, height: 40 });
    occ.addWire([pt(100, -60), pt(100, 60)], 'other');
    const r = mazeRoute(occ, { net: 'n', from: pt(0, 0), side: 'right', targets: [pt(150, 0)], area: { x: -50, y: -100, width: 250, height: 200 } });
    expect(r).not.toBeNull();
    expect(r![0]).toEqual(pt(0, 0));
    expect(r![r!.length - 1]).toEqual(pt(150, 0));
    expect(occ.wireFits(r!, 'n')).toBe(true);
    // Boxed in by symbol bodies: no route, a null instead of an exception.
    const box = new Occupancy();
    for (const r of [{ x: -40, y: -40, width: 80, height: 25 }, { x: -40, y: 15, width: 80, height: 25 }, { x: -40, y: -40, width: 25, height: 80 }, { x: 15, y: -40, width: 25, height: 80 }]) box.addBody(r);
    expect(mazeRoute(box, { net: 'n', from: pt(0, 0), targets: [pt(100, 0)], area: { x: -50, y: -50, width: 200, height: 100 } })).toBeNull();
  });
});
