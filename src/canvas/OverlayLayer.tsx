// Overlay: junction dots and drawing errors marked where they occur. A group: it shares the top
// Konva layer with the interaction marks (InteractionLayer.tsx), one canvas for both.
import { memo } from 'react';
import { Circle, Group, Line, Rect, Text } from 'react-konva';
import type { Point } from '../schematic/document';
import type { DrawingIssue } from '../schematic/drawingChecks';
import { ERROR, JUNCTION_RADIUS, WARN, WIRE } from './theme';
import { TEXT_FONT } from './drawSymbol';

/** Short words printed beside a mark on the drawing; the full message is in the side panel. */
export const ISSUE_TAG: Record<DrawingIssue['code'], string> = {
  'unconnected-pin': 'not connected',
  'floating-net': 'floating',
  'outputs-shorted': 'outputs shorted',
  'no-ground': 'no ground',
  'bad-value': 'bad value',
  'duplicate-ref': 'same name twice',
  'open-wire-end': 'open end',
  'label-conflict': 'two names',
  'no-input': 'no input',
  'no-output': 'no output',
  'several-inputs': 'several inputs',
  'several-outputs': 'several outputs',
};

const IssueMark = memo(function IssueMark({ issue, scale, stack }: { issue: DrawingIssue; scale: number; stack: number }) {
  const color = issue.severity === 'error' ? ERROR : WARN;
  // Marks keep a constant size on screen.
  const k = 1 / Math.max(scale, 0.3);
  const r = 5 * k;
  const tag = ISSUE_TAG[issue.code] ?? issue.code;
  const font = 10 * k;
  return (
    <Group x={issue.x} y={issue.y + stack * 14 * k} listening={false}>
      <Circle radius={r} stroke={color} strokeWidth={1.6 * k} fill="rgba(255,255,255,0.85)" perfectDrawEnabled={false} />
      <Line points={[0, -r * 0.5, 0, r * 0.15]} stroke={color} strokeWidth={1.6 * k} lineCap="round" />
      <Circle y={r * 0.5} radius={0.9 * k} fill={color} />
      <Rect x={r + 2 * k} y={-font * 0.7} width={tag.length * font * 0.56 + 6 * k} height={font * 1.4} cornerRadius={3 * k} fill="rgba(255,255,255,0.85)" />
      <Text x={r + 5 * k} y={-font * 0.55} text={tag} fontSize={font} fontFamily={TEXT_FONT} fill={color} />
    </Group>
  );
});

/** Problems of the drawing as a whole, not of one place: shown in a corner of the sheet
 *  (see SheetNotes) rather than pinned to an arbitrary part. */
export const WHOLE_DRAWING_CODES: ReadonlySet<DrawingIssue['code']> = new Set(['no-ground', 'no-input', 'no-output']);

/** Several problems at one point are listed one under the other instead of on top of each other. */
export function stackMarks(issues: DrawingIssue[]): { issue: DrawingIssue; stack: number }[] {
  const seen = new Map<string, number>();
  return issues.map((issue) => {
    const key = `${issue.x},${issue.y}`;
    const stack = seen.get(key) ?? 0;
    seen.set(key, stack + 1);
    return { issue, stack };
  });
}

interface Props {
  junctions: Point[];
  issues: DrawingIssue[];
  scale: number;
  showIssues: boolean;
}

function OverlayLayerView({ junctions, issues, scale, showIssues }: Props) {
  return (
    <Group listening={false}>
      {junctions.map((j) => (
        <Circle key={`${j.x},${j.y}`} x={j.x} y={j.y} radius={JUNCTION_RADIUS} fill={WIRE} perfectDrawEnabled={false} listening={false} />
      ))}
      {showIssues && stackMarks(issues.filter((i) => !WHOLE_DRAWING_CODES.has(i.code))).map(({ issue, stack }, i) => (
        <IssueMark key={`${issue.code}:${issue.part ?? issue.wire ?? issue.net ?? ''}:${issue.pin ?? ''}:${i}`} issue={issue} scale={scale} stack={stack} />
      ))}
    </Group>
  );
}

export const OverlayMarks = memo(OverlayLayerView);
