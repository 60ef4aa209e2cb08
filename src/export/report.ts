// Report export: the node table (|Z|, C, τ, node pole), poles, zeros and loops of one result, or of
// A and B in compare mode, as JSON and as CSV (RFC 4180 quoting, one table after another, each
// introduced by a "# section" line). Pure data in, text out.
import type { AnalysisResult } from '../engine/index';
import { SMALL_SIGNAL_CAUTION } from '../engine/index';
import type { LoopRow } from './loopReport';

export interface ReportSide {
  /** "A" or "B" in compare mode, else "A". */
  name: string;
  result: AnalysisResult;
  loops: LoopRow[];
  loopsOff?: string[];
}

export interface ReportInput {
  title: string;
  date: string;
  sides: ReportSide[];
}

const finite = (v: number | null | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : null);

function sideJson(s: ReportSide) {
  const r = s.result;
  return {
    name: s.name,
    ok: r.ok,
    conditions: { ...r.conditions, loopsOff: s.loopsOff ?? [] },
    dcGain: r.dcGain, bandwidthHz: r.bandwidthHz, unityGainHz: r.unityGainHz, phaseAtUnityDeg: r.phaseAtUnityDeg,
    nodes: r.nodes.filter((n) => !n.internal).map((n) => ({
      node: n.name, dcOhms: n.dcOhms, openAtDc: n.openAtDc, zAtFrequencyOhms: n.z ? n.z.mag : null, zPhaseDeg: n.z ? n.z.phaseDeg : null,
      farads: n.farads, tauSeconds: n.tau, nodePoleHz: n.poleHz, slowest: n.slowest,
    })),
    poles: r.poles.map((p) => ({ re: p.re, im: p.im, hz: p.hz, q: p.q, kind: p.kind, rhp: p.rhp })),
    zeros: r.zeros.map((z) => ({ re: z.re, im: z.im, hz: z.hz, rhp: z.rhp, cancelsPole: z.cancelsPole })),
    loops: s.loops,
    issues: r.issues.map((i) => ({ severity: i.severity, message: i.message })),
  };
}

export function reportJson(input: ReportInput): string {
  return JSON.stringify({
    format: 'polesketch-report', version: 1, title: input.title, date: input.date, caution: SMALL_SIGNAL_CAUTION,
    sides: input.sides.map(sideJson),
  }, null, 2) + '\n';
}

/** One CSV field (RFC 4180): quoted when it holds a comma, quote or line break. */
export function csvField(v: unknown): string {
  if (v === null || v === undefined) return '';
  const s = typeof v === 'number' ? (Number.isFinite(v) ? String(v) : '') : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
const row = (cells: unknown[]) => cells.map(csvField).join(',');

export function reportCsv(input: ReportInput): string {
  const lines: string[] = [row(['# report', input.title, input.date]), row(['# caution', SMALL_SIGNAL_CAUTION])];
  const sides = input.sides;
  lines.push('', row(['# nodes']), row(['side', 'node', '|Z| DC (ohm)', 'open at DC', '|Z| at f (ohm)', 'f (Hz)', 'C (F)', 'tau (s)', 'node pole (Hz)', 'slowest']));
  for (const s of sides) for (const n of s.result.nodes.filter((x) => !x.internal)) {
    lines.push(row([s.name, n.name, finite(n.dcOhms), n.openAtDc, n.z ? n.z.mag : null, s.result.conditions.frequencyHz, n.farads, finite(n.tau), finite(n.poleHz), n.slowest]));
  }
  lines.push('', row(['# poles']), row(['side', 're (rad/s)', 'im (rad/s)', 'f (Hz)', 'Q', 'kind', 'RHP']));
  for (const s of sides) for (const p of s.result.poles) lines.push(row([s.name, p.re, p.im, p.hz, p.q, p.kind, p.rhp]));
  lines.push('', row(['# zeros']), row(['side', 're (rad/s)', 'im (rad/s)', 'f (Hz)', 'RHP', 'cancels a pole']));
  for (const s of sides) for (const z of s.result.zeros) lines.push(row([s.name, z.re, z.im, z.hz, z.rhp, z.cancelsPole]));
  lines.push('', row(['# loops']), row(['side', 'loop', 'kind', 'members', 'key source', 'T at DC', 'holds voltage of', 'voltage factor', 'holds current into', 'current factor', 'crossover (Hz)', 'phase margin (deg)', 'gain margin (dB)', 'margin status']));
  for (const s of sides) for (const l of s.loops) {
    const t = l.returnRatioDc ? (l.returnRatioDc.im === 0 ? l.returnRatioDc.re : `${l.returnRatioDc.re}${l.returnRatioDc.im < 0 ? '-' : '+'}j${Math.abs(l.returnRatioDc.im)}`) : null;
    lines.push(row([s.name, l.label, l.kind, l.members.join(' '), l.key, t, l.regulates.voltage?.node, l.regulates.voltage?.factor, l.regulates.current?.node, l.regulates.current?.factor, l.margins.unityGainHz, l.margins.phaseMarginDeg, l.margins.gainMarginDb, l.margins.status]));
  }
  lines.push('', row(['# summary']), row(['side', 'DC gain', 'bandwidth (Hz)', 'unity gain (Hz)', 'phase at unity (deg)', 'loops off']));
  for (const s of sides) lines.push(row([s.name, s.result.dcGain, s.result.bandwidthHz, s.result.unityGainHz, s.result.phaseAtUnityDeg, (s.loopsOff ?? s.result.conditions.off).join(' ')]));
  return lines.join('\r\n') + '\r\n';
}
