import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/engine/index';
import { drawingReport } from '../../src/export/exportDrawing';
import { csvField } from '../../src/export/report';
import { bodeModel } from '../../src/plots/model/bodeModel';
import { splaneModel } from '../../src/plots/model/splaneModel';
import { bodeInputFrom, splaneInputFrom } from '../../src/plots/fromEngine';
import { toSvg } from '../../src/plots/toSvg';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { all, exampleDrawing, parseXml } from './fixtures';

/** Minimal RFC 4180 reader (quoted fields, doubled quotes, CRLF records), written for this test. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [], field = '', quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') { field += '"'; i++; } else if (c === '"') quoted = false; else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') { row.push(field); field = ''; }
    else if (c === '\r' && text[i + 1] === '\n') { row.push(field); rows.push(row); row = []; field = ''; i++; }
    else field += c;
  }
  return rows;
}

function section(rows: string[][], name: string): string[][] {
  const start = rows.findIndex((r) => r[0] === `# ${name}`);
  const out: string[][] = [];
  for (let i = start + 1; i < rows.length && !(rows[i].length === 1 && rows[i][0] === ''); i++) out.push(rows[i]);
  return out;
}

describe('report export', () => {
  it('writes the node table, poles, zeros and loops for A and B as JSON', async () => {
    const doc = await exampleDrawing('readout-cascode-regulated');
    const plain = drawingReport(doc, { date: '2026-01-15' });
    const loopKey = JSON.parse(plain.json).sides[0].loops[0].key as string;
    const r = drawingReport(doc, { date: '2026-01-15', compareOff: [loopKey] });
    const j = JSON.parse(r.json);
    expect(j.format).toBe('polesketch-report');
    expect(j.caution).toMatch(/small-signal/);
    expect(j.sides.map((s: { name: string }) => s.name)).toEqual(['A', 'B']);
    const netlist = documentToNetlist(doc).netlist!;
    const ref = analyze(netlist); // independent run of the engine on the same netlist
    const a = j.sides[0];
    expect(a.poles.length).toBe(ref.poles.length);
    expect(a.poles[0].hz).toBeCloseTo(ref.poles[0].hz, 6);
    const out = a.nodes.find((n: { node: string }) => n.node === 'out');
    expect(out.dcOhms).toBeCloseTo(ref.nodes.find((n) => n.name === 'out')!.dcOhms!, 3);
    expect(a.loops.length).toBeGreaterThan(0);
    expect(a.loops[0].members.length).toBeGreaterThan(0);
    expect(a.loops[0].margins).toHaveProperty('phaseMarginDeg');
    expect(j.sides[1].conditions.off).toContain(loopKey);
    // Switching the regulating loop off lowers the output impedance (Gray & Meyer: regulated
    // cascode Rout ≈ (1 + A)·gm·ro² against gm·ro² without the amplifier).
    const outB = j.sides[1].nodes.find((n: { node: string }) => n.node === 'out');
    expect(out.dcOhms / outB.dcOhms).toBeGreaterThan(20);
  });

  it('writes the same tables as RFC 4180 CSV', async () => {
    const doc = await exampleDrawing('two-stage-miller-unity');
    const r = drawingReport(doc, { date: '2026-01-15' });
    const rows = readCsv(r.csv);
    const nodes = section(rows, 'nodes');
    const header = nodes[0];
    expect(header).toContain('|Z| DC (ohm)');
    for (const row of nodes) expect(row.length).toBe(header.length);
    const j = JSON.parse(r.json);
    expect(nodes.length - 1).toBe(j.sides[0].nodes.length);
    const poles = section(rows, 'poles');
    expect(poles.length - 1).toBe(j.sides[0].poles.length);
    expect(Number(poles[1][3])).toBeCloseTo(j.sides[0].poles[0].hz, 6);
    expect(section(rows, 'loops')[0]).toContain('phase margin (deg)');
    expect(csvField('a,"b"')).toBe('"a,""b"""'); // RFC 4180 §2.6-2.7
    expect(csvField(Number.NaN)).toBe('');
  });
});

describe('plot export', () => {
  // The app's plot export: src/plots scene models serialised by toSvg (checked as XML 1.0 here).
  it('writes a Bode plot and a pole-zero map as well-formed SVG', async () => {
    const doc = await exampleDrawing('two-stage-miller-unity');
    const res = analyze(documentToNetlist(doc).netlist!);
    const bode = parseXml(toSvg(bodeModel(bodeInputFrom(res, 'two-stage')!)));
    expect(bode.problems).toEqual([]);
    const mag = all(bode.doc, 'path').filter((p) => p.getAttribute('class') === 'ps-curve-mag');
    const phase = all(bode.doc, 'path').filter((p) => p.getAttribute('class') === 'ps-curve-phase');
    expect(mag.length).toBe(1);
    expect(phase.length).toBe(1);
    // One path vertex per sweep point where the value is defined (common practice: a polyline).
    expect(mag[0].getAttribute('d')!.split(/[ML]/).filter((x) => x.trim()).length).toBe(res.sweep!.magDb.filter((v) => v !== null).length);
    const pz = parseXml(toSvg(splaneModel(splaneInputFrom(res))));
    expect(pz.problems).toEqual([]);
    expect(all(pz.doc, 'path').filter((p) => p.getAttribute('class') === 'ps-pole').length).toBe(res.poles.length);
    expect(all(pz.doc, 'path').filter((p) => p.getAttribute('class') === 'ps-zero').length).toBe(res.zeros.length);
    expect(parseXml(toSvg(bodeModel({ hz: [], magDb: [], phaseDeg: [] }))).problems).toEqual([]);
  });
});
