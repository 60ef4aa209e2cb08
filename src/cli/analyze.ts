// Command line: npm run analyze -- <file.json> [--json] [--in SRC --out NODE] [--svg out.svg]
// Reads an engine netlist (or a saved drawing), runs every small-signal analysis and prints poles,
// zeros, gains, bandwidth and the node table. Exit code 1 on bad input, with named messages.

import { readFileSync } from 'node:fs';
import { analyze, formatSi, SMALL_SIGNAL_CAUTION, type AnalysisResult, type AnalyzeOptions, type Netlist } from '../engine/index';
import { feedbackReport, takeFeedbackArgs, FEEDBACK_USAGE } from '../engine/feedback/cli';

interface CliArgs { file?: string; json: boolean; input?: string; output?: string; svg?: string; problems: string[] }

function parseArgs(argv: string[]): CliArgs {
  const a: CliArgs = { json: false, problems: [] };
  for (let i = 0; i < argv.length; i++) {
    const t = argv[i];
    if (t === '--json') a.json = true;
    else if (t === '--in' || t === '--out' || t === '--svg') {
      const v = argv[i + 1];
      if (v === undefined || v.startsWith('--')) a.problems.push(`${t} needs a value`);
      else { if (t === '--in') a.input = v; else if (t === '--svg') a.svg = v; else a.output = v; i++; }
    } else if (t.startsWith('--')) a.problems.push(`unknown option ${t}`);
    else if (a.file === undefined) a.file = t;
    else a.problems.push(`unexpected argument "${t}"`);
  }
  if (a.file === undefined) a.problems.push('no input file given');
  return a;
}

export interface LoadedDocument { netlist?: Netlist; problems: string[] }

/** Hook for every document kind the CLI accepts: an engine netlist as is, or a saved drawing
 *  ("format": "polesketch-drawing") checked by the drawing loader (src/schematic/file.ts, when
 *  present) and converted by documentToNetlist (src/schematic/toNetlist.ts) when that is present. */
export async function loadAnyDocument(json: unknown): Promise<LoadedDocument> {
  if (typeof json !== 'object' || json === null || Array.isArray(json)) return { problems: ['expected a JSON object (an engine netlist or a saved drawing)'] };
  const fmt = (json as { format?: unknown }).format;
  if (fmt !== 'polesketch-drawing') return { netlist: json as Netlist, problems: [] };
  type Converter = { documentToNetlist?: (doc: never) => { netlist?: Netlist; issues: { severity: string; message: string }[] } };
  type Loader = { loadDrawing?: (input: unknown) => { ok: true; doc: unknown } | { ok: false; reason: string } };
  let conv: Converter;
  try {
    conv = await import('../schematic/toNetlist');
  } catch {
    return { problems: ['this is a saved drawing, but the drawing converter (src/schematic/toNetlist.ts) is not available'] };
  }
  if (typeof conv.documentToNetlist !== 'function') return { problems: ['the drawing converter does not export documentToNetlist'] };
  let doc: unknown = json;
  const loader: Loader | null = await import('../schematic/file').catch(() => null);
  if (loader && typeof loader.loadDrawing === 'function') {
    const loaded = loader.loadDrawing(json);
    if (!loaded.ok) return { problems: [`drawing: ${loaded.reason}`] };
    doc = loaded.doc;
  }
  const r = conv.documentToNetlist(doc as never);
  const problems = r.issues.filter((i) => i.severity === 'error').map((i) => `drawing: ${i.message}`);
  if (!problems.length && !r.netlist) problems.push('drawing: the drawing gave no netlist');
  return { netlist: problems.length ? undefined : r.netlist, problems };
}

const hz = (v: number | null) => (v === null ? '—' : formatSi(v, 'Hz'));
const ohm = (v: number | null, open: boolean) => (v === null ? (open ? 'open' : '—') : formatSi(v, 'Ω'));
const pad = (s: string, w: number) => (s.length >= w ? s : s + ' '.repeat(w - s.length));

