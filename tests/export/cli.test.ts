import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/analyze';
import { annotatedSvg } from '../../src/export/exportDrawing';
import { DEFAULT_EXPORT_OPTIONS } from '../../src/export/liveOptions';
import { saveDrawing } from '../../src/schematic/file';
import { all, exampleDrawing, exampleNetlist, parseXml } from './fixtures';

/** What must match between two exports: groups with their colours, and every text. */
function essence(svg: string) {
  const { doc, problems } = parseXml(svg);
  expect(problems).toEqual([]);
  const groups = all(doc, 'g').filter((g) => g.getAttribute('id')).map((g) => `${g.getAttribute('id')}|${g.getAttribute('class') ?? ''}|${g.getAttribute('stroke') ?? ''}`);
  const texts = all(doc, 'text').map((t) => t.textContent!.replace(/date \d{4}-\d\d-\d\d/, 'date'));
  return { groups, texts };
}

const quiet = () => {};

describe('command line --svg', () => {
  const dir = mkdtempSync(join(tmpdir(), 'polesketch-svg-'));

  it('writes the same annotated SVG as the browser export for a saved drawing', async () => {
    const doc = await exampleDrawing('readout-cascode-regulated');
    const file = join(dir, 'drawing.json');
    writeFileSync(file, saveDrawing(doc));
    const out = join(dir, 'drawing.svg');
    expect(await main([file, '--svg', out], quiet, quiet)).toBe(0);
    const cli = readFileSync(out, 'utf8');
    const browser = annotatedSvg(doc, DEFAULT_EXPORT_OPTIONS); // what the top bar's export writes for a freshly opened drawing
    expect(essence(cli)).toEqual(essence(browser));
    expect(essence(cli).groups.some((g) => g.startsWith('net-out|net|#'))).toBe(true);
    expect(essence(cli).groups).toContain('slowest-node|slowest|');
  });

  it('lays out a netlist file first, giving the same parts, nets and colours as the import in the browser', async () => {
    const file = join(dir, 'netlist.json');
    writeFileSync(file, JSON.stringify(exampleNetlist('sensor-cs-miller')));
    const out = join(dir, 'netlist.svg');
    expect(await main([file, '--svg', out], quiet, quiet)).toBe(0);
    const browser = annotatedSvg(await exampleDrawing('sensor-cs-miller'), DEFAULT_EXPORT_OPTIONS);
    expect(essence(readFileSync(out, 'utf8'))).toEqual(essence(browser));
  });

  it('names the problem when the SVG cannot be written or the option has no value', async () => {
    const file = join(dir, 'n2.json');
    writeFileSync(file, JSON.stringify(exampleNetlist('sensor-cs-miller')));
    const errs: string[] = [];
    expect(await main([file, '--svg', join(dir, 'no-such-dir', 'x.svg')], quiet, (s) => errs.push(s))).toBe(1);
    expect(errs.join(' ')).toMatch(/cannot write/);
    const errs2: string[] = [];
    expect(await main([file, '--svg'], quiet, (s) => errs2.push(s))).toBe(1);
    expect(errs2.join(' ')).toMatch(/--svg needs a value/);
  });
});
