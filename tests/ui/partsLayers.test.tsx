// @vitest-environment jsdom
// The parts are spread over a few Konva layers (each its own canvas, redrawn as a whole by Konva):
// every part is drawn exactly once, wires on their own layer below, and a value edit touches the
// shapes of the one layer holding that part only.
import { describe, expect, it } from 'vitest';
import { render } from '@testing-library/react';
import { Stage } from 'react-konva';
import type Konva from 'konva';
import { produce } from 'immer';
import { PartsLayer, PARTS_PER_LAYER } from '../../src/canvas/PartsLayer';
import { drawing, part } from '../schematic/build';
import type { DrawingDocument, PartId } from '../../src/schematic/document';

function manyResistors(n: number): DrawingDocument {
  const parts = Array.from({ length: n }, (_, i) => part('resistor', `R${String(i + 1).padStart(3, '0')}`, 40 * (i % 20), 80 * Math.floor(i / 20), { params: { value: '1k' } }));
  return drawing(parts, [['w1', { x: 0, y: -30 }, { x: 40, y: -30 }]]);
}

function mount(doc: DrawingDocument) {
  let stage: Konva.Stage | null = null;
  const view = (d: DrawingDocument) => (
    <Stage width={400} height={300} ref={(s) => { if (s) stage = s; }}>
      <PartsLayer doc={d} selection={new Set()} hover={{ type: 'none' } as never} />
    </Stage>
  );
  const r = render(view(doc));
  return { stage: () => stage! as Konva.Stage, rerender: (d: DrawingDocument) => r.rerender(view(d)) };
}

type MockContext = { __getDrawCalls(): { type: string; props: Record<string, unknown> }[]; __clearDrawCalls(): void };
/** The texts a layer draws (read back from the mocked canvas, vitest-canvas-mock). */
const textsOf = (layer: Konva.Layer) => {
  const c = layer.getContext()._context as unknown as MockContext;
  c.__clearDrawCalls();
  layer.draw();
  return c.__getDrawCalls().filter((e) => e.type === 'fillText').map((e) => e.props.text as string);
};
/** The drawing function of each layer's shapes: a layer whose shapes keep theirs is not redrawn. */
const drawersOf = (layer: Konva.Layer) => layer.find('Shape').map((s) => (s as Konva.Shape).sceneFunc());

describe('parts layers', () => {
  it('draws every part once, over ceil(n / PARTS_PER_LAYER) layers above one wire layer', () => {
    const doc = manyResistors(130);
    const { stage } = mount(doc);
    const layers = stage().getLayers();
    expect(layers.length).toBe(1 + Math.ceil(130 / PARTS_PER_LAYER));
    expect(textsOf(layers[0]).length).toBe(0); // the wire layer: lines only
    const refs = layers.slice(1).flatMap((l) => textsOf(l)).filter((t) => /^R\d{3}$/.test(t));
    expect(refs.length).toBe(130);
    expect(new Set(refs).size).toBe(130);
  });

  it('a value edit changes the texts of one layer only (Konva redraws only the layers whose shapes change)', () => {
    const doc = produce(manyResistors(130), () => {});
    const { stage, rerender } = mount(doc);
    const before = stage().getLayers().map(textsOf);
    const drawers = stage().getLayers().map(drawersOf);
    rerender(produce(doc, (d) => { d.parts['part:r077' as PartId].params.value = '2.2k'; }));
    const after = stage().getLayers().map(textsOf);
    const changed = after.map((t, i) => t.join('|') !== before[i].join('|'));
    expect(changed.filter(Boolean).length).toBe(1);
    expect(after[changed.indexOf(true)].some((t) => /2\.2/.test(t))).toBe(true);
    // only that layer got a new drawing function (Konva marks a layer for redraw when a shape changes)
    const redrawn = stage().getLayers().map((l, i) => drawersOf(l).some((f, k) => f !== drawers[i][k]));
    expect(redrawn).toEqual(changed);
  });
});
