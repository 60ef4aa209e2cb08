import { describe, it, expect } from 'vitest';
import {
  screenToWorld, worldToScreen, zoomAt, wheelZoom, fitToView, clampScale, unionRects, rectFromCorners,
  visibleWorldRect, MAX_SCALE, MIN_SCALE,
} from '../../src/canvas/camera';

describe('camera math', () => {
  it('screen ↔ world are inverse affine maps (common practice)', () => {
    const cam = { scale: 2.5, x: 130, y: -40 };
    const p = { x: 37, y: -12 };
    const s = worldToScreen(cam, p);
    expect(s).toEqual({ x: 37 * 2.5 + 130, y: -12 * 2.5 - 40 });
    const back = screenToWorld(cam, s);
    expect(back.x).toBeCloseTo(p.x, 12);
    expect(back.y).toBeCloseTo(p.y, 12);
  });

  it('zoom to the cursor keeps the world point under the cursor fixed (common practice)', () => {
    const cam = { scale: 1.3, x: 50, y: 70 };
    const cursor = { x: 412, y: 233 };
    const before = screenToWorld(cam, cursor);
    const z = zoomAt(cam, cursor, 1.7);
    expect(z.scale).toBeCloseTo(1.3 * 1.7, 12);
    const after = screenToWorld(z, cursor);
    expect(after.x).toBeCloseTo(before.x, 9);
    expect(after.y).toBeCloseTo(before.y, 9);
  });

  it('wheel up zooms in, wheel down zooms out, and the scale is clamped', () => {
    const cam = { scale: 1, x: 0, y: 0 };
    expect(wheelZoom(cam, { x: 0, y: 0 }, -100).scale).toBeGreaterThan(1);
    expect(wheelZoom(cam, { x: 0, y: 0 }, 100).scale).toBeLessThan(1);
    expect(wheelZoom(cam, { x: 0, y: 0 }, 0)).toBe(cam);
    expect(zoomAt(cam, { x: 0, y: 0 }, 1e6).scale).toBe(MAX_SCALE);
    expect(zoomAt(cam, { x: 0, y: 0 }, 1e-6).scale).toBe(MIN_SCALE);
    expect(clampScale(Number.NaN)).toBeGreaterThan(0);
  });

  it('fit-to-view centres the drawing and keeps it inside the viewport with its margin', () => {
    const bounds = { x: -100, y: 20, width: 400, height: 100 };
    const vp = { width: 800, height: 600 };
    const cam = fitToView(bounds, vp, 40);
    const tl = worldToScreen(cam, { x: bounds.x, y: bounds.y });
    const br = worldToScreen(cam, { x: bounds.x + bounds.width, y: bounds.y + bounds.height });
    expect(tl.x).toBeGreaterThanOrEqual(40 - 1e-9);
    expect(br.x).toBeLessThanOrEqual(760 + 1e-9);
    expect(tl.y).toBeGreaterThanOrEqual(40 - 1e-9);
    expect(br.y).toBeLessThanOrEqual(560 + 1e-9);
    expect((tl.x + br.x) / 2).toBeCloseTo(400, 9);
    expect((tl.y + br.y) / 2).toBeCloseTo(300, 9);
    // the limiting direction (width: 720/400 = 1.8) fills the available space exactly
    expect(cam.scale).toBeCloseTo(1.8, 12);
  });

  it('fit-to-view of nothing or of a single point gives a finite camera', () => {
    const empty = fitToView(null, { width: 300, height: 200 });
    expect(Number.isFinite(empty.scale) && Number.isFinite(empty.x)).toBe(true);
    const dot = fitToView({ x: 10, y: 10, width: 0, height: 0 }, { width: 300, height: 200 });
    expect(worldToScreen(dot, { x: 10, y: 10 })).toEqual({ x: 150, y: 100 });
  });

  it('box helpers normalise corners and union boxes', () => {
    expect(rectFromCorners({ x: 5, y: 9 }, { x: -3, y: 2 })).toEqual({ x: -3, y: 2, width: 8, height: 7 });
    expect(unionRects([])).toBeNull();
    expect(unionRects([{ x: 0, y: 0, width: 10, height: 10 }, { x: 20, y: -5, width: 5, height: 5 }]))
      .toEqual({ x: 0, y: -5, width: 25, height: 15 });
    expect(visibleWorldRect({ scale: 2, x: 100, y: 0 }, { width: 200, height: 100 }))
      .toEqual({ x: -50, y: 0, width: 100, height: 50 });
  });
});