function printText(file: string, title: string | undefined, r: AnalysisResult, out: (s: string) => void): void {
  out(`${title ? `${title} — ` : ''}${file}`);
  out(`Caution: ${SMALL_SIGNAL_CAUTION}`);
  const c = r.conditions;
  const o = c.output ? (c.output.kind === 'voltage' ? `v(${c.output.node}${c.output.ref ? `, ${c.output.ref}` : ''})` : `i(${c.output.part})`) : 'none';
  out(`Input ${c.input ?? 'none'}, output ${o}${c.off.length ? `, off: ${c.off.join(', ')}` : ''}`);
  out(`Unknowns: ${r.unknowns.nodes} nodes, ${r.unknowns.branches} branch currents`);
  out('');
  out(`Poles (${r.poles.length} finite, ${r.poleInfo.infiniteCount} at infinity):`);
  r.poles.forEach((p, i) => {
    if (p.im < 0) return;
    const where = r.participation[i]?.nodes[0];
    const lives = where ? `  at ${where.node} (${(where.share * 100).toFixed(0)}%)` : '';
    if (p.kind === 'origin') out(`  s = 0 (ideal integrator)${lives}`);
    else if (p.kind === 'real') out(`  ${pad(hz(p.hz), 12)} real ${p.rhp ? 'RHP ' : ''}(${p.re.toExponential(4)} rad/s)${lives}`);
    else out(`  ${pad(hz(p.hz), 12)} pair, Q = ${p.q === null ? '∞' : p.q.toPrecision(3)} ${p.rhp ? 'RHP ' : ''}(${p.re.toExponential(4)} ± j${p.im.toExponential(4)} rad/s)${lives}`);
  });
  if (r.reasons.poles) out(`  (${r.reasons.poles})`);
  out(`Zeros (${r.zeros.length} finite):`);
  for (const z of r.zeros) {
    if (z.im < 0) continue;
    const tags = [z.rhp ? 'RHP' : 'LHP', z.im !== 0 ? 'pair' : 'real', z.cancelsPole ? 'cancels a pole' : ''].filter(Boolean).join(', ');
    out(`  ${pad(hz(z.hz), 12)} ${tags} (${z.re.toExponential(4)}${z.im ? ` ± j${z.im.toExponential(4)}` : ''} rad/s)`);
  }
  if (r.reasons.zeros) out(`  (${r.reasons.zeros})`);
  out('');
  out(`DC gain:            ${r.dcGain === null ? `— (${r.reasons.dcGain ?? 'undefined'})` : gainText(r.dcGain, r.gainUnit)}`);
  out(`−3 dB bandwidth:    ${r.bandwidthHz === null ? `— (${r.reasons.bandwidthHz ?? 'undefined'})` : hz(r.bandwidthHz)}`);
  out(`Unity-gain freq.:   ${r.unityGainHz === null ? `— (${r.reasons.unityGainHz ?? 'undefined'})` : `${hz(r.unityGainHz)}, phase ${r.phaseAtUnityDeg === null ? '—' : r.phaseAtUnityDeg.toFixed(1) + '°'}`}`);
  if (r.octc) out(`OCTC estimate:      ${r.octc.bandwidthHz === null ? `— (${r.octc.reason ?? ''})` : `${hz(r.octc.bandwidthHz)} (Στ = ${formatSi(r.octc.sumTau!, 's')})`}`);
  out('');
  out(`Nodes (|Z| to ground; Z at ${hz(c.frequencyHz)}):`);
  out(`  ${pad('node', 14)}${pad('|Z| DC', 12)}${pad('|Z| at f', 12)}${pad('C', 11)}${pad('τ', 11)}node pole`);
  for (const n of r.nodes) {
    const tau = n.tau === null ? (n.openAtDc ? '∞' : '—') : formatSi(n.tau, 's');
    const pole = n.poleHz === null ? '—' : n.openAtDc ? '0 (integrator)' : hz(n.poleHz);
    out(`  ${pad(n.internal ? `(${n.name})` : n.name, 14)}${pad(ohm(n.dcOhms, n.openAtDc), 12)}${pad(n.z ? formatSi(n.z.mag, 'Ω') : '—', 12)}${pad(formatSi(n.farads, 'F'), 11)}${pad(tau, 11)}${pole}${n.slowest ? '   ← slowest' : ''}`);
  }
  if (r.nodes.some((n) => n.internal)) out('  (names in parentheses are nodes inside a part model)');
  const warnings = r.issues.filter((i) => i.severity === 'warning');
  if (warnings.length) { out(''); for (const w of warnings) out(`warning: ${w.message}`); }
}

