// @vitest-environment jsdom
// Symbols on the canvas: drawSymbols (src/canvas/drawSymbol.ts) renders symbolItems onto a 2D
// context; the calls are read back from the mocked canvas (vitest-canvas-mock records every path
// and text). Pin positions are checked against this file's own reading of the placement rule.
import { describe, it, expect } from 'vitest';
import { render } from '@testing-library/react';
import { Layer, Stage } from 'react-konva';
import type Konva from 'konva';
import { SymbolView } from '../../src/canvas/SymbolView';
import { drawSymbols } from '../../src/canvas/drawSymbol';
import { arcPoints, orientAlign, symbolItems, textBeyondTurnedBody } from '../../src/export/symbolGeometry';
import { partValueText, withUnit } from '../../src/canvas/partText';
import { SYMBOLS, SYMBOL_KINDS } from '../../src/schematic/symbols';
import { newPart } from '../../src/schematic/kinds';
import type { Rotation } from '../../src/schematic/document';

interface Ev { type: string; props: Record<string, unknown> & { path?: Ev[] } }
type MockContext = CanvasRenderingContext2D & { __getDrawCalls(): Ev[]; __clearDrawCalls(): void };

function drawn(kind: keyof typeof SYMBOLS, rotation: Rotation, mirror: boolean, showBulk = false, label = 'X1', value = '1k') {
  const c = document.createElement('canvas').getContext('2d') as MockContext;
  const items = symbolItems(SYMBOLS[kind], { x: 40, y: 70, rotation, mirror, showBulk, label, value });
  drawSymbols(c, [{ items, style: { color: '#000000', width: 1.5, labelColor: '#333333' } }]);
  const calls = c.__getDrawCalls();
  const paths = calls.filter((e) => e.type === 'stroke').map((e): Ev[] => e.props.path ?? []);
  const subpaths = paths.map((p) => p.filter((e) => e.type === 'moveTo').length);
  const vertices = paths.flat().filter((e: Ev) => e.type === 'moveTo' || e.type === 'lineTo').map((e: Ev) => ({ x: e.props.x as number, y: e.props.y as number }));
  const texts = calls.filter((e) => e.type === 'fillText').map((e) => ({ text: e.props.text as string, x: e.props.x as number, y: e.props.y as number }));
  return { subpaths, vertices, texts, fills: calls.filter((e) => e.type === 'fill').length };
}

/** symbols/README.md: mirror x first, then the clockwise quarter turn (screen y down), then move. */
function placedByRule(p: { x: number; y: number }, rotation: Rotation, mirror: boolean) {
  const mx = mirror ? -p.x : p.x;
  const a = (rotation * Math.PI) / 180;
  return { x: 40 + mx * Math.cos(a) - p.y * Math.sin(a), y: 70 + mx * Math.sin(a) + p.y * Math.cos(a) };
}

describe('symbol view', () => {
  it('draws every primitive of every symbol: line work as subpaths, filled shapes filled, texts plus reference and value', () => {
    for (const kind of SYMBOL_KINDS) {
      const sym = SYMBOLS[kind];
      const d = drawn(kind, 0, false, true);
      const open = sym.primitives.filter((p) => ((p.type === 'line' || p.type === 'polyline' || p.type === 'arc') && !('fill' in p && p.fill)) || (p.type === 'circle' && !p.fill)).length;
      const filled = sym.primitives.filter((p) => (p.type === 'polyline' || p.type === 'circle') && p.fill).length;
      const texts = sym.primitives.filter((p) => p.type === 'text').length;
      expect(d.subpaths[0] ?? 0, kind).toBe(open);
      expect(d.fills, kind).toBe(filled);
      expect(d.texts.length, kind).toBe(texts + 2); // + reference and value
    }
  });

  it('hides the bulk lead unless the bulk is a pin', () => {
    const bulkLines = SYMBOLS.nmos.primitives.filter((p) => 'optional' in p && p.optional === 'bulk').length;
    expect(bulkLines).toBeGreaterThan(0);
    expect(drawn('nmos', 0, false, true).subpaths[0] - drawn('nmos', 0, false, false).subpaths[0]).toBe(bulkLines);
  });

  it('every pin ends a drawn lead, where the placement rule puts it, in all eight orientations', () => {
    for (const kind of SYMBOL_KINDS) {
      for (const rotation of [0, 90, 180, 270] as Rotation[]) {
        for (const mirror of [false, true]) {
          const { vertices } = drawn(kind, rotation, mirror, true);
          for (const pin of SYMBOLS[kind].pins) {
            const w = placedByRule(pin, rotation, mirror);
            const hit = vertices.some((v) => Math.abs(v.x - w.x) < 1e-9 && Math.abs(v.y - w.y) < 1e-9);
            expect(hit, `${kind} ${rotation} ${mirror} ${pin.name}`).toBe(true);
          }
        }
      }
    }
  });

  it('a two-line value is drawn as two lines, the second below the first', () => {
    const { texts } = drawn('nmos', 0, false, false, 'M1', '50 µA\n8u/1u');
    const a = texts.find((t) => t.text === '50 µA')!, b = texts.find((t) => t.text === '8u/1u')!;
    expect(a && b).toBeTruthy();
    expect(b.y).toBeGreaterThan(a.y + 5);
    expect(b.x).toBe(a.x);
  });

  it('SymbolView is one Konva shape that draws the symbol', () => {
    let stage: Konva.Stage | null = null;
    render(
      <Stage width={200} height={200} ref={(s) => { stage = s; }}>
        <Layer><SymbolView symbol={SYMBOLS.resistor} x={40} y={70} rotation={0} mirror={false} color="#000" label="R1" value="1k" /></Layer>
      </Stage>,
    );
    const layer = (stage! as Konva.Stage).getLayers()[0];
    expect(layer.find('Shape').length).toBe(1);
    const c = layer.getContext()._context as unknown as MockContext;
    c.__clearDrawCalls();
    layer.draw();
    expect(c.__getDrawCalls().filter((e) => e.type === 'fillText').map((e) => e.props.text)).toEqual(['R1', '1k']);
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
