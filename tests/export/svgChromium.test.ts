// The exported SVG rendered by headless Chromium: loaded as a standalone image file (an <img> only
// shows a self-contained, well-formed SVG document) and inline, where the drawn parts must fall
// inside the viewBox. Chromium comes from tests/browser/harness.ts (skipped with the install hint
// where it is missing).
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { annotatedSvg } from '../../src/export/exportDrawing';
import { bodeModel } from '../../src/plots/model/bodeModel';
import { bodeInputFrom } from '../../src/plots/fromEngine';
import { toSvg } from '../../src/plots/toSvg';
import { analyze } from '../../src/engine/index';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { exampleDrawing } from './fixtures';
import { browserSuite, launchBrowser } from '../browser/harness';

browserSuite('SVG export in headless Chromium', () => {
  let browser: Browser;
  beforeAll(async () => {
    ({ browser } = await launchBrowser());
  });
  afterAll(async () => { await browser?.close(); });

  it('loads the annotated schematic as a standalone image and draws every part inside the viewBox', async () => {
    const doc = await exampleDrawing('two-stage-miller-unity');
    const svg = annotatedSvg(doc, { date: '2026-01-15' });
    const page = await browser.newPage();
    const errors: string[] = [];
    page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
    const dataUrl = `data:image/svg+xml;base64,${Buffer.from(svg, 'utf8').toString('base64')}`;
    await page.setContent(`<img id="img" src="${dataUrl}">`);
    const size = await page.evaluate(async () => {
      const img = document.getElementById('img') as HTMLImageElement;
      await img.decode();
      return { w: img.naturalWidth, h: img.naturalHeight };
    });
    const vb = /viewBox="([^"]+)"/.exec(svg)![1].split(' ').map(Number);
    expect(size.w).toBe(Math.round(vb[2]));
    expect(size.h).toBe(Math.round(vb[3]));

    await page.setContent(svg.replace(/^<\?xml[^>]*>\s*/, ''));
    const r = await page.evaluate(() => {
      const root = document.querySelector('svg') as SVGSVGElement;
      const vbox = root.viewBox.baseVal;
      const parts = [...document.querySelectorAll('g.part')] as SVGGElement[];
      const outside = parts.filter((g) => {
        const b = g.getBBox();
        return b.x < vbox.x - 0.5 || b.y < vbox.y - 0.5 || b.x + b.width > vbox.x + vbox.width + 0.5 || b.y + b.height > vbox.y + vbox.height + 0.5;
      }).map((g) => g.id);
      const texts = [...document.querySelectorAll('text')].filter((t) => (t as SVGTextElement).getComputedTextLength() > 0).length;
      return { parts: parts.length, outside, texts, nets: document.querySelectorAll('g.net').length };
    });
    expect(r.parts).toBe(Object.keys(doc.parts).length);
    expect(r.outside).toEqual([]);
    expect(r.texts).toBeGreaterThan(10); // vector text laid out by the browser
    expect(r.nets).toBeGreaterThan(3);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('loads a Bode plot as a standalone image', async () => {
    const doc = await exampleDrawing('sensor-cs-miller');
    const res = analyze(documentToNetlist(doc).netlist!);
    const svg = toSvg(bodeModel(bodeInputFrom(res, 'sensor')!, { width: 480, height: 360 }));
    const page = await browser.newPage();
    await page.setContent(`<img id="img" src="data:image/svg+xml;base64,${Buffer.from(svg, 'utf8').toString('base64')}">`);
    const w = await page.evaluate(async () => { const img = document.getElementById('img') as HTMLImageElement; await img.decode(); return img.naturalWidth; });
    expect(w).toBe(480);
    await page.close();
  });
});
