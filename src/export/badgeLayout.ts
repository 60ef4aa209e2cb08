// Badge boxes kept clear of the symbols: every badge gets a world box near its anchor that hits no
// symbol body (placedBounds, with a small margin) and no other badge, preferring spots close to
// the anchor and off the parts' text and the wires. Greedy in a fixed order (slowest node first,
// then by position), so the result is deterministic. Pure TS: annotate() places the badges here
// and both the SVG export and the canvas overlay draw the boxes it returns.
import type { DrawingDocument, Point } from '../schematic/document';
import { badgeSize } from './annotations';
import { placedBounds, symbolOf, toWorld } from '../schematic/symbols';

export interface Box { x: number; y: number; width: number; height: number }

export const BODY_MARGIN = 2;
const DISTANCES = [6, 12, 20, 32, 48, 70];

export const boxArea = (a: Box, b: Box) =>
  Math.max(0, Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x)) * Math.max(0, Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y));

/** Symbol bodies (hard obstacles) and their reference/value text (soft), in world units. */
export function symbolObstacles(doc: DrawingDocument): { bodies: (Box & { ref: string })[]; texts: Box[] } {
  const bodies: (Box & { ref: string })[] = [];
  const texts: Box[] = [];
  for (const p of Object.values(doc.parts)) {
    const b = placedBounds(p);
    bodies.push({ ref: p.ref, x: b.x - BODY_MARGIN, y: b.y - BODY_MARGIN, width: b.width + 2 * BODY_MARGIN, height: b.height + 2 * BODY_MARGIN });
    const sym = symbolOf(p.kind);
    for (const a of [sym.labelAnchor, sym.valueAnchor]) {
      const w = toWorld({ x: a.x, y: a.y }, p);
      texts.push({ x: w.x - 30, y: w.y - 6, width: 60, height: 12 });
    }
  }
  return { bodies, texts };
}

function wireBoxes(doc: DrawingDocument): Box[] {
  const out: Box[] = [];
  for (const w of Object.values(doc.wires)) {
    for (let i = 1; i < w.points.length; i++) {
      const a = w.points[i - 1], b = w.points[i];
      out.push({ x: Math.min(a.x, b.x) - 1.5, y: Math.min(a.y, b.y) - 1.5, width: Math.abs(a.x - b.x) + 3, height: Math.abs(a.y - b.y) + 3 });
    }
  }
  return out;
}

function candidates(anchor: Point, w: number, h: number): Box[] {
  const out: Box[] = [];
  for (const d of DISTANCES) {
    const spots = [
      { x: anchor.x + d, y: anchor.y - d - h }, { x: anchor.x - d - w, y: anchor.y - d - h },
      { x: anchor.x + d, y: anchor.y + d }, { x: anchor.x - d - w, y: anchor.y + d },
      { x: anchor.x - w / 2, y: anchor.y - d - h }, { x: anchor.x - w / 2, y: anchor.y + d },
      { x: anchor.x + d, y: anchor.y - h / 2 }, { x: anchor.x - d - w, y: anchor.y - h / 2 },
    ];
    for (const s of spots) out.push({ ...s, width: w, height: h });
  }
  return out;
}

/** A badge to place: its net, text lines and the point on the net it belongs to. */
export interface BadgeText { net: string; lines: string[]; anchor: Point }

export interface PlacedBadge extends BadgeText {
  box: Box;
  /** Box is far enough from the anchor to need a leader line. */
  leader: boolean;
  /** No spot free of symbols was found (the least covering one is used). */
  crowded: boolean;
}

/** Place every badge; `first` nets are placed before the others (e.g. the slowest node);
 *  `avoid` are further boxes to keep clear of where the space allows (e.g. the slowest node's label). */
export function layoutBadges<B extends BadgeText>(doc: DrawingDocument, badges: B[], first: string[] = [], avoid: Box[] = []): (B & PlacedBadge)[] {
  const symbols = symbolObstacles(doc);
  const bodies = symbols.bodies, texts = [...symbols.texts, ...avoid];
  const wires = wireBoxes(doc);
  const rank = (b: B) => (first.includes(b.net) ? first.indexOf(b.net) : first.length);
  const order = [...badges].sort((a, b) => rank(a) - rank(b) || a.anchor.y - b.anchor.y || a.anchor.x - b.anchor.x || (a.net < b.net ? -1 : 1));
  const placed: (B & PlacedBadge)[] = [];
  for (const b of order) {
    const { width, height } = badgeSize(b.lines);
    let best: { box: Box; cost: number; hard: number } | null = null;
    for (const [i, c] of candidates(b.anchor, width, height).entries()) {
      const hard = bodies.reduce((s, o) => s + boxArea(c, o), 0) + placed.reduce((s, o) => s + boxArea(c, o.box), 0);
      const soft = texts.reduce((s, o) => s + boxArea(c, o), 0) + 0.3 * wires.reduce((s, o) => s + boxArea(c, o), 0);
      const cost = soft + i * 4;
      if (!best || hard < best.hard || (hard === best.hard && cost < best.cost)) best = { box: c, cost, hard };
      if (best.hard === 0 && soft === 0) break;
    }
    const box = best!.box;
    const gap = Math.max(box.x - b.anchor.x, b.anchor.x - (box.x + box.width), box.y - b.anchor.y, b.anchor.y - (box.y + box.height));
    placed.push({ ...b, box, leader: gap > 14, crowded: best!.hard > 0 });
  }
  const index = new Map(badges.map((b, i) => [b.net, i]));
  return placed.sort((a, b) => index.get(a.net)! - index.get(b.net)!);
}
