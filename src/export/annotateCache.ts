// Memo of the badge placement for annotate(): keyed by everything layoutBadges reads (the symbols'
// places, the wires, each badge's net, anchor and box size, the nets placed first and the boxes to
// avoid), so an edit that changes only values — same geometry, same rounded badge sizes — reuses
// the boxes and only the texts and colours are new. A hit gives exactly what a fresh placement
// would (same inputs, deterministic placement). Small LRU: undo/redo between two layouts hits.
import type { DrawingDocument } from '../schematic/document';
import { geometryKey } from '../schematic/toNetlist';
import { badgeSize } from './annotations';
import { layoutBadges, type BadgeText, type Box, type PlacedBadge } from './badgeLayout';

type Placement = Pick<PlacedBadge, 'box' | 'leader' | 'crowded'>;
const SLOTS = 4;
const slots: { key: string; placed: Placement[] }[] = [];
let hits = 0, misses = 0;

const boxKey = (b: Box) => `${b.x},${b.y},${b.width},${b.height}`;

function placementKey(doc: DrawingDocument, texts: BadgeText[], first: string[], avoid: Box[]): string {
  const badges = texts.map((t) => {
    const { width, height } = badgeSize(t.lines);
    return `${t.net}@${t.anchor.x},${t.anchor.y}:${width}x${height}`;
  });
  return [geometryKey(doc), badges.join(';'), first.join(';'), avoid.map(boxKey).join(';')].join('\n§\n');
}

/** layoutBadges(doc, texts, first, avoid), memoised (see above). */
export function placeBadges<B extends BadgeText>(doc: DrawingDocument, texts: B[], first: string[], avoid: Box[]): (B & PlacedBadge)[] {
  const key = placementKey(doc, texts, first, avoid);
  const at = slots.findIndex((s) => s.key === key);
  if (at >= 0) {
    hits += 1;
    const [slot] = slots.splice(at, 1);
    slots.unshift(slot);
    return texts.map((t, i) => ({ ...t, ...slot.placed[i], box: { ...slot.placed[i].box } }));
  }
  misses += 1;
  const placed = layoutBadges(doc, texts, first, avoid);
  slots.unshift({ key, placed: placed.map(({ box, leader, crowded }) => ({ box: { ...box }, leader, crowded })) });
  slots.length = Math.min(slots.length, SLOTS);
  return placed;
}

/** How often the memo was hit and missed (for the bench and the tests). */
export function placementCacheStats(): { hits: number; misses: number } {
  return { hits, misses };
}
