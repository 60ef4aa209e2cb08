// The browser path of the tidy: elkjs in a web worker (src/layout/elkWorker.ts), served by Vite's
// dev server and run in headless Chromium; the tidied drawing must keep its netlist, as in node.
// Chromium comes from tests/browser/harness.ts (skipped with the install hint where it is missing).
import { join } from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import type { ViteDevServer } from 'vite';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import type { DrawingDocument } from '../../src/schematic/document';
import { exampleDrawing } from '../export/fixtures';
import { browserSuite, launchBrowser, ROOT } from '../browser/harness';

browserSuite('tidy with ELK in a web worker (headless Chromium)', () => {
  let server: ViteDevServer;
  let browser: Browser;
  let url = '';
  beforeAll(async () => {
    // the dev server (not the shared build): the test imports the layout modules by source path
    const { createServer } = await import('vite');
    server = await createServer({ configFile: join(ROOT, 'src', 'vite.config.ts'), logLevel: 'error', server: { port: 0, host: '127.0.0.1', strictPort: false, hmr: false } });
    await server.listen();
    url = server.resolvedUrls!.local[0];
    ({ browser } = await launchBrowser());
  });
  afterAll(async () => { await browser?.close(); await server?.close(); });

  it('lays out in the worker and keeps the netlist', async () => {
    const doc = await exampleDrawing('readout-cascode-source');
    const page = await browser.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(url);
    // Passed as source text: the test runner would otherwise rewrite the dynamic imports.
    const out = (await page.evaluate(`(async () => {
      const w = await import('/src/layout/elkWorker.ts');
      const t = await import('/src/layout/tidy.ts');
      const r = await t.tidyDocument(${JSON.stringify(doc)}, w.workerElk());
      return { status: r.status, message: r.message, doc: r.doc };
    })()`)) as { status: string; message: string; doc: unknown };
    expect(out.message).toMatch(/Tidied/);
    expect(out.status).toBe('ok');
    expect(documentToNetlist(out.doc as DrawingDocument).netlist).toEqual(documentToNetlist(doc).netlist);
    expect(errors).toEqual([]);
    await page.close();
  });
});
