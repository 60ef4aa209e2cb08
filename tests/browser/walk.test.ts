// A new user's walk through the built app in real Chromium, one build and one page for all steps
// (the `it`s run in order and share the page): open on the built-in example, place and wire a
// resistor and a capacitor, switch the cascode's error-amplifier loop off, compare A/B, and
// reload to find the drawing restored. Screenshots go to tests/artifacts/walk-*.png.
// Waits are on conditions (a badge or table cell changing), never on fixed sleeps.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { artifactPath, browserSuite, closeApp, openApp, type AppSession } from './harness';
import { AUTOSAVE_KEY, loadDrawing } from '../../src/schematic/file';
import { placedPins } from '../../src/schematic/symbols';
import type { DrawingDocument, PartRecord } from '../../src/schematic/document';
import { parseSi } from '../../src/engine/units';

type Pt = { x: number; y: number };

/** First figure with the given unit in a badge or cell text, e.g. "|Z| 86.2 kΩ" → 86200. */
function figure(text: string, unit: string): number {
  const m = new RegExp(`(-?[\\d.]+(?:e-?\\d+)?)\\s*([fpnuµmkMGT]?)${unit}`).exec(text);
  const v = m ? parseSi(m[1] + m[2]) : null;
  return v && v.ok ? v.value : NaN;
}

