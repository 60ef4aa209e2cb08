// Feedback options of the analyze command line: --loops, --off NAME[,NAME…], --compare,
// --locus NAME [--kmax K]. takeFeedbackArgs() removes them from argv before the CLI parses the rest;
// feedbackReport() turns a netlist into printable lines and a JSON object.
import type { Netlist, OutputSpec } from '../types';
import { buildMna } from '../mna';
import { formatSi } from '../units';
import { analyzeFeedbackSystem, resolveOff, FEEDBACK_CAUTION } from './index';
import type { FeedbackResult } from './index';
import { compareOff } from './compare';
import type { LoopComparison } from './compare';
import { rootLocus } from './locus';
import type { RootLocus } from './locus';
import { discoverLoops } from './loops';
import { fmt } from './regulation';

export interface FeedbackArgs {
  loops: boolean;
  off: string[];
  compare: boolean;
  locus: string | null;
  kMax: number;
  problems: string[];
}

export const FEEDBACK_USAGE = '[--loops] [--off LOOP|PART[,…]] [--compare] [--locus LOOP|PART [--kmax K]]';

/** Split feedback options out of argv; args is null when none was given. */
export function takeFeedbackArgs(argv: string[]): { rest: string[]; args: FeedbackArgs | null } {
  const a: FeedbackArgs = { loops: false, off: [], compare: false, locus: null, kMax: 10, problems: [] };
  const rest: string[] = [];
  let any = false;
  for (let i = 0; i < argv.length; i++) {
    const t = argv[i];
    const value = () => {
      const v = argv[i + 1];
      if (v === undefined || v.startsWith('--')) { a.problems.push(`${t} needs a value`); return null; }
      i++;
      return v;
    };
    if (t === '--loops') { a.loops = true; any = true; }
    else if (t === '--compare') { a.compare = true; any = true; }
    else if (t === '--off') { any = true; const v = value(); if (v) a.off.push(...v.split(',').map((s) => s.trim()).filter(Boolean)); }
    else if (t === '--locus') { any = true; a.locus = value(); }
    else if (t === '--kmax') {
      any = true;
      const v = value();
      const k = v === null ? NaN : Number(v);
      if (v !== null && !(k > 0 && Number.isFinite(k))) a.problems.push(`--kmax: "${v}" is not a positive number`);
      else if (v !== null) a.kMax = k;
    } else rest.push(t);
  }
  if (a.compare && !a.off.length) a.problems.push('--compare needs --off to say which loops to switch off');
  return { rest, args: any ? a : null };
}

export interface FeedbackReport {
  lines: string[];
  json: { feedback: FeedbackResult | null; comparison: Omit<LoopComparison, 'before' | 'after'> | null; locus: RootLocus | null };
  errors: string[];
}

