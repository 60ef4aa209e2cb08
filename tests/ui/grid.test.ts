// The sheet's grid background (src/canvas/GridLayer.tsx): one major cell per tile, moved with the
// camera so world (0, 0) sits on a major cross; minor dots only while they stay ≥ 6 px apart.
// Common practice (our own drawing rules).
import { describe, expect, it } from 'vitest';
import { GRID, gridBackground, gridTileSvg } from '../../src/canvas/GridLayer';

describe('grid background', () => {
  it('tiles one major cell (5 grid steps) in screen pixels, offset by the camera modulo the tile', () => {
    const bg = gridBackground({ scale: 2, x: 130, y: -30 });
    expect(bg.backgroundSize).toBe(`${5 * GRID * 2}px ${5 * GRID * 2}px`);
    expect(bg.backgroundPosition).toBe('30px 70px'); // 130 mod 100, −30 mod 100
    expect(String(bg.backgroundImage)).toMatch(/^url\("data:image\/svg\+xml,/);
  });

  it('draws the 24 minor dots of a cell only when they are at least 6 px apart', () => {
    const dots = (scale: number) => (gridTileSvg(scale).svg.match(/<rect /g) ?? []).length;
    expect(dots(1)).toBe(24);
    expect(dots(0.5)).toBe(0); // 5 px apart
  });

  it('gives the same tile for the same zoom, a new one for a new zoom', () => {
    const a = gridBackground({ scale: 1.5, x: 0, y: 0 }).backgroundImage;
    expect(gridBackground({ scale: 1.5, x: 40, y: 7 }).backgroundImage).toBe(a);
    expect(gridBackground({ scale: 1.25, x: 0, y: 0 }).backgroundImage).not.toBe(a);
  });
});
