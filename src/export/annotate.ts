// Analysis result + drawing → the annotation data (annotations.ts) that the SVG export and the
// canvas overlay both draw. DOM-free and deterministic.

import type { AnalysisResult, NodeRow } from '../engine/index';
import { formatSi, SMALL_SIGNAL_CAUTION } from '../engine/index';
import type { DrawingDocument, Point } from '../schematic/document';
import { GROUND_NET, type NetInfo } from '../schematic/connectivity';
import { cachedConnectivity } from '../schematic/toNetlist';
import { BADGE_TEXT_SIZE, BADGE_WIDTH_STEP, type SchematicAnnotations } from './annotations';
import type { Box, BadgeText } from './badgeLayout';
import { placeBadges } from './annotateCache';
import { loopPathPoints } from './loopPath';
import { colorByTimeConstant } from './tauColoring';
import { DEFAULT_SCALE, impedanceColor, legendStops, NO_VALUE_COLOR, scaleFor, type ImpedanceScale } from './colorScale';

export interface AnnotateSettings {
  /** Which |Z| colours the nets: at the analysis frequency (default) or at DC. */
  column?: 'frequency' | 'dc';
  /** Colour scale: fixed, or 'auto' (whole decades around the nodes' values, the default). */
  scale?: ImpedanceScale | 'auto';
  /** The selected loop: its nets in order (as the feedback analysis lists them) and its member
   *  parts (refs), which route the path between two nets. */
  loop?: { id: string; label: string; nets: string[]; parts?: string[] } | null;
  /** Which nets get a badge (default all analysed nets). */
  badges?: 'all' | 'none' | string[];
  /** What colours the nets: node |Z| (default) or node time constant τ (tauColoring.ts). */
  colorBy?: 'impedance' | 'timeConstant';
}

/** |Z| of a node row in the chosen column. */
export function rowOhms(row: NodeRow, column: 'frequency' | 'dc'): number | null {
  if (column === 'dc') return row.openAtDc ? null : row.dcOhms;
  return row.z ? row.z.mag : null;
}

/** A point on the net to hang marks on: the middle of its longest wire segment (on the grid),
 *  else its first pin. */
export function netAnchor(doc: DrawingDocument, net: NetInfo): Point {
  let best: { len: number; p: Point } | null = null;
  for (const id of [...net.wires].sort()) {
    const pts = doc.wires[id]?.points ?? [];
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1], b = pts[i];
      const len = Math.abs(a.x - b.x) + Math.abs(a.y - b.y);
      if (!best || len > best.len) best = { len, p: { x: Math.round((a.x + b.x) / 20) * 10, y: Math.round((a.y + b.y) / 20) * 10 } };
    }
  }
  return best ? best.p : { x: net.anchor.x, y: net.anchor.y };
}

export function annotate(doc: DrawingDocument, result: AnalysisResult | null, settings: AnnotateSettings = {}): SchematicAnnotations {
  const column = settings.column ?? 'frequency';
  const out: SchematicAnnotations = { nets: {}, badges: [], slowest: null, loop: null, legend: null, caution: SMALL_SIGNAL_CAUTION };
  if (!result || !result.ok) return out;
  const conn = cachedConnectivity(doc);
  const byName = new Map(conn.nets.map((n) => [n.name, n]));
  const rows = result.nodes.filter((r) => !r.internal && byName.has(r.name) && r.name !== GROUND_NET);
  const scale = settings.scale === undefined || settings.scale === 'auto' ? scaleFor(rows.map((r) => rowOhms(r, column))) : settings.scale;
  const anchors = new Map<string, Point>();
  const anchorOf = (name: string) => {
    if (!anchors.has(name)) anchors.set(name, netAnchor(doc, byName.get(name)!));
    return anchors.get(name)!;
  };
  const wanted = settings.badges ?? 'all';
  const avoid: Box[] = [];
  const texts: BadgeText[] = [];
  const slow = rows.find((r) => r.slowest);
  if (slow) {
    const pole = slow.openAtDc ? 'integrator' : slow.poleHz !== null ? formatSi(slow.poleHz, 'Hz') : '—';
    out.slowest = { net: slow.name, anchor: anchorOf(slow.name), label: `slowest node ${slow.name}: ${pole}` };
    // The mark's label (drawn right of and below the anchor) is kept clear of badges.
    const labelWidth = Math.ceil((22 + out.slowest.label.length * BADGE_TEXT_SIZE * 0.58) / BADGE_WIDTH_STEP) * BADGE_WIDTH_STEP;
    avoid.push({ x: out.slowest.anchor.x - 10, y: out.slowest.anchor.y - 10, width: labelWidth, height: 32 });
  }
  const fz = result.conditions.frequencyHz;
  for (const r of rows) {
    const ohms = rowOhms(r, column);
    out.nets[r.name] = { net: r.name, color: impedanceColor(ohms, scale), ohms };
    if (wanted === 'none' || (Array.isArray(wanted) && !wanted.includes(r.name))) continue;
    const z = ohms === null ? (column === 'dc' && r.openAtDc ? 'open at DC' : '—') : formatSi(ohms, 'Ω');
    const lines = [`${r.name}: |Z| ${z}`];
    if (r.farads > 0) lines.push(`C ${formatSi(r.farads, 'F')}`);
    if (r.tau !== null) lines.push(`τ ${formatSi(r.tau, 's')}`);
    if (r.poleHz !== null) lines.push(`f ${formatSi(r.poleHz, 'Hz')}`);
    texts.push({ net: r.name, lines, anchor: anchorOf(r.name) });
  }
  // Clear of symbol bodies and of each other; the slowest node's badge is placed first. The
  // placement is memoised by geometry (annotateCache.ts): a value edit only refreshes the texts.
  out.badges = placeBadges(doc, texts, out.slowest ? [out.slowest.net] : [], avoid)
    .map(({ net, lines, anchor, box, leader, crowded }) => ({ net, lines, anchor, box, leader, crowded }));
  if (settings.loop) {
    const nets = settings.loop.nets.filter((n) => byName.has(n));
    const anchors = nets.map((n) => anchorOf(n));
    if (anchors.length > 0) {
      const points = loopPathPoints(doc, conn.netOfPin, nets, anchors, settings.loop.parts ?? []);
      out.loop = { loopId: settings.loop.id, label: settings.loop.label, points };
    }
  }
  const what = column === 'dc' ? 'at DC' : fz !== null ? `at ${formatSi(fz, 'Hz')}` : '';
  out.legend = { title: `node |Z| ${what}`.trim(), stops: legendStops(scale ?? DEFAULT_SCALE), noValueColor: NO_VALUE_COLOR, noValueLabel: 'open / not computed' };
  return settings.colorBy === 'timeConstant' ? colorByTimeConstant(out, result) : out;
}
