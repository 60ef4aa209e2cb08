import { describe, expect, it } from 'vitest';
import { createEditor } from '../../src/editor/editor';
import { drive } from '../../src/editor/driver';
import { rubberBand } from '../../src/editor/edits';
import { isOrthogonal } from '../../src/editor/geometry';
import { computeConnectivity } from '../../src/schematic/connectivity';
import { placedPins } from '../../src/schematic/symbols';
import { drawing, part, pt } from '../schematic/build';

describe('rubber-banding keeps wires orthogonal', () => {
  it('inserts an elbow when one end of a straight wire moves sideways', () => {
    const moved = rubberBand([pt(0, 0), pt(100, 0)], (p) => (p.x === 0 ? pt(0, 40) : null));
    expect(moved).toEqual([pt(0, 40), pt(0, 0), pt(100, 0)]);
  });
  it('slides the neighbour vertex of a bent wire', () => {
    const moved = rubberBand([pt(0, 0), pt(50, 0), pt(50, 80)], (p) => (p.x === 0 ? pt(-20, 30) : null));
    expect(moved).toEqual([pt(-20, 30), pt(50, 30), pt(50, 80)]);
    expect(isOrthogonal(moved)).toBe(true);
  });
  it('translates a wire whose two ends move alike', () => {
    expect(rubberBand([pt(0, 0), pt(0, 20), pt(30, 20)], (p) => pt(p.x + 10, p.y + 10))).toEqual([pt(10, 10), pt(10, 30), pt(40, 30)]);
  });
  it('leaves a wire alone when no end moves', () => {
    const w = [pt(0, 0), pt(10, 0)];
    expect(rubberBand(w, () => null)).toBe(w);
  });
});

describe('more editing', () => {
  it('drags a wire out of an unselected part pin and connects it to another pin', () => {
    const e = createEditor(drawing([part('resistor', 'R1', 0, 0), part('resistor', 'R2', 100, 100)]));
    // R1.n (0, 30) → R2.p (100, 70)
    drive(e).drag([0, 30], [100, 70]).expectState('select.idle');
    const ws = Object.values(e.document.wires);
    expect(ws).toHaveLength(1);
    expect(ws[0].points[0]).toEqual(pt(0, 30));
    expect(ws[0].points[ws[0].points.length - 1]).toEqual(pt(100, 70));
    expect(isOrthogonal(ws[0].points)).toBe(true);
    const c = computeConnectivity(e.document);
    expect(c.netOfPin['part:r1#n']).toBe(c.netOfPin['part:r2#p']);
  });

  it('nudges the selection with the arrow keys, one undo entry per step', () => {
    const e = createEditor(drawing([part('resistor', 'R1', 0, 0)]));
    drive(e).click(0, 0).key('ArrowRight').key('ArrowRight').key('ArrowUp');
    expect(e.document.parts['part:r1']).toMatchObject({ x: 20, y: -10 });
    expect(e.history.size.undo).toBe(3);
  });

  it('turning a part from the property panel drags its wires along', () => {
    const e = createEditor(drawing([part('resistor', 'R1', 0, 0), part('resistor', 'R2', 100, 0)], [['a', pt(0, 30), pt(0, 50), pt(100, 50), pt(100, 30)]]));
    e.updatePart('part:r1', { rotation: 90 });
    const r1 = e.document.parts['part:r1'];
    const n = placedPins(r1).find((p) => p.name === 'n')!;
    const w = e.document.wires['wire:a'].points;
    expect(w[0]).toEqual(pt(n.x, n.y));
    expect(isOrthogonal(w)).toBe(true);
    const c = computeConnectivity(e.document);
    expect(c.netOfPin['part:r1#n']).toBe(c.netOfPin['part:r2#n']);
  });

  it('flips a selected group about its centre: mirrored parts keep their connections', () => {
    const e = createEditor(drawing([part('resistor', 'R1', 0, 0), part('nmos', 'M1', 100, 0)], [['a', pt(0, 30), pt(0, 50), pt(80, 50), pt(80, 0)]]));
    const before = computeConnectivity(e.document);
    expect(before.netOfPin['part:r1#n']).toBe(before.netOfPin['part:m1#g']);
    drive(e).key('a', { ctrl: true }).key('f');
    expect(e.document.parts['part:m1'].mirror).toBe(true);
    const after = computeConnectivity(e.document);
    expect(after.netOfPin['part:r1#n']).toBe(after.netOfPin['part:m1#g']);
    expect(isOrthogonal(e.document.wires['wire:a'].points)).toBe(true);
  });
});

describe('whole-drawing transforms keep every connection (geometric invariance, from memory)', () => {
  it('turn, flip and move each example drawing without changing its netlist', async () => {
    const { EXAMPLE_DRAWINGS } = await import('../../src/examples/index');
    const { documentToNetlist } = await import('../../src/schematic/toNetlist');
    for (const ex of EXAMPLE_DRAWINGS) {
      const e = createEditor(ex.load());
      const want = documentToNetlist(e.document).netlist;
      expect(want, ex.id).toBeDefined();
      const d = drive(e).key('a', { ctrl: true });
      for (const k of ['t', 'f', 'ArrowDown', 't', 't', 'f', 'ArrowLeft', 't']) {
        d.key(k);
        const r = documentToNetlist(e.document);
        expect(r.issues, `${ex.id} after ${k}`).toEqual([]);
        expect(r.netlist, `${ex.id} after ${k}`).toEqual(want);
        for (const w of Object.values(e.document.wires)) expect(isOrthogonal(w.points)).toBe(true);
      }
    }
  });
});
