// Plot colours and line styles of our own. Every pair of things that must be told apart differs in
// line style or marker shape as well as in colour (never red/green alone), and every ink has at
// least 3:1 contrast against the background (WCAG 2.1, 1.4.11 non-text contrast).
import type { Style } from './scene';

export const PALETTE = {
  background: '#ffffff',
  ink: '#1f2b33',
  inkSoft: '#55636d',
  gridMajor: '#cfd6db',
  gridMinor: '#e8ecef',
  /** Main curve (magnitude, |Z|, y(t), locus). */
  blue: '#2b5c9e',
  /** Second curve (phase, error), zeros. */
  amber: '#a65a0c',
  /** Third role: margins, settling marks. */
  violet: '#6b3f8f',
  /** Compare mode A (before). */
  slate: '#6a7680',
  readoutFill: '#fbfcfd',
} as const;

export const FONT_FAMILY = 'system-ui, -apple-system, "Segoe UI", Roboto, sans-serif';

/** Named line styles: colour, width and dash go together. */
export const LINES: Record<string, Style> = {
  primary: { stroke: PALETTE.blue, width: 2 },
  secondary: { stroke: PALETTE.amber, width: 2, dash: '7 3' },
  tertiary: { stroke: PALETTE.violet, width: 1.5, dash: '2 3' },
  reference: { stroke: PALETTE.inkSoft, width: 1, dash: '4 4' },
  margin: { stroke: PALETTE.violet, width: 2.5 },
  axis: { stroke: PALETTE.ink, width: 1 },
  gridMajor: { stroke: PALETTE.gridMajor, width: 1 },
  gridMinor: { stroke: PALETTE.gridMinor, width: 1, dash: '1 2' },
  compareA: { stroke: PALETTE.slate, width: 1.5, dash: '5 3' },
  compareB: { stroke: PALETTE.blue, width: 1.5 },
};

/** Marker styles: poles are crosses, zeros open circles; right-half-plane roots are filled and labelled. */
export const MARKS = {
  pole: { shape: 'cross' as const, style: { stroke: PALETTE.ink, width: 2 } },
  zero: { shape: 'circle' as const, style: { stroke: PALETTE.amber, width: 2, fill: 'none' } },
  zeroRhp: { shape: 'circle' as const, style: { stroke: PALETTE.amber, width: 2, fill: PALETTE.amber } },
  poleA: { shape: 'cross' as const, style: { stroke: PALETTE.slate, width: 1.5 } },
  poleB: { shape: 'cross' as const, style: { stroke: PALETTE.blue, width: 2.5 } },
  locusStart: { shape: 'square' as const, style: { stroke: PALETTE.blue, width: 1.5, fill: PALETTE.background } },
  locusAtOne: { shape: 'diamond' as const, style: { stroke: PALETTE.violet, width: 2, fill: PALETTE.violet } },
  locusEnd: { shape: 'triangle' as const, style: { stroke: PALETTE.blue, width: 1.5, fill: PALETTE.background } },
};
