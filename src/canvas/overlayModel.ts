// Pure helpers of the analysis overlay: which nets a pole lights (and which poles a net carries),
// the wire read-out rows, frequency text, and badge boxes on screen. No React, no Konva.
import type { AnalysisResult, Cx } from '../engine/index';
import { formatSi, parseSi } from '../engine/units';
import type { BlackmanResult } from '../engine/feedback/index';
import type { Badge } from '../export/annotations';
import type { Camera } from './camera';
import type { DrawingNetlist } from '../schematic/toNetlist';

/** A node "carries" a pole when its participation share reaches this (shares sum to 1). */
export const CARRIER_SHARE = 0.15;

/** Nets that carry pole `index` (largest share first; always at least the largest one). */
export function netsOfPole(result: AnalysisResult | null, index: number | null): string[] {
  if (!result || index === null) return [];
  const p = result.participation.find((x) => x.pole === index);
  if (!p || p.nodes.length === 0) return [];
  const carriers = p.nodes.filter((n, i) => i === 0 || n.share >= CARRIER_SHARE).map((n) => n.node);
  return carriers;
}

/** Poles (indices into result.poles) that a net carries. */
export function polesOfNet(result: AnalysisResult | null, net: string | null): number[] {
  if (!result || !net) return [];
  return result.participation.filter((p) => netsOfPole(result, p.pole).includes(net)).map((p) => p.pole);
}

/** Wire id → net name. */
export function netOfWire(drawing: Pick<DrawingNetlist, 'nets'> | null): Map<string, string> {
  const m = new Map<string, string>();
  for (const n of drawing?.nets ?? []) for (const w of n.wires) m.set(w, n.name);
  return m;
}

const mag = (z: Cx) => Math.hypot(z.re, z.im);
const deg = (z: Cx) => (Math.atan2(z.im, z.re) * 180) / Math.PI;

/** A complex figure as magnitude and phase (phase left out when within 0.5° of 0 or 180°). */
export function formatCx(z: Cx | null, unit = ''): string {
  if (!z || !Number.isFinite(z.re) || !Number.isFinite(z.im)) return '—';
  const m = mag(z), ph = deg(z);
  const sign = Math.abs(ph) > 179.5 ? '−' : '';
  const text = formatSi(m, unit);
  if (Math.abs(ph) < 0.5 || Math.abs(ph) > 179.5) return `${sign}${text}`;
  return `${text} ∠${ph.toFixed(0)}°`;
}

export interface ReadoutRow { label: string; value: string }

/** The full read-out of a net: its node row, and Blackman's factors for the selected loop
 *  (Blackman 1943: Z = Z⁰·(1 + T_sc)/(1 + T_oc)). */
export function wireReadout(result: AnalysisResult, net: string, blackman: BlackmanResult | null, loopLabel: string | null, frequencyHz: number): ReadoutRow[] {
  const row = result.nodes.find((r) => r.name === net);
  const at = frequencyHz === 0 ? 'DC' : formatSi(frequencyHz, 'Hz');
  const rows: ReadoutRow[] = [];
  if (row) {
    const z = frequencyHz === 0 ? (row.openAtDc ? 'open at DC' : row.dcOhms !== null ? formatSi(row.dcOhms, 'Ω') : '—')
      : row.z ? formatCx(row.z, 'Ω') : '—';
    rows.push({ label: `|Z| at ${at}`, value: z });
    rows.push({ label: 'C node', value: row.farads > 0 ? formatSi(row.farads, 'F') : '—' });
    rows.push({ label: 'τ node', value: row.tau !== null ? formatSi(row.tau, 's') : '—' });
    rows.push({ label: 'pole 1/(2πτ)', value: row.poleHz !== null ? formatSi(row.poleHz, 'Hz') : row.openAtDc ? 'integrator' : '—' });
  }
  if (!loopLabel) {
    rows.push({ label: 'loop', value: 'select a loop for Z⁰, T_sc, T_oc' });
    return rows;
  }
  const b = blackman?.nodes.find((n) => n.node === net) ?? null;
  rows.push({ label: 'loop', value: loopLabel });
  if (!blackman || blackman.status !== 'ok') {
    rows.push({ label: 'Blackman', value: blackman?.message ?? 'still being computed' });
    return rows;
  }
  if (!b) { rows.push({ label: 'Blackman', value: 'not defined at this net' }); return rows; }
  const bAt = blackman.fHz === 0 ? 'DC' : formatSi(blackman.fHz, 'Hz');
  rows.push({ label: `Z⁰ (loop broken, ${bAt})`, value: b.status === 'held' ? '0 (held by a source)' : formatCx(b.z0, 'Ω') });
  rows.push({ label: 'T_sc (node shorted)', value: formatCx(b.tSc) });
  rows.push({ label: 'T_oc (node open)', value: formatCx(b.tOc) });
  const f = mag(b.factor);
  const words = !Number.isFinite(f) ? '—' : f >= 1 ? `× ${f.toPrecision(3)}` : `÷ ${(1 / f).toPrecision(3)}`;
  rows.push({ label: '(1+T_sc)/(1+T_oc)', value: words });
  return rows;
}

/** "DC", "0" → 0; "1M", "10 kHz", "2.5e6" → Hz; else null. */
export function parseFrequency(text: string): number | null {
  const t = text.trim().replace(/hz$/i, '').trim();
  if (/^dc$/i.test(t)) return 0;
  const r = parseSi(t);
  return r.ok && Number.isFinite(r.value) && r.value >= 0 ? r.value : null;
}

export function formatFrequency(hz: number): string {
  return hz === 0 ? 'DC' : formatSi(hz, 'Hz');
}

export interface ScreenBadge {
  net: string;
  lines: string[];
  left: number;
  top: number;
  width: number;
  height: number;
  fontPx: number;
  /** Too small to read at this zoom: drawn as a dot at the anchor instead. */
  collapsed: boolean;
  anchor: { x: number; y: number };
}

/** Below this text size (px) badges collapse to dots (the read-out still shows on hover). */
export const MIN_BADGE_FONT_PX = 8;

/** Text size of badge lines in world units (the size annotate() sizes its badge boxes for). */
export const BADGE_TEXT_SIZE = 7;
/** World badge boxes (placed by annotate(), clear of symbols) → screen rectangles. */
export function badgesOnScreen(badges: Badge[], cam: Camera): ScreenBadge[] {
  const k = cam.scale;
  return badges.map((b) => {
    const box = b.box;
    const fontPx = BADGE_TEXT_SIZE * k;
    return {
      net: b.net, lines: b.lines,
      left: box.x * k + cam.x, top: box.y * k + cam.y, width: box.width * k, height: box.height * k,
      fontPx, collapsed: fontPx < MIN_BADGE_FONT_PX,
      anchor: { x: b.anchor.x * k + cam.x, y: b.anchor.y * k + cam.y },
    };
  });
}
