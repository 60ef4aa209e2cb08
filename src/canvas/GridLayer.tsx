// The sheet's grid: minor dots on the 10-unit grid, major crosses every 50 units. Drawn as the
// sheet's CSS background (one SVG tile of 50 × 50 units, repeated and moved with the camera), not
// as a canvas: the browser paints it once per zoom or pan and it never joins a redraw of the
// drawing.
import type { CSSProperties } from 'react';
import type { Camera } from './camera';

export const GRID = 10;
const MAJOR = 5;
const DOT = '#d3cec2';
const CROSS = '#bdb6a6';

const fmt = (v: number) => String(Math.round(v * 1000) / 1000);

/** The tile (one major cell in screen pixels) as SVG text. */
export function gridTileSvg(scale: number): { svg: string; size: number } {
  const cell = GRID * scale;
  const size = cell * MAJOR;
  const parts: string[] = [];
  // Skip minor points when they would crowd closer than ~6 px.
  if (cell >= 6) {
    for (let i = 0; i < MAJOR; i++) {
      for (let j = 0; j < MAJOR; j++) {
        if (i === 0 && j === 0) continue;
        parts.push(`<rect x="${fmt(i * cell - 0.75)}" y="${fmt(j * cell - 0.75)}" width="1.5" height="1.5"/>`);
      }
    }
  }
  const arm = 2.5;
  // the cross at the tile's corner, drawn at all four corners so the tile repeats seamlessly
  const cross = (x: number, y: number) => `M${fmt(x - arm)} ${fmt(y)}H${fmt(x + arm)}M${fmt(x)} ${fmt(y - arm)}V${fmt(y + arm)}`;
  const d = [cross(0, 0), cross(size, 0), cross(0, size), cross(size, size)].join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(size)}" height="${fmt(size)}">`
    + `<g fill="${DOT}">${parts.join('')}</g><path d="${d}" stroke="${CROSS}" stroke-width="1" fill="none"/></svg>`;
  return { svg, size };
}

// The tile of the last zoom: the app asks on every render (pointer moves included), the tile
// changes only with the zoom.
let tileOf: { scale: number; image: string; size: number } | null = null;

function tileImage(scale: number): { image: string; size: number } {
  if (tileOf?.scale !== scale) {
    const { svg, size } = gridTileSvg(scale);
    tileOf = { scale, image: `url("data:image/svg+xml,${encodeURIComponent(svg)}")`, size };
  }
  return tileOf;
}

/** CSS background of the sheet for this camera (world (0, 0) on a major cross). */
export function gridBackground(camera: Camera): CSSProperties {
  const { image, size } = tileImage(camera.scale);
  const mod = (v: number) => ((v % size) + size) % size;
  return {
    backgroundImage: image,
    backgroundSize: `${size}px ${size}px`,
    backgroundPosition: `${mod(camera.x)}px ${mod(camera.y)}px`,
  };
}
