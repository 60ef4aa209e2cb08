// Camera of the drawing surface: a uniform scale and a translation, screen = world·scale + offset.
// Pure functions (no React, no Konva) so the view math is tested in node.

export interface Camera {
  /** Screen pixels per world unit. */
  scale: number;
  /** Screen position of the world origin, in pixels. */
  x: number;
  y: number;
}

export interface Point {
  x: number;
  y: number;
}

export interface Rect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export const MIN_SCALE = 0.2;
export const MAX_SCALE = 8;
/** Zoom factor per wheel notch (common practice: ~10 % per notch). */
export const WHEEL_STEP = 1.1;

export const DEFAULT_CAMERA: Camera = { scale: 2, x: 0, y: 0 };

export function clampScale(scale: number): number {
  if (!Number.isFinite(scale) || scale <= 0) return DEFAULT_CAMERA.scale;
  return Math.min(MAX_SCALE, Math.max(MIN_SCALE, scale));
}

export function worldToScreen(cam: Camera, p: Point): Point {
  return { x: p.x * cam.scale + cam.x, y: p.y * cam.scale + cam.y };
}

export function screenToWorld(cam: Camera, p: Point): Point {
  return { x: (p.x - cam.x) / cam.scale, y: (p.y - cam.y) / cam.scale };
}

/** Zoom by `factor` keeping the world point under the screen point `anchor` fixed. */
export function zoomAt(cam: Camera, anchor: Point, factor: number): Camera {
  const scale = clampScale(cam.scale * factor);
  const world = screenToWorld(cam, anchor);
  return { scale, x: anchor.x - world.x * scale, y: anchor.y - world.y * scale };
}

/** Zoom for one wheel event: deltaY < 0 zooms in. */
export function wheelZoom(cam: Camera, anchor: Point, deltaY: number): Camera {
  if (deltaY === 0 || !Number.isFinite(deltaY)) return cam;
  return zoomAt(cam, anchor, deltaY < 0 ? WHEEL_STEP : 1 / WHEEL_STEP);
}

export function pan(cam: Camera, dx: number, dy: number): Camera {
  return { ...cam, x: cam.x + dx, y: cam.y + dy };
}

/** Camera that shows the world box `bounds` centred in a viewport, with a margin in pixels.
 *  An empty or degenerate box keeps a readable default scale centred on the box. */
export function fitToView(bounds: Rect | null, viewport: { width: number; height: number }, margin = 40): Camera {
  const vw = Math.max(1, viewport.width);
  const vh = Math.max(1, viewport.height);
  if (!bounds) return { scale: DEFAULT_CAMERA.scale, x: vw / 2, y: vh / 2 };
  const availW = Math.max(1, vw - 2 * margin);
  const availH = Math.max(1, vh - 2 * margin);
  const sx = bounds.width > 0 ? availW / bounds.width : Infinity;
  const sy = bounds.height > 0 ? availH / bounds.height : Infinity;
  let scale = Math.min(sx, sy);
  if (!Number.isFinite(scale)) scale = DEFAULT_CAMERA.scale;
  scale = clampScale(Math.min(scale, 4));
  const cx = bounds.x + bounds.width / 2;
  const cy = bounds.y + bounds.height / 2;
  return { scale, x: vw / 2 - cx * scale, y: vh / 2 - cy * scale };
}

/** Union of boxes; null when there are none. */
export function unionRects(rects: Iterable<Rect>): Rect | null {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const r of rects) {
    x0 = Math.min(x0, r.x); y0 = Math.min(y0, r.y);
    x1 = Math.max(x1, r.x + r.width); y1 = Math.max(y1, r.y + r.height);
  }
  if (!Number.isFinite(x0)) return null;
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

/** Box spanned by two points (rubber band), normalised to positive width/height. */
export function rectFromCorners(a: Point, b: Point): Rect {
  return { x: Math.min(a.x, b.x), y: Math.min(a.y, b.y), width: Math.abs(a.x - b.x), height: Math.abs(a.y - b.y) };
}

/** World-space range of grid lines visible in a viewport, for the grid layer. */
export function visibleWorldRect(cam: Camera, viewport: { width: number; height: number }): Rect {
  const a = screenToWorld(cam, { x: 0, y: 0 });
  const b = screenToWorld(cam, { x: viewport.width, y: viewport.height });
  return rectFromCorners(a, b);
}
