// Interaction marks, redrawn on every pointer move: the part following the pointer, the wire
// being drawn, the rubber-band box and a small cursor cross on the snapped grid point. A group in
// the top Konva layer (shared with the junctions and issue marks, OverlayLayer.tsx).
import { memo } from 'react';
import { Circle, Group, Line, Rect } from 'react-konva';
import type { EditorState } from '../editor/types';
import { symbolOf } from '../schematic/symbols';
import { SymbolView } from './SymbolView';
import { BAND_FILL, BAND_STROKE, GHOST, HOVER, SELECTED, WIRE_WIDTH } from './theme';

function InteractionLayerView({ state, scale }: { state: EditorState; scale: number }) {
  const k = 1 / Math.max(scale, 0.3);
  const { ghost, wirePreview, box, cursor, hover } = state;
  return (
    <Group listening={false}>
      {ghost && (
        <SymbolView symbol={symbolOf(ghost.kind)} x={ghost.x} y={ghost.y} rotation={ghost.rotation} mirror={ghost.mirror} color={GHOST} opacity={0.55} />
      )}
      {wirePreview && wirePreview.length > 1 && (
        <Line points={wirePreview.flatMap((p) => [p.x, p.y])} stroke={SELECTED} strokeWidth={WIRE_WIDTH} dash={[4, 3]} lineCap="round" lineJoin="round" listening={false} />
      )}
      {box && (
        <Rect x={box.x} y={box.y} width={box.width} height={box.height} fill={BAND_FILL} stroke={BAND_STROKE} strokeWidth={k} dash={[4 * k, 3 * k]} listening={false} />
      )}
      {hover.type === 'pin' && (
        <Circle x={hover.x} y={hover.y} radius={4 * k + 1} stroke={HOVER} strokeWidth={1.5 * k} listening={false} />
      )}
      {cursor && (state.tool === 'wire' || state.tool === 'place') && (
        <Line points={[cursor.x - 4, cursor.y, cursor.x + 4, cursor.y, cursor.x, cursor.y, cursor.x, cursor.y - 4, cursor.x, cursor.y + 4]} stroke={SELECTED} strokeWidth={k} listening={false} />
      )}
    </Group>
  );
}

export const InteractionMarks = memo(InteractionLayerView);
