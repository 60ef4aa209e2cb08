// Status line: what the editor is doing, where the pointer is, counts, the last notice, and the
// standing reminder about what the numbers are.
import type { Point } from '../schematic/document';

export const ESTIMATE_NOTE =
  'Linear small-signal estimates about the entered bias point: confirm with full simulation and the foundry models before sign-off.';

const MODE_TEXT: Record<string, string> = {
  'select.idle': 'Select',
  'select.pointing': 'Select',
  'select.moving': 'Moving',
  'select.boxing': 'Selecting in box',
  'place.ghost': 'Placing: click to drop, t turns, f flips, Esc stops',
  'wire.idle': 'Wire: click a pin or grid point to start',
  'wire.drawing': 'Wire: click to bend, end on a pin or wire, double-click or Esc to finish',
  'pan.dragging': 'Panning',
};

interface Props {
  mode: string;
  cursor: Point | null;
  selected: number;
  errors: number;
  warnings: number;
  notice: string | null;
  noticeIsError?: boolean;
}

export function StatusLine({ mode, cursor, selected, errors, warnings, notice, noticeIsError }: Props) {
  return (
    <footer className="status" role="status" aria-live="polite">
      <span className="mode">{MODE_TEXT[mode] ?? mode}</span>
      <span className="coords">{cursor ? `x ${cursor.x}  y ${cursor.y}` : '—'}</span>
      {selected > 0 && <span>{selected} selected</span>}
      <span>{errors} error{errors === 1 ? '' : 's'}, {warnings} warning{warnings === 1 ? '' : 's'}</span>
      {notice && <span className={`flash${noticeIsError ? ' error' : ''}`}>{notice}</span>}
      <span className="caveat" title={ESTIMATE_NOTE}>{ESTIMATE_NOTE}</span>
    </footer>
  );
}
