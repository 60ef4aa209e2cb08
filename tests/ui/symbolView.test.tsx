// @vitest-environment jsdom
import { describe, it, expect } from 'vitest';
import { render } from '@testing-library/react';
import { Layer, Stage } from 'react-konva';
import type Konva from 'konva';
import { SymbolView, arcPoints, orientAlign, textBeyondTurnedBody } from '../../src/canvas/SymbolView';
import { partValueText, withUnit } from '../../src/canvas/partText';
import { SYMBOLS, SYMBOL_KINDS, toWorld } from '../../src/schematic/symbols';
import { newPart } from '../../src/schematic/kinds';
import type { Rotation } from '../../src/schematic/document';

function drawn(kind: keyof typeof SYMBOLS, rotation: Rotation, mirror: boolean, showBulk = false) {
  let stage: Konva.Stage | null = null;
  render(
    <Stage width={200} height={200} ref={(s) => { stage = s; }}>
      <Layer>
        <SymbolView symbol={SYMBOLS[kind]} x={40} y={70} rotation={rotation} mirror={mirror} color="#000" showBulk={showBulk} label="X1" value="1k" />
      </Layer>
    </Stage>,
  );
  return stage! as Konva.Stage;
}

describe('symbol view', () => {
  it('draws one shape per primitive of every symbol', () => {
    for (const kind of SYMBOL_KINDS) {
      const sym = SYMBOLS[kind];
      const stage = drawn(kind, 0, false, true);
      const strokes = sym.primitives.filter((p) => p.type === 'line' || p.type === 'polyline' || p.type === 'arc').length;
      const circles = sym.primitives.filter((p) => p.type === 'circle').length;
      const texts = sym.primitives.filter((p) => p.type === 'text').length;
      expect(stage.find('Line').length, kind).toBe(strokes);
      expect(stage.find('Circle').length, kind).toBe(circles);
      expect(stage.find('Text').length, kind).toBe(texts + 2); // + reference and value
    }
  });

  it('hides the bulk lead unless the bulk is a pin', () => {
    const bulkLines = SYMBOLS.nmos.primitives.filter((p) => 'optional' in p && p.optional === 'bulk').length;
    expect(bulkLines).toBeGreaterThan(0);
    expect(drawn('nmos', 0, false, true).find('Line').length - drawn('nmos', 0, false, false).find('Line').length).toBe(bulkLines);
  });

  it("Konva's group transform puts every pin where the connectivity code places it", () => {
    // Two independent implementations of the placement rule in symbols/README.md (mirror, then
    // clockwise quarter turn, then translate) must agree: Konva's matrix and symbols.ts toWorld.
    for (const kind of ['nmos', 'amplifier', 'vccs', 'resistor', 'netLabel'] as const) {
      for (const rotation of [0, 90, 180, 270] as Rotation[]) {
        for (const mirror of [false, true]) {
          const stage = drawn(kind, rotation, mirror);
          const group = stage.findOne('Line')!.getParent()!;
          for (const pin of SYMBOLS[kind].pins) {
            const k = group.getAbsoluteTransform().point({ x: pin.x, y: pin.y });
            const w = toWorld(pin, { x: 40, y: 70, rotation, mirror });
            expect(k.x, `${kind} ${rotation} ${mirror} ${pin.name}`).toBeCloseTo(w.x, 9);
            expect(k.y).toBeCloseTo(w.y, 9);
          }
        }
      }
    }
  });

  it('samples arcs on the circle, clockwise on screen from start to end (common practice)', () => {
    const pts = arcPoints(1, 2, 5, 270, 90); // right half of a circle: top → right → bottom
    for (let i = 0; i < pts.length; i += 2) expect(Math.hypot(pts[i] - 1, pts[i + 1] - 2)).toBeCloseTo(5, 12);
    expect(pts[0]).toBeCloseTo(1, 12); expect(pts[1]).toBeCloseTo(-3, 12);
    const mid = pts.length / 2 - 1;
    expect(pts[mid]).toBeCloseTo(6, 12); expect(pts[mid + 1]).toBeCloseTo(2, 12);
    expect(pts[pts.length - 2]).toBeCloseTo(1, 12); expect(pts[pts.length - 1]).toBeCloseTo(7, 12);
  });

  it('keeps text reading away from the body after a turn or mirror', () => {
    expect(orientAlign('start', { x: 12, y: 0 }, 0, false)).toBe('start');
    expect(orientAlign('start', { x: 12, y: 0 }, 0, true)).toBe('end');
    expect(orientAlign('start', { x: 12, y: 0 }, 180, false)).toBe('end');
    expect(orientAlign('start', { x: 12, y: -6 }, 90, false)).toBe('start'); // (12,-6) → (6, 12): right of origin
    expect(orientAlign('middle', { x: 0, y: -30 }, 90, true)).toBe('middle');
    // text inside a body that stands vertical goes past the body's far end
    const sym = SYMBOLS.resistor;
    const inside = { x: sym.bounds.x + 1, y: sym.bounds.y + 1 };
    expect(textBeyondTurnedBody(sym, inside, 0, false, 8)).toBeNull();
    expect(textBeyondTurnedBody(sym, inside, 90, false, 8)).not.toBeNull();
  });

  it('prints values with their unit and SI prefix', () => {
    expect(withUnit('10k', 'Ω')).toBe('10 kΩ');
    expect(withUnit('100u', 'A')).toBe('100 µA');
    expect(withUnit('2 pF', 'F')).toBe('2 pF'); // typed with its unit: left as typed
    const r = newPart('resistor', 'part:r1', 'R1', { x: 0, y: 0 });
    r.params.value = '4.7k';
    expect(partValueText(r, SYMBOLS.resistor)).toBe('4.7 kΩ');
    const m = newPart('nmos', 'part:m1', 'M1', { x: 0, y: 0 });
    m.params = { ...m.params, id: '50u', w: '8u', l: '1u' };
    expect(partValueText(m, SYMBOLS.nmos)).toBe('50 µA\n8u/1u');
  });
});