export async function main(argv: string[], out: (s: string) => void = console.log, err: (s: string) => void = console.error): Promise<number> {
  const fb = takeFeedbackArgs(argv);
  const args = parseArgs(fb.rest);
  args.problems.push(...(fb.args?.problems ?? []));
  if (args.problems.length) {
    for (const p of args.problems) err(`analyze: ${p}`);
    err(`usage: npm run analyze -- <file.json> [--json] [--in SRC --out NODE] [--svg out.svg] ${FEEDBACK_USAGE}`);
    return 1;
  }
  const file = args.file!;
  let json: unknown;
  try {
    json = JSON.parse(readFileSync(file, 'utf8'));
  } catch (e) {
    const why = e instanceof SyntaxError ? `not valid JSON (${e.message})` : (e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : 'cannot be read';
    err(`analyze: ${file}: ${why}`);
    return 1;
  }
  const doc = await loadAnyDocument(json);
  if (!doc.netlist) {
    for (const p of doc.problems) err(`${file}: ${p}`);
    return 1;
  }
  const opts: AnalyzeOptions = {};
  if (args.input) opts.input = args.input;
  if (args.output) opts.output = { kind: 'voltage', node: args.output };
  const r = analyze(doc.netlist, opts);
  const errors = r.issues.filter((i) => i.severity === 'error');
  const rep = fb.args && r.ok ? feedbackReport(doc.netlist, fb.args, opts) : null;
  if (args.json) out(JSON.stringify({ file, title: doc.netlist.title ?? null, ...r, ...(rep ? { feedback: rep.json } : {}) }, null, 1));
  else if (r.ok) { printText(file, doc.netlist.title, r, out); for (const l of rep?.lines ?? []) out(l); }
  for (const e of rep?.errors ?? []) err(`${file}: error: ${e}`);
  if (rep?.errors.length) return 1;
  if (errors.length) {
    for (const e of errors) err(`${file}: error: ${e.message}`);
    return 1;
  }
  if (args.svg) {
    const { writeSvgFile } = await import('../export/cliExport');
    const problems = await writeSvgFile(json, args.svg);
    for (const p of problems) err(`${file}: ${p}`);
    if (problems.length) return 1;
  }
  return 0;
}

const invokedDirectly = typeof process !== 'undefined' && process.argv[1] !== undefined && /analyze\.[cm]?[tj]s$/.test(process.argv[1]);
if (invokedDirectly) {
  main(process.argv.slice(2)).then(
    (code) => { process.exitCode = code; },
    (e) => { console.error(`analyze: internal problem: ${e instanceof Error ? e.message : String(e)}`); process.exitCode = 2; },
  );
}

/** DC gain with its unit: a ratio (V/V, A/A) also in dB; a transimpedance or transconductance
 *  also with an SI prefix. */
function gainText(g: number, unit: string | null): string {
  const plain = g.toPrecision(5);
  if (unit === 'Ω' || unit === 'S') return `${plain} ${unit} (${formatSi(g, unit)})`;
  const db = `${(20 * Math.log10(Math.abs(g) || 1e-300)).toFixed(2)} dB`;
  return unit ? `${plain} ${unit} (${db})` : `${plain} (${db})`;
}