export function feedbackReport(netlist: Netlist, args: FeedbackArgs, io: { input?: string; output?: OutputSpec } = {}): FeedbackReport {
  const lines: string[] = [];
  const errors = [...args.problems];
  const json: FeedbackReport['json'] = { feedback: null, comparison: null, locus: null };
  if (errors.length) return { lines, json, errors };
  const built = buildMna({ ...netlist, input: io.input ?? netlist.input, output: io.output ?? netlist.output });
  if (!built.system) return { lines, json, errors: built.issues.filter((i) => i.severity === 'error').map((i) => i.message) };
  const sys = built.system;
  const fb = analyzeFeedbackSystem(sys, {});
  json.feedback = fb;
  lines.push('', `Feedback loops (${fb.loops.length}${fb.truncated ? ', list cut to the largest' : ''}; threshold |loop gain| > ${fb.threshold}):`);
  lines.push(`  ${FEEDBACK_CAUTION}`);
  for (const { loop, regulation, margins } of fb.loops) {
    const t = loop.returnRatioDc.value;
    const band = loop.band ? (loop.band.fromHz === 0 ? `DC – ${loop.band.toHz === null ? 'top of sweep' : hz(loop.band.toHz)}` : `${hz(loop.band.fromHz)} – ${loop.band.toHz === null ? 'top of sweep' : hz(loop.band.toHz)}`) : '—';
    lines.push(`  ${loop.id}  [${loop.kind}] key ${loop.key}`);
    const through = loop.sources.map((m) => m.id).join(', ');
    const folded = loop.variants.length ? `; folded in as parallel paths or detours: ${loop.variants.slice(0, 3).join(', ')}${loop.variants.length > 3 ? ` and ${loop.variants.length - 3} more paths` : ''}` : '';
    lines.push(`    parts: ${loop.parts.join(' → ')} (sources ${through})${folded}`);
    lines.push(`    path: ${loop.nets.join(' → ')}; active ${band}`);
    // open at DC but closing higher up: e.g. an output held only by an ideal test current source
    const openAtDc = t !== null && Math.hypot(t.re, t.im) < 1e-9 && loop.band !== null && loop.band.fromHz > 0;
    lines.push(`    T(DC) = ${t ? fmt(t.re) : `— (${loop.returnRatioDc.status})`}${openAtDc ? ` (open at DC; closes above ${hz(loop.band!.fromHz)})` : ''}; cycle gain ${fmt(loop.cycleGainDc.re)} at DC, peak ${fmt(loop.peakCycleGain)}`);
    if (margins.unityGainHz !== null) lines.push(`    crossover ${hz(margins.unityGainHz)}, phase margin ${margins.phaseMarginDeg!.toFixed(1)}°${margins.gainMarginDb !== null ? `, gain margin ${margins.gainMarginDb.toFixed(1)} dB` : ''}`);
    else if (margins.message) lines.push(`    ${margins.message}`);
    lines.push(`    ${regulation.summary}`);
  }
  for (const b of fb.boosters) lines.push(`  booster: ${b.verdict}`);
  for (const d of fb.doublets?.doublets ?? []) lines.push(`  doublet: pole ${hz(d.poleHz)}, zero ${fmt(d.spacing * 100)} % away, tail τ = ${formatSi(d.tailSeconds, 's')}`);
  if (fb.slowestPole?.status === 'ok') {
    const top = fb.slowestPole.ranked.slice(0, 5).map((e) => `${e.element} (${e.value}) ${fmt(e.dlnp.re)}`).join(', ');
    lines.push(`  slowest pole ${hz(Math.hypot(fb.slowestPole.pole!.re, fb.slowestPole.pole!.im) / (2 * Math.PI))}: d ln|p|/d ln x — ${top}`);
  }
  if (fb.step?.status === 'ok') {
    lines.push(`  step response: settles to ${fb.step.settling.map((x) => `${x.tolerance * 100} % in ${x.seconds === null ? '—' : formatSi(x.seconds, 's')}`).join(', ')}; overshoot ${fmt((fb.step.overshoot ?? 0) * 100)} %`);
  } else if (fb.step?.message) lines.push(`  step response: ${fb.step.message}`);
  for (const n of fb.notes) lines.push(`  note: ${n}`);
  const loops = args.off.length || args.locus ? discoverLoops(sys).loops : [];
  if (args.off.length) {
    const r = resolveOff(sys, args.off, loops);
    errors.push(...r.issues.map((i) => i.message));
    if (r.ids.length) {
      const c = compareOff(sys, r.ids);
      const { before: _b, after: _a, ...rest } = c;
      void _b; void _a;
      json.comparison = rest;
      lines.push('', `Off: ${r.ids.join(', ')} (A = as drawn, B = off)`);
      lines.push(`  DC gain ${num(c.dcGain.before)} → ${num(c.dcGain.after)};  bandwidth ${hzn(c.bandwidthHz.before)} → ${hzn(c.bandwidthHz.after)}`);
      if (args.compare) {
        lines.push('  poles:');
        for (const p of c.poles) {
          if ((p.before?.im ?? p.after?.im ?? 0) < 0) continue;
          lines.push(`    ${p.before ? hz(p.before.hz) : '—'} → ${p.after ? hz(p.after.hz) : '—'}${p.ratio !== null ? `  (×${fmt(p.ratio)})` : ''}`);
        }
        lines.push('  nodes (|Z| DC, τ):');
        for (const n of c.nodes) lines.push(`    ${n.node}: ${ohmn(n.dcOhmsBefore)} → ${ohmn(n.dcOhmsAfter)};  τ ${sn(n.tauBefore)} → ${sn(n.tauAfter)}`);
      }
    }
  }
  if (args.locus) {
    const r = resolveOff(sys, [args.locus], loops);
    errors.push(...r.issues.map((i) => i.message.replace(/^off:/, 'locus:')));
    if (r.ids.length) {
      const loc = rootLocus(sys, r.ids[0], { kMax: args.kMax });
      json.locus = loc;
      lines.push('', `Root locus of ${r.ids[0]}, k = 0 … ${args.kMax} (${loc.k.length} steps, ${loc.branches.length} poles)`);
      lines.push(loc.rhpAtK === null ? '  no pole crosses into the right half-plane in this range' : `  a pole enters the right half-plane at k = ${fmt(loc.rhpAtK)} (at ${hz(Math.abs(loc.rhpPole!.im) / (2 * Math.PI))})`);
      for (const s of loc.splits) lines.push(`  real poles meet and split at k = ${fmt(s.k)} (at ${hz(Math.abs(s.pole.re) / (2 * Math.PI))})`);
      if (loc.message) lines.push(`  ${loc.message}`);
    }
  }
  return { lines, json, errors };
}

const hz = (v: number) => formatSi(v, 'Hz');
const hzn = (v: number | null) => (v === null ? '—' : hz(v));
const num = (v: number | null) => (v === null ? '—' : v.toPrecision(4));
const ohmn = (v: number | null) => (v === null ? 'open' : formatSi(v, 'Ω'));
const sn = (v: number | null) => (v === null ? '—' : formatSi(v, 's'));
