import { describe, expect, it } from 'vitest';
import { annotate, netAnchor, rowOhms } from '../../src/export/annotate';
import { impedanceColor, scaleFor } from '../../src/export/colorScale';
import { analyseDrawing } from '../../src/export/exportDrawing';
import { computeConnectivity } from '../../src/schematic/connectivity';
import { exampleDrawing } from './fixtures';

describe('annotations from an analysis', () => {
  it('colours each analysed net by its |Z| on the log scale and badges it with |Z|, C and τ', async () => {
    const doc = await exampleDrawing('sensor-cs-miller');
    const an = analyseDrawing(doc);
    const res = an.result!;
    const ann = annotate(doc, res);
    const rows = res.nodes.filter((r) => !r.internal && r.name !== '0');
    const scale = scaleFor(rows.map((r) => rowOhms(r, 'frequency')));
    for (const r of rows) {
      expect(ann.nets[r.name].color).toBe(impedanceColor(r.z?.mag ?? null, scale));
      const badge = ann.badges.find((b) => b.net === r.name)!;
      expect(badge.lines[0]).toMatch(new RegExp(`^${r.name}: \\|Z\\| `));
    }
    // The highest-|Z| node is drawn in the warmest (lightest) colour of the scale: sanity of the
    // mapping direction (common practice: soft, high-impedance nodes stand out).
    const hi = rows.reduce((a, b) => ((a.z?.mag ?? 0) > (b.z?.mag ?? 0) ? a : b));
    const lo = rows.reduce((a, b) => ((a.z?.mag ?? Infinity) < (b.z?.mag ?? Infinity) ? a : b));
    expect(ann.nets[hi.name].ohms!).toBeGreaterThan(ann.nets[lo.name].ohms!);
    expect(ann.slowest?.net).toBe(rows.find((r) => r.slowest)?.name);
    expect(ann.legend?.title).toMatch(/^node \|Z\| at /);
    expect(ann.caution).toMatch(/small-signal/);
  });

  it('uses the DC column when asked, and can leave badges out', async () => {
    const doc = await exampleDrawing('sensor-cs-miller');
    const res = analyseDrawing(doc).result!;
    const ann = annotate(doc, res, { column: 'dc', badges: 'none', scale: { minOhms: 1, maxOhms: 1e9 } });
    expect(ann.badges).toEqual([]);
    const out = res.nodes.find((r) => r.name === 'out')!;
    expect(ann.nets.out.ohms).toBe(out.dcOhms);
    expect(ann.nets.out.color).toBe(impedanceColor(out.dcOhms, { minOhms: 1, maxOhms: 1e9 }));
    expect(ann.legend?.title).toBe('node |Z| at DC');
  });

  it('puts marks on the net itself and draws nothing without a result', async () => {
    const doc = await exampleDrawing('follower-sampling-load');
    const conn = computeConnectivity(doc);
    for (const net of conn.nets) {
      const p = netAnchor(doc, net);
      const onWire = net.wires.some((id) => {
        const pts = doc.wires[id].points;
        return pts.some((a, i) => i > 0 && ((a.x === pts[i - 1].x && p.x === a.x && p.y >= Math.min(a.y, pts[i - 1].y) && p.y <= Math.max(a.y, pts[i - 1].y)) || (a.y === pts[i - 1].y && p.y === a.y && p.x >= Math.min(a.x, pts[i - 1].x) && p.x <= Math.max(a.x, pts[i - 1].x))));
      });
      expect(onWire || (p.x === net.anchor.x && p.y === net.anchor.y)).toBe(true);
    }
    const empty = annotate(doc, null);
    expect(empty.nets).toEqual({});
    expect(empty.legend).toBeNull();
  });
});
