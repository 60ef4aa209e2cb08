// Grid layer: minor dots on the 10-unit grid, major crosses every 50 units. Drawn in one Shape
// pass over the visible area only; never listens to events.
import { memo } from 'react';
import { Layer, Shape } from 'react-konva';
import type { Context } from 'konva/lib/Context';
import { visibleWorldRect, type Camera } from './camera';

export const GRID = 10;
const MAJOR = 5;

interface Props {
  camera: Camera;
  width: number;
  height: number;
}

function GridLayerView({ camera, width, height }: Props) {
  const view = visibleWorldRect(camera, { width, height });
  const pxPerCell = GRID * camera.scale;
  // Skip minor points when they would crowd closer than ~6 px.
  const showMinor = pxPerCell >= 6;
  const sceneFunc = (ctx: Context) => {
    const c = ctx._context;
    const x0 = Math.floor(view.x / GRID) * GRID;
    const y0 = Math.floor(view.y / GRID) * GRID;
    const x1 = view.x + view.width;
    const y1 = view.y + view.height;
    const dot = 1.5 / camera.scale;
    c.fillStyle = '#d3cec2';
    if (showMinor) {
      for (let x = x0; x <= x1; x += GRID) {
        for (let y = y0; y <= y1; y += GRID) c.fillRect(x - dot / 2, y - dot / 2, dot, dot);
      }
    }
    const step = GRID * MAJOR;
    const arm = 2.5 / camera.scale;
    c.strokeStyle = '#bdb6a6';
    c.lineWidth = 1 / camera.scale;
    c.beginPath();
    for (let x = Math.floor(view.x / step) * step; x <= x1; x += step) {
      for (let y = Math.floor(view.y / step) * step; y <= y1; y += step) {
        c.moveTo(x - arm, y); c.lineTo(x + arm, y);
        c.moveTo(x, y - arm); c.lineTo(x, y + arm);
      }
    }
    c.stroke();
  };
  return (
    <Layer listening={false}>
      <Shape sceneFunc={sceneFunc} perfectDrawEnabled={false} listening={false} />
    </Layer>
  );
}

export const GridLayer = memo(GridLayerView);
