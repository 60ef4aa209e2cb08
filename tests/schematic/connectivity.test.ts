import { describe, expect, it } from 'vitest';
import { computeConnectivity } from '../../src/schematic/connectivity';
import { pinKey } from '../../src/schematic/document';
import { placedPins, SYMBOL_KINDS, SYMBOLS } from '../../src/schematic/symbols';
import { drawing, part, pt } from './build';

const net = (c: ReturnType<typeof computeConnectivity>, ref: string, pin: string) => c.netOfPin[pinKey({ part: `part:${ref.toLowerCase()}`, pin })];

describe('pins after rotation and mirror', () => {
  // Rotation by a quarter turn clockwise on a y-down screen maps (x, y) → (−y, x) (from memory:
  // the 2-D rotation matrix with the y axis pointing down); mirror is x → −x, applied first.
  it('turns a resistor a quarter turn', () => {
    const pins = placedPins(part('resistor', 'R1', 100, 100, { rotation: 90 }));
    expect(pins.find((p) => p.name === 'p')).toMatchObject({ x: 130, y: 100, side: 'right' });
    expect(pins.find((p) => p.name === 'n')).toMatchObject({ x: 70, y: 100, side: 'left' });
  });
  it('mirrors an nMOS: the gate goes to the right, drain stays on top', () => {
    const pins = placedPins(part('nmos', 'M1', 0, 0, { mirror: true }));
    expect(pins.find((p) => p.name === 'g')).toMatchObject({ x: 20, y: 0, side: 'right' });
    expect(pins.find((p) => p.name === 'd')).toMatchObject({ x: -10, y: -30, side: 'top' });
  });
  it('mirror then 270°: the gate of an nMOS ends up at the top', () => {
    // mirror: (−20, 0) → (20, 0); 270° clockwise = 90° counter-clockwise: (x, y) → (y, −x) = (0, −20)
    const pins = placedPins(part('nmos', 'M1', 0, 0, { mirror: true, rotation: 270 }));
    expect(pins.find((p) => p.name === 'g')).toMatchObject({ x: 0, y: -20, side: 'top' });
  });
  it('shows the bulk pin only when the bulk is wired as a pin', () => {
    expect(placedPins(part('pmos', 'M1', 0, 0)).map((p) => p.name).sort()).toEqual(['d', 'g', 's']);
    expect(placedPins(part('pmos', 'M1', 0, 0, { bulk: 'pin' })).map((p) => p.name).sort()).toEqual(['b', 'd', 'g', 's']);
  });
  it('keeps every pin of every symbol on the 10-unit grid in all eight orientations', () => {
    for (const kind of SYMBOL_KINDS) {
      for (const rotation of [0, 90, 180, 270] as const) for (const mirror of [false, true]) {
        for (const p of placedPins({ kind, x: 30, y: -50, rotation, mirror, bulk: 'pin' })) {
          expect(Math.abs(p.x % 10), `${kind} ${p.name}`).toBe(0);
          expect(Math.abs(p.y % 10), `${kind} ${p.name}`).toBe(0);
        }
      }
      expect(SYMBOLS[kind].pins.length).toBeGreaterThan(0);
    }
  });
});

describe('nets', () => {
  // R1 p at (0,-30), n at (0,30); R2 at (100,0): p (100,-30), n (100,30); R3 at (50,90): p (50,60).
  const three = () => [part('resistor', 'R1', 0, 0), part('resistor', 'R2', 100, 0), part('resistor', 'R3', 50, 90)];

  it('joins a T-junction and puts a dot there', () => {
    const c = computeConnectivity(drawing(three(), [['a', pt(0, 30), pt(100, 30)], ['b', pt(50, 60), pt(50, 30)]]));
    expect(net(c, 'R1', 'n')).toBe(net(c, 'R2', 'n'));
    expect(net(c, 'R3', 'p')).toBe(net(c, 'R1', 'n'));
    expect(c.junctions).toEqual([{ x: 50, y: 30 }]);
  });

  it('does not join wires that only cross', () => {
    // horizontal R1.n–R2.n and vertical from R3.p up through it to (50, 0)
    const c = computeConnectivity(drawing(three(), [['a', pt(0, 30), pt(100, 30)], ['b', pt(50, 60), pt(50, 0)]]));
    expect(net(c, 'R1', 'n')).toBe(net(c, 'R2', 'n'));
    expect(net(c, 'R3', 'p')).not.toBe(net(c, 'R1', 'n'));
    expect(c.junctions).toEqual([]);
  });

  it('joins separate wires through net labels of the same name', () => {
    const c = computeConnectivity(drawing([
      ...three(),
      part('netLabel', 'NL1', 0, 60, { params: { net: 'vx' } }),
      part('netLabel', 'NL2', 50, 30, { params: { net: 'vx' } }),
    ], [['a', pt(0, 30), pt(0, 60)], ['b', pt(50, 60), pt(50, 30)]]));
    expect(net(c, 'R1', 'n')).toBe('vx');
    expect(net(c, 'R3', 'p')).toBe('vx');
    expect(net(c, 'R2', 'n')).not.toBe('vx');
  });

  it('names ground "0", joins supply rails to it, and names other nets n1, n2 … in part order', () => {
    const c = computeConnectivity(drawing([
      ...three(),
      part('ground', 'GND1', 0, 30),
      part('supply', 'VR1', 100, -30),
    ]));
    expect(net(c, 'R1', 'n')).toBe('0');
    expect(net(c, 'R2', 'p')).toBe('0'); // a supply rail is AC ground (small-signal common practice)
    expect(net(c, 'R1', 'p')).toBe('n1');
    expect(net(c, 'R2', 'n')).toBe('n2');
    expect(net(c, 'R3', 'p')).toBe('n3');
    expect(net(c, 'R3', 'n')).toBe('n4');
  });

  it('connects a pin that touches a wire corner or lies on a segment', () => {
    const c = computeConnectivity(drawing(three(), [['a', pt(0, 30), pt(0, 60), pt(100, 60), pt(100, 30)]]));
    // R3.p at (50, 60) lies on the middle segment
    expect(net(c, 'R3', 'p')).toBe(net(c, 'R1', 'n'));
    expect(net(c, 'R2', 'n')).toBe(net(c, 'R1', 'n'));
    expect(c.junctions).toEqual([{ x: 50, y: 60 }]);
  });

  it('reports open wire ends', () => {
    const c = computeConnectivity(drawing(three(), [['a', pt(0, 30), pt(0, 50), pt(20, 50)]]));
    expect(c.openEnds).toEqual([{ wire: 'wire:a', x: 20, y: 50 }]);
  });
});
