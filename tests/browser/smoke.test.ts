// Smoke test in real Chromium: the built app opens on its built-in example and draws on the canvas.
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { artifactPath, browserSuite, closeApp, openApp, type AppSession } from './harness';

browserSuite('app in Chromium', () => {
  let app: AppSession;
  let page: Page;
  let errors: string[] = [];
  beforeAll(async () => {
    app = await openApp();
    ({ page, errors } = app);
  });
  afterAll(() => closeApp(app));

  it('opens with a drawing on the canvas and no page errors', async () => {
    await page.waitForTimeout(500);
    await page.screenshot({ path: artifactPath('smoke.png') });
    // Count non-background pixels of the main canvas: an empty sheet would be (nearly) uniform.
    const inked = await page.evaluate(() => {
      const canvases = Array.from(document.querySelectorAll('canvas'));
      let count = 0;
      for (const c of canvases) {
        const ctx = c.getContext('2d');
        if (!ctx || c.width === 0) continue;
        const d = ctx.getImageData(0, 0, c.width, c.height).data;
        for (let i = 0; i < d.length; i += 16) if (d[i + 3] > 0 && (d[i] < 200 || d[i + 1] < 200 || d[i + 2] < 200)) count++;
      }
      return count;
    });
    expect(errors).toEqual([]);
    expect(inked).toBeGreaterThan(500);
  });
});