browserSuite('walk-through of the main job in Chromium', () => {
  let app: AppSession;
  let page: Page;
  let errors: string[] = [];
  const shot = (name: string) => page.screenshot({ path: artifactPath(`walk-${name}.png`) });

  beforeAll(async () => {
    app = await openApp();
    ({ page, errors } = app);
  }, 120000);
  afterAll(() => closeApp(app));

  /** The drawing as the app autosaved it (the app's own state, written 400 ms after an edit). */
  async function savedDoc(): Promise<DrawingDocument> {
    const text = await page.evaluate((k) => localStorage.getItem(k), AUTOSAVE_KEY);
    expect(text, 'autosaved drawing in localStorage').toBeTruthy();
    const r = loadDrawing(text!);
    if (!r.ok) throw new Error(`autosave not readable: ${r.reason}`);
    return r.doc;
  }

  // Camera as the overlay reports it (scale, x, y); read while the overlay shows (a half-wired
  // drawing shows fault messages instead) and kept until the view is zoomed or fitted again.
  let cam = [1, 0, 0];
  async function readCamera(): Promise<void> {
    cam = (await page.getAttribute('[data-testid="analysis-overlay"]', 'data-camera'))!.split(',').map(Number);
  }
  /** Page coordinates of a world point, from the camera and the sheet's box. */
  async function toPage(p: Pt): Promise<Pt> {
    const box = (await page.locator('[data-testid="sheet"]').boundingBox())!;
    const s = { x: box.x + p.x * cam[0] + cam[1], y: box.y + p.y * cam[0] + cam[2] };
    expect(s.x > box.x && s.x < box.x + box.width && s.y > box.y && s.y < box.y + box.height, `world (${p.x},${p.y}) on screen`).toBe(true);
    return s;
  }

  const idle = () => page.waitForFunction(() => !document.querySelector('.ao-busy') && !document.querySelector('.rp-busy'), undefined, { timeout: 30000 });
  const badgeText = (net: string) => page.locator(`[data-testid="badge-${net}"]`).innerText();
  const nodeZ = (net: string) => page.locator(`[data-testid="node-row"][data-node="${net}"] [data-testid="node-z"]`).innerText();
  /** Wait until a text read by `read` differs from `before`; return the new text. */
  async function changed(read: () => Promise<string>, before: string, what: string): Promise<string> {
    for (let i = 0; i < 300; i++) {
      const now = await read().catch(() => before);
      if (now !== before) return now;
      await page.waitForFunction(() => new Promise((r) => requestAnimationFrame(() => r(true))));
    }
    throw new Error(`${what} did not change from "${before}"`);
  }

  async function placeAt(kind: string, at: Pt): Promise<void> {
    await page.getByRole('button', { name: `Place ${kind}` }).click();
    const s = await toPage(at);
    await page.mouse.move(s.x - 5, s.y - 5);
    await page.mouse.move(s.x, s.y);
    await page.mouse.click(s.x, s.y);
    await page.keyboard.press('Escape');
  }

  async function wire(a: Pt, b: Pt): Promise<void> {
    await page.getByRole('button', { name: 'Wire', exact: true }).click();
    const sa = await toPage(a), sb = await toPage(b);
    await page.mouse.click(sa.x, sa.y);
    await page.mouse.move(sb.x, sb.y, { steps: 4 });
    await page.mouse.click(sb.x, sb.y);
    await page.keyboard.press('Escape');
  }

  const pin = (p: PartRecord, name: string) => placedPins(p).find((q) => q.name === name)!;

  it('opens on the built-in example with a badge on each node', async () => {
    await page.waitForSelector('[data-testid="analysis-overlay"] .ao-badge', { timeout: 30000 });
    await idle();
    await shot('01-example');
    const doc = await savedDoc();
    expect(await page.locator('.doc-title').innerText()).toContain(doc.title!);
    expect(Object.keys(doc.parts).length).toBeGreaterThan(5);
    expect(await page.locator('[data-testid="badge-out"]').count()).toBe(1);
    expect(errors).toEqual([]);
  });

  it('places a resistor and a capacitor, wires them to the output node, and the node badge changes', async () => {
    await readCamera();
    const fitted = cam[0];
    await page.locator('.sheet-zoom').getByTitle('Zoom out').click();
    await page.waitForFunction((s) => Number(document.querySelector('[data-testid="analysis-overlay"]')?.getAttribute('data-camera')?.split(',')[0]) < s, fitted);
    await readCamera();
    const before = await badgeText('out');
    const start = await savedDoc();
    const cload = Object.values(start.parts).find((p) => p.ref === 'Cload')!;
    const outPin = pin(cload, 'p'); // Cload's top pin is on net "out" in this example
    // R and C side by side below the drawing, joined at their top and bottom pins, a ground
    // below the resistor and a wire up to the output node.
    await placeAt('Resistor', { x: 240, y: 200 });
    await placeAt('Capacitor', { x: 280, y: 200 });
    await placeAt('Ground', { x: 240, y: 260 });
    const n0 = Object.keys(start.parts).length;
    await page.waitForFunction(([k, n]) => Object.keys(JSON.parse(localStorage.getItem(k as string) ?? '{}').parts ?? {}).length === n, [AUTOSAVE_KEY, n0 + 3] as const);
    const placed = await savedDoc();
    const fresh = Object.values(placed.parts).filter((p) => !start.parts[p.id]);
    const r = fresh.find((p) => p.kind === 'resistor'), c = fresh.find((p) => p.kind === 'capacitor');
    expect(fresh.map((p) => p.kind).sort()).toEqual(['capacitor', 'ground', 'resistor']);
    await wire(pin(r!, 'p'), pin(c!, 'p'));
    await wire(pin(r!, 'n'), pin(c!, 'n'));
    const g = fresh.find((p) => p.kind === 'ground')!;
    await wire(pin(r!, 'n'), pin(g, 'g'));
    await wire(pin(r!, 'p'), { x: outPin.x + 30, y: outPin.y });
    const after = await changed(() => badgeText('out'), before, 'badge of node out');
    await idle();
    await shot('02-rc-wired');
    // The autosave is written a moment after the edit: wait for it to hold the four new wires
    // (a timeout here fails the test just as a missing wire would).
    const w0 = Object.keys(start.wires).length;
    await page.waitForFunction(([k, n]) => Object.keys(JSON.parse(localStorage.getItem(k as string) ?? '{}').wires ?? {}).length >= n, [AUTOSAVE_KEY, w0 + 4] as const, { timeout: 15000 }).catch(() => undefined);
    const doc = await savedDoc();
    expect(Object.keys(doc.wires).length).toBe(w0 + 4);
    console.log(`badge out before: ${JSON.stringify(before)} after: ${JSON.stringify(after)}`);
    // The new parts carry their defaults (10 kΩ, 1 pF, symbols/*.json). In shunt from out to
    // ground: |Z| becomes Z ∥ 10 kΩ and the node capacitance grows by 1 pF (Ohm's law and
    // parallel capacitors, common practice); badges show 3 digits, hence the 1 % margin.
    const zBefore = figure(before, 'Ω'), zAfter = figure(after, 'Ω');
    expect(zAfter / (1 / (1 / zBefore + 1 / 10e3)) - 1).toBeCloseTo(0, 2);
    expect(Math.abs(figure(after, 'F') - figure(before, 'F') - 1e-12)).toBeLessThan(0.02e-12);
    expect(errors).toEqual([]);
  });
  const CASCODE = 'Readout amplifier: regulated cascode current source';
  let zOutOn = NaN;
  async function setFrequency(text: string): Promise<void> {
    const field = page.getByLabel('Frequency of the node impedances');
    await field.fill(text);
    await field.press('Enter');
  }

  it('on the regulated cascode, switching the error amplifier loop off drops Rout and raises the held node', async () => {
    await page.getByRole('button', { name: /Drawing/ }).click();
    await page.getByRole('menuitem', { name: CASCODE }).click();
    await page.waitForFunction((t) => document.querySelector('.doc-title')?.textContent?.includes(t), CASCODE);
    await page.getByRole('tab', { name: /Nodes/ }).click();
    await page.waitForSelector('[data-testid="node-row"][data-node="x"]', { timeout: 30000 });
    await idle();
    const outOn = await nodeZ('out');
    // x is held at frequencies where Cout shorts the output (above 1/(2π·Rout·Cout) ≈ 17 kHz with
    // the loop off); at DC M2 carries no signal current and x's impedance is ro1 either way.
    const xDc = await nodeZ('x');
    await setFrequency('10M');
    const xOn = await changed(() => nodeZ('x'), xDc, 'node table |Z| of x at 10 MHz');
    await idle();
    await page.getByRole('tab', { name: /Loops/ }).click();
    const loop = page.locator('[data-testid="loop-item"]', { has: page.getByText(/A1/) }).first();
    await loop.waitFor({ timeout: 30000 });
    await shot('03-cascode-loops');
    console.log('loop holds:', await loop.locator('[data-testid="loop-holds"]').innerText());
    await loop.getByRole('switch').click();
    await page.getByRole('tab', { name: /Nodes/ }).click();
    const xOff = await changed(() => nodeZ('x'), xOn, 'node table |Z| of x at 10 MHz, loop off');
    await setFrequency('DC');
    await page.getByRole('columnheader', { name: '|Z| @ DC' }).waitFor({ timeout: 30000 });
    await idle();
    const outOff = await nodeZ('out');
    await shot('04-cascode-loop-off');
    const zOutOff = figure(outOff, 'Ω');
    console.log(`out at DC ${outOn} → ${outOff}; x at 10 MHz ${xOn} → ${xOff}`);
    zOutOn = figure(outOn, 'Ω');
    // Regulated (gain-boosted) cascode: the error amplifier raises Rout by about (1 + A), A = 100
    // here, and holds its sensed node x by the same factor at A(f) (Gray & Meyer; Sansen).
    expect(zOutOn / zOutOff).toBeGreaterThan(30);
    expect(zOutOn / zOutOff).toBeLessThan(300);
    expect(figure(xOff, 'Ω') / figure(xOn, 'Ω')).toBeGreaterThan(5);
    expect(errors).toEqual([]);
  });

  it('compare mode pins the loop-on result as A and shows loop-off as B', async () => {
    await page.getByRole('tab', { name: /Loops/ }).click();
    const offItem = page.locator('[data-testid="loop-item"].off').first();
    await offItem.getByRole('switch').click();
    await page.locator('[data-testid="loop-item"]', { has: page.getByText(/A1/) }).first().getByRole('switch', { checked: true }).waitFor({ timeout: 30000 });
    await idle();
    await page.getByRole('tab', { name: /Nodes/ }).click();
    expect(figure(await nodeZ('out'), 'Ω') / zOutOn - 1).toBeCloseTo(0, 2); // loop back on: same Rout as before
    await page.getByRole('tab', { name: /Loops/ }).click();
    await page.locator('[data-testid="loop-item"]', { has: page.getByText(/A1/) }).first().getByRole('button', { name: /Compare with it off/ }).click();
    const outRow = page.locator('[data-testid="cmp-node"][data-node="out"]');
    await outRow.waitFor({ timeout: 30000 });
    // first row of a node's pair: |Z| of A, of B, and the change
    const cell = (i: number) => `[data-testid="cmp-node"][data-node="out"] tr:first-child td:nth-of-type(${i + 1})`;
    await page.waitForFunction(([ca, cb]) => {
      const a = document.querySelector(ca)?.textContent;
      const b = document.querySelector(cb)?.textContent;
      return !!a && !!b && a !== b;
    }, [cell(0), cell(1)] as const, { timeout: 30000 });
    await idle();
    await shot('05-compare');
    const a = await page.locator(cell(0)).innerText();
    const b = await page.locator(cell(1)).innerText();
    console.log(`compare out: A ${a}, B ${b}`);
    // A is the loop-on figure seen in the node table, B the loop-off one, (1 + A) apart as above.
    expect(figure(a, 'Ω') / zOutOn - 1).toBeCloseTo(0, 2);
    expect(figure(a, 'Ω') / figure(b, 'Ω')).toBeGreaterThan(30);
    expect(errors).toEqual([]);
  });
  it('tidies the layout: parts move, the circuit and its figures stay the same', async () => {
    await page.getByRole('tab', { name: /Nodes/ }).click();
    await idle();
    const rowsBefore = await page.locator('[data-testid="node-row"]').allInnerTexts();
    const before = await savedDoc();
    await page.getByRole('button', { name: 'Tidy', exact: true }).click();
    // the app autosaves 400 ms after the change: wait for the stored parts to differ
    const partsText = await page.evaluate((k) => JSON.stringify(JSON.parse(localStorage.getItem(k)!).parts), AUTOSAVE_KEY);
    await page.waitForFunction(([k, t]) => JSON.stringify(JSON.parse(localStorage.getItem(k)!).parts) !== t, [AUTOSAVE_KEY, partsText] as const, { timeout: 30000 });
    const after = await savedDoc();
    const moved = Object.values(after.parts).filter((p) => { const b = before.parts[p.id]; return b && (b.x !== p.x || b.y !== p.y || b.rotation !== p.rotation); });
    console.log(`tidy moved ${moved.length} of ${Object.keys(after.parts).length} parts`);
    expect(moved.length).toBeGreaterThan(0);
    // same devices with the same values (a layout changes no part, common practice)
    const devices = (d: DrawingDocument) => Object.values(d.parts).filter((p) => !['ground', 'supply', 'netLabel'].includes(p.kind)).map((p) => `${p.ref}:${JSON.stringify(p.params)}`).sort();
    expect(devices(after)).toEqual(devices(before));
    await page.locator('.sheet-zoom').getByTitle('Fit drawing to view').click();
    await idle();
    await page.waitForFunction((want) => JSON.stringify(Array.from(document.querySelectorAll('[data-testid="node-row"]')).map((r) => (r as HTMLElement).innerText)) === want,
      JSON.stringify(rowsBefore), { timeout: 30000 });
    await shot('06-tidied');
    expect(await page.locator('[data-testid="node-row"]').allInnerTexts()).toEqual(rowsBefore);
    expect(errors).toEqual([]);
  });

  it('exports the annotated schematic as an SVG file', async () => {
    await page.getByRole('button', { name: /Drawing/ }).click();
    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: 30000 }),
      page.getByRole('menuitem', { name: /Export SVG/ }).click(),
    ]);
    const file = artifactPath('walk-export.svg');
    await download.saveAs(file);
    const text = readFileSync(file, 'utf8');
    expect(download.suggestedFilename()).toMatch(/\.svg$/);
    const { DOMParser } = await import('@xmldom/xmldom');
    const svg = new DOMParser().parseFromString(text, 'image/svg+xml');
    expect(svg.documentElement?.nodeName).toBe('svg'); // W3C SVG 1.1: root element
    const texts = Array.from(svg.getElementsByTagName('text')).map((t) => t.textContent ?? '');
    // the drawing's references and the output node's figure are in the file
    for (const ref of ['M1', 'M2', 'A1']) expect(texts.some((t) => t.includes(ref)), ref).toBe(true);
    expect(texts.some((t) => /out/.test(t)), 'out label').toBe(true);
    expect(texts.some((t) => /[\d.]+\s*[kMG]?Ω/.test(t)), 'an impedance figure').toBe(true);
  });

  it('after a reload the drawing is restored', async () => {
    const before = await savedDoc();
    const title = (await page.locator('.doc-title').innerText()).replace('●', ''); // ● marks unsaved changes
    await page.reload();
    await page.waitForSelector('[data-testid="analysis-overlay"] .ao-badge', { timeout: 30000 });
    await idle();
    await shot('07-reloaded');
    expect((await page.locator('.doc-title').innerText()).replace('●', '')).toBe(title);
    await page.getByText('Restored the drawing from your last session.').waitFor({ timeout: 10000 });
    const after = await savedDoc();
    expect(after.parts).toEqual(before.parts);
    expect(after.wires).toEqual(before.wires);
    expect(errors).toEqual([]);
  });
});
