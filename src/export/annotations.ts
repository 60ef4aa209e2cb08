// The analysis marks laid over a schematic, as plain data: the SVG writer draws them, and the live
// canvas overlay can draw the very same data (computed by annotate.ts), so both always agree.
import type { Point } from '../schematic/document';
import type { LegendStop } from './colorScale';

export interface NetMark {
  net: string;
  /** Wire colour from the impedance scale (#rrggbb). */
  color: string;
  /** |Z| used for the colour (ohms), null when undefined (open at DC, not computed). */
  ohms: number | null;
}

export interface Badge {
  net: string;
  /** Short text lines, e.g. ["|Z| 12.4 kΩ", "C 1.2 pF", "τ 15 ns"]. */
  lines: string[];
  /** World point the badge points at (on the net). */
  anchor: Point;
  /** Where the badge box goes (world units, sized for BADGE_TEXT_SIZE text), clear of symbol
   *  bodies and of the other badges where the space allows (badgeLayout.ts). */
  box: { x: number; y: number; width: number; height: number };
  /** The box is far enough from the anchor to need a leader line. */
  leader: boolean;
  /** No spot free of symbols was found (the least covering one is used). */
  crowded: boolean;
}

/** Text size of badge lines (world units) and the box size that holds them. */
export const BADGE_TEXT_SIZE = 7;
/** Badge widths are rounded up to this step (world units, about two characters), so a value edit
 *  that changes a figure's length by a character keeps the boxes where they are. */
export const BADGE_WIDTH_STEP = 8;
export function badgeSize(lines: string[]): { width: number; height: number } {
  const text = Math.max(...lines.map((l) => l.length * BADGE_TEXT_SIZE * 0.58)) + 8;
  return { width: Math.ceil(text / BADGE_WIDTH_STEP) * BADGE_WIDTH_STEP, height: lines.length * (BADGE_TEXT_SIZE + 2) + 4 };
}

export interface SlowestMark {
  net: string;
  anchor: Point;
  /** e.g. "slowest node: 1.2 MHz". */
  label: string;
}

export interface LoopPath {
  loopId: string;
  label: string;
  /** Ordered world points through the loop's nets (and between two nets through the member
   *  part joining them, loopPath.ts), closing back to the first. */
  points: Point[];
}

export interface Legend {
  title: string;
  stops: LegendStop[];
  noValueColor: string;
  noValueLabel: string;
}

export interface SchematicAnnotations {
  /** Net name → mark; nets left out are drawn in the plain wire colour (ground, no result). */
  nets: Record<string, NetMark>;
  badges: Badge[];
  slowest: SlowestMark | null;
  loop: LoopPath | null;
  legend: Legend | null;
  /** The linear small-signal caution shown with every annotated output. */
  caution: string;
}

/** What the title block of an exported sheet says. */
export interface TitleBlock {
  drawingName: string;
  /** ISO date (YYYY-MM-DD). */
  date: string;
  /** Frequency of the node-impedance column, or null (DC). */
  frequencyHz: number | null;
  /** Loops / sources switched off for this result. */
  loopsOff: string[];
  /** Extra line, e.g. "compare: B". */
  note?: string;
}

export const EMPTY_ANNOTATIONS: SchematicAnnotations = { nets: {}, badges: [], slowest: null, loop: null, legend: null, caution: '' };
