import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { execFile } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

interface Run { code: number; stdout: string; stderr: string }

function cli(args: string[]): Promise<Run> {
  return new Promise((resolve) => {
    execFile('npx', ['tsx', 'src/cli/analyze.ts', ...args], { cwd: process.cwd(), timeout: 110000 }, (err, stdout, stderr) => {
      const code = err ? (typeof (err as { code?: unknown }).code === 'number' ? (err as { code: number }).code : -1) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}

const dir = 'src/examples/netlists';
const examples = readdirSync(dir).filter((f) => f.endsWith('.json'));
const noStack = (s: string) => !/\n\s+at .+:\d+:\d+/.test(s);

let tmp = '';
beforeAll(() => { tmp = mkdtempSync(join(tmpdir(), 'analyze-cli-')); });
afterAll(() => { if (tmp) rmSync(tmp, { recursive: true, force: true }); });

describe('analyze CLI', { timeout: 120000 }, () => {
  it('runs on every example with --json and prints the whole result', async () => {
    const runs = await Promise.all(examples.map((f) => cli([join(dir, f), '--json'])));
    runs.forEach((r, i) => {
      expect(r.code, `${examples[i]}: ${r.stderr}`).toBe(0);
      const j = JSON.parse(r.stdout);
      expect(j.file).toBe(join(dir, examples[i]));
      expect(j.ok).toBe(true);
      expect(j.poles.length).toBeGreaterThan(0);
      expect(j.nodes.filter((n: { slowest: boolean }) => n.slowest).length).toBe(1);
      expect(j.caution).toMatch(/small-signal/);
      for (const key of ['zeros', 'dcGain', 'bandwidthHz', 'octc', 'conditions', 'sweep']) expect(j).toHaveProperty(key);
    });
  });

  it('text output has the caution line, poles, DC gain and the slowest node marked', async () => {
    const r = await cli([join(dir, 'sensor-cs-miller.json')]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/small-signal estimates/);
    expect(r.stdout).toMatch(/Poles \(2 finite/);
    expect(r.stdout).toMatch(/RHP/);
    expect(r.stdout).toMatch(/DC gain:\s+-48\.\d/);
    expect(r.stdout).toMatch(/out .*← slowest/);
  });

  it('--in/--out override the netlist transfer', async () => {
    const r = await cli([join(dir, 'sensor-cs-miller.json'), '--json', '--out', 'gate']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.conditions.output).toEqual({ kind: 'voltage', node: 'gate' });
    expect(j.dcGain).toBeCloseTo(1, 10); // no DC gate current: v(gate) = v(sensor) (common practice)
    const bad = await cli([join(dir, 'sensor-cs-miller.json'), '--in', 'Nope']);
    expect(bad.code).toBe(1);
    expect(bad.stderr).toMatch(/Nope/);
  });

  it('a broken netlist exits 1 with the file and part named, never a stack trace', async () => {
    const net = JSON.parse(readFileSync(join(dir, 'sensor-cs-miller.json'), 'utf8'));
    net.parts.find((p: { name: string }) => p.name === 'Cload').values.value = '-1p';
    net.parts.push({ name: 'Rlost', kind: 'resistor', pins: { p: 'island', n: 'island2' }, values: { value: '1k' } });
    const f = join(tmp, 'broken-stage.json');
    writeFileSync(f, JSON.stringify(net));
    const r = await cli([f]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/broken-stage\.json/);
    expect(r.stderr).toMatch(/Cload/);
    expect(noStack(r.stderr)).toBe(true);
    const floating = JSON.parse(readFileSync(join(dir, 'sensor-cs-miller.json'), 'utf8'));
    floating.parts.push({ name: 'Rlost', kind: 'resistor', pins: { p: 'island', n: 'island2' }, values: { value: '1k' } });
    const f2 = join(tmp, 'floating-part.json');
    writeFileSync(f2, JSON.stringify(floating));
    const r2 = await cli([f2, '--json']);
    expect(r2.code).toBe(1);
    expect(r2.stderr).toMatch(/island/);
    expect(JSON.parse(r2.stdout).ok).toBe(false);
  });

  it('missing file, invalid JSON and bad options exit 1 with a clear message', async () => {
    const notJson = join(tmp, 'not-json.json');
    writeFileSync(notJson, '{ "format": ');
    const [a, b, c] = await Promise.all([cli([join(tmp, 'nowhere.json')]), cli([notJson]), cli(['--bogus'])]);
    expect(a.code).toBe(1);
    expect(a.stderr).toMatch(/nowhere\.json: no such file/);
    expect(b.code).toBe(1);
    expect(b.stderr).toMatch(/not-json\.json: not valid JSON/);
    expect(c.code).toBe(1);
    expect(c.stderr).toMatch(/unknown option --bogus/);
    for (const r of [a, b, c]) expect(noStack(r.stderr)).toBe(true);
  });

  it('a saved drawing goes through the drawing converter and gives the same numbers as its netlist', async () => {
    const drawing = 'src/examples/sensor-cs-miller.drawing.json';
    const [a, b] = await Promise.all([cli([drawing, '--json']), cli([join(dir, 'sensor-cs-miller.json'), '--json'])]);
    expect(a.code, a.stderr).toBe(0);
    const ja = JSON.parse(a.stdout), jb = JSON.parse(b.stdout);
    expect(ja.dcGain / jb.dcGain).toBeCloseTo(1, 12);
    expect(ja.poles.map((p: { hz: number }) => p.hz)).toEqual(jb.poles.map((p: { hz: number }) => p.hz));
  });
});
