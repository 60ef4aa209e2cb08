import { describe, expect, it } from 'vitest';
import { createEditor } from '../../src/editor/editor';
import { drive } from '../../src/editor/driver';
import { isOrthogonal } from '../../src/editor/geometry';
import { computeConnectivity } from '../../src/schematic/connectivity';
import { pinKey, type PartId } from '../../src/schematic/document';
import { placedPins } from '../../src/schematic/symbols';
import { drawing, part, pt } from '../schematic/build';

const wires = (e: ReturnType<typeof createEditor>) => Object.values(e.document.wires);
const parts = (e: ReturnType<typeof createEditor>) => Object.values(e.document.parts);

describe('place tool', () => {
  it('places parts snapped to the grid with automatic references, turned and flipped while placing', () => {
    const e = createEditor();
    const d = drive(e).key('1').expectState('place.ghost').move(43, 58);
    expect(e.state.ghost).toMatchObject({ kind: 'resistor', x: 40, y: 60 });
    d.key('t').click(43, 58).click(104, 61).key('Escape').expectState('select.idle');
    expect(parts(e).map((p) => [p.ref, p.x, p.y, p.rotation])).toEqual([['R1', 40, 60, 90], ['R2', 100, 60, 90]]);
    d.key('3').key('f').click(200, 200).key('Escape');
    expect(parts(e).find((p) => p.ref === 'M1')).toMatchObject({ mirror: true, kind: 'nmos' });
    expect(e.history.size.undo).toBe(3); // one entry per placed part
  });

  it('places once from a palette drag and selects the new part', () => {
    const e = createEditor();
    drive(e).send({ type: 'tool', tool: 'place', kind: 'capacitor', once: true }).move(50, 50).up(50, 50).expectState('select.idle');
    expect([...e.selection]).toEqual([parts(e)[0].id]);
  });
});

describe('wire tool', () => {
  it('draws an automatic elbow and ends on a pin', () => {
    const e = createEditor(drawing([part('resistor', 'R1', 0, 0), part('resistor', 'R2', 100, 100)]));
    // R1.n at (0, 30); R2.p at (100, 70)
    const d = drive(e).key('c').expectState('wire.idle').click(0, 30).expectState('wire.drawing').move(100, 70);
    expect(e.state.wirePreview).toEqual([pt(0, 30), pt(100, 30), pt(100, 70)]);
    d.click(100, 70).expectState('wire.idle');
    expect(wires(e).map((w) => w.points)).toEqual([[pt(0, 30), pt(100, 30), pt(100, 70)]]);
    const c = computeConnectivity(e.document);
    expect(c.netOfPin[pinKey({ part: 'part:r1', pin: 'n' })]).toBe(c.netOfPin[pinKey({ part: 'part:r2', pin: 'p' })]);
  });

  it('ends on another wire (T-junction) and Escape drops an unfinished wire', () => {
    const e = createEditor(drawing([], [['a', pt(0, 0), pt(100, 0)]]));
    const d = drive(e).key('c').click(50, 50).move(50, 0).click(50, 0).expectState('wire.idle');
    expect(wires(e)).toHaveLength(2);
    expect(computeConnectivity(e.document).junctions).toEqual([pt(50, 0)]);
    d.click(200, 200).move(260, 200).click(260, 200).key('Escape').expectState('wire.idle');
    expect(wires(e)).toHaveLength(2);
  });

  it('finishes with Enter or a double click on the last point', () => {
    const e = createEditor();
    drive(e).key('c').click(0, 0).click(40, 0).click(40, 40).key('Enter');
    drive(e).click(100, 0).click(140, 0).click(140, 0);
    expect(wires(e).map((w) => w.points)).toEqual([[pt(0, 0), pt(40, 0), pt(40, 40)], [pt(100, 0), pt(140, 0)]]);
  });
});

