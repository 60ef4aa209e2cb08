// The example drawings must describe the same circuits as the example engine netlists
// (src/examples/netlists/*.json, written independently): same parts, pins, node names and values.
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Netlist } from '../../src/engine/types';
import { parseGain, parseSi } from '../../src/engine/units';
import { loadDrawing } from '../../src/schematic/file';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { SYMBOLS } from '../../src/schematic/symbols';

const dir = new URL('../../src/examples/', import.meta.url);
const names = readdirSync(dir).filter((f) => f.endsWith('.drawing.json')).map((f) => f.replace('.drawing.json', ''));

function unitOf(kind: string, field: string): string | undefined {
  const sym = Object.values(SYMBOLS).find((s) => s.engine?.kind === kind && s.role === 'device');
  return sym?.params.find((p) => p.name === field)?.unit;
}

describe('example drawings', () => {
  it('exist for every example netlist', () => {
    const nets = readdirSync(new URL('netlists/', dir)).filter((f) => f.endsWith('.json')).map((f) => f.replace('.json', ''));
    expect(names.sort()).toEqual(nets.sort());
  });

  for (const name of names) {
    it(`${name}: drawing → netlist equals the example netlist`, () => {
      const loaded = loadDrawing(readFileSync(new URL(`${name}.drawing.json`, dir), 'utf8'));
      expect(loaded.ok).toBe(true);
      if (!loaded.ok) return;
      const r = documentToNetlist(loaded.doc);
      expect(r.issues).toEqual([]);
      const got = r.netlist!;
      const want = JSON.parse(readFileSync(new URL(`netlists/${name}.json`, dir), 'utf8')) as Netlist;
      expect(got.input).toBe(want.input);
      expect(got.output).toEqual(want.output);
      expect(got.process).toBe(want.process);
      const byName = (l: Netlist['parts']) => [...l].sort((a, b) => (a.name < b.name ? -1 : 1));
      const g = byName(got.parts);
      const w = byName(want.parts);
      expect(g.map((p) => [p.name, p.kind, p.pins])).toEqual(w.map((p) => [p.name, p.kind, p.pins]));
      g.forEach((gp, i) => {
        const wp = w[i];
        expect(Object.keys(gp.values).sort(), gp.name).toEqual(Object.keys(wp.values).sort());
        for (const [k, v] of Object.entries(wp.values)) {
          const unit = unitOf(wp.kind, k);
          const ref = unit === 'V/V' ? parseGain(v) : parseSi(v, unit); // the engine's own SI parser
          expect(ref.ok, `${wp.name}.${k}`).toBe(true);
          if (ref.ok) expect(Math.abs((gp.values[k] as number) - ref.value), `${wp.name}.${k}`).toBeLessThanOrEqual(1e-12 * Math.abs(ref.value));
        }
      });
    });
  }
});

describe('examples menu list', () => {
  it('lists every example drawing and each loads without issues', async () => {
    const { EXAMPLE_DRAWINGS } = await import('../../src/examples/index');
    expect(EXAMPLE_DRAWINGS.map((e) => e.id).sort()).toEqual([...names].sort());
    for (const e of EXAMPLE_DRAWINGS) {
      const doc = e.load();
      expect(doc.title).toBe(e.title);
      expect(Object.keys(doc.parts).length).toBeGreaterThan(3);
      expect(documentToNetlist(doc).netlist, e.id).toBeDefined();
    }
  });
});