describe('select tool', () => {
  const two = () => createEditor(drawing([part('resistor', 'R1', 0, 0), part('resistor', 'R2', 100, 0)], [['a', pt(0, 30), pt(0, 50), pt(100, 50), pt(100, 30)]]));

  it('selects by click, adds with Shift, boxes, and clears on an empty click', () => {
    const e = two();
    const d = drive(e).click(0, 0);
    expect([...e.selection]).toEqual(['part:r1']);
    d.click(100, 0, { shift: true });
    expect(new Set(e.selection)).toEqual(new Set(['part:r1', 'part:r2']));
    d.click(300, 300);
    expect(e.selection.size).toBe(0);
    d.drag([-30, -40], [130, 60]).expectState('select.idle');
    expect(new Set(e.selection)).toEqual(new Set(['part:r1', 'part:r2', 'wire:a']));
  });

  it('moves a part with its wires rubber-banded and orthogonal, as one undo entry', () => {
    const e = two();
    const before = e.history.size.undo;
    drive(e).click(0, 0).drag([0, 0], [-20, -30]).expectState('select.idle');
    expect(e.document.parts['part:r1']).toMatchObject({ x: -20, y: -30 });
    const w = e.document.wires['wire:a'].points;
    expect(isOrthogonal(w)).toBe(true);
    expect(w[0]).toEqual(pt(-20, 0)); // follows R1.n
    expect(w[w.length - 1]).toEqual(pt(100, 30)); // R2.n stays
    const c = computeConnectivity(e.document);
    expect(c.netOfPin['part:r1#n']).toBe(c.netOfPin['part:r2#n']);
    expect(e.history.size.undo).toBe(before + 1);
    drive(e).key('z', { ctrl: true });
    expect(e.document.parts['part:r1']).toMatchObject({ x: 0, y: 0 });
    expect(e.document.wires['wire:a'].points).toEqual([pt(0, 30), pt(0, 50), pt(100, 50), pt(100, 30)]);
  });

  it('Escape during a drag puts everything back and records nothing', () => {
    const e = two();
    const d = drive(e).click(0, 0).move(0, 0).down(0, 0).move(30, 0).move(60, 0).expectState('select.moving');
    expect(e.document.parts['part:r1'].x).toBe(60);
    d.key('Escape').expectState('select.idle').up(60, 0);
    expect(e.document.parts['part:r1'].x).toBe(0);
    expect(e.history.size.undo).toBe(0);
  });

  it('turns a selected part in place; attached wires stay connected and orthogonal', () => {
    const e = two();
    drive(e).click(100, 0).key('t');
    const r2 = e.document.parts['part:r2' as PartId];
    expect(r2.rotation).toBe(90);
    const w = e.document.wires['wire:a'].points;
    expect(isOrthogonal(w)).toBe(true);
    const n = placedPins(r2).find((p) => p.name === 'n')!;
    expect(w[w.length - 1]).toEqual({ x: n.x, y: n.y });
  });
});

describe('camera', () => {
  it('pans with the middle button, zooms to the cursor, and records nothing in the history', () => {
    const e = createEditor(drawing([part('resistor', 'R1', 0, 0)]));
    const c0 = e.camera;
    // screen positions given explicitly: the pointer travels 100 px right, 40 px down
    e.dispatch({ type: 'pointerDown', x: 0, y: 0, sx: 10, sy: 10, button: 1 });
    expect(e.state.mode).toBe('pan.dragging');
    e.dispatch({ type: 'pointerMove', x: 0, y: 0, sx: 60, sy: 30 });
    e.dispatch({ type: 'pointerMove', x: 0, y: 0, sx: 110, sy: 50 });
    drive(e).send({ type: 'pointerUp', x: 0, y: 0, sx: 110, sy: 50, button: 1 }).expectState('select.idle');
    expect(e.camera.x - c0.x).toBe(100);
    expect(e.camera.y - c0.y).toBe(40);
    const before = e.camera;
    // the world point under the cursor stays put when zooming (zoom to cursor)
    const w = { x: (300 - before.x) / before.scale, y: (200 - before.y) / before.scale };
    e.dispatch({ type: 'wheel', sx: 300, sy: 200, deltaY: -100 });
    expect(e.camera.scale).toBeGreaterThan(before.scale);
    expect(w.x * e.camera.scale + e.camera.x).toBeCloseTo(300, 9);
    expect(w.y * e.camera.scale + e.camera.y).toBeCloseTo(200, 9);
    expect(e.history.size.undo).toBe(0);
  });
});
