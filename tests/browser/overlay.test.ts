// The analysis overlay in real Chromium on an invented 30-part drawing: badges readable and clear
// of every symbol body, the loop path drawn when a loop is selected, nets lit from the poles list.
// Screenshots go to tests/artifacts/overlay-*.png for a look by eye.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { artifactPath, browserSuite, closeApp, openApp, type AppSession } from './harness';
import { loadDrawing } from '../../src/schematic/file';
import { placedBounds } from '../../src/schematic/symbols';

const DRAWING = fileURLToPath(new URL('./fixtures/thirty-parts.drawing.json', import.meta.url));

interface R { x: number; y: number; width: number; height: number }
const overlapArea = (a: R, b: R) => Math.max(0, Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x)) * Math.max(0, Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y));

browserSuite('analysis overlay in Chromium', () => {
  let app: AppSession;
  let page: Page;
  let errors: string[] = [];
  const text = readFileSync(DRAWING, 'utf8');
  const loaded = loadDrawing(JSON.parse(text));
  if (!loaded.ok) throw new Error(loaded.reason);
  const doc = loaded.doc;

  const symbolRects = (cam: { scale: number; x: number; y: number }) => Object.values(doc.parts).map((p) => {
    const b = placedBounds(p);
    return { ref: p.ref, x: b.x * cam.scale + cam.x, y: b.y * cam.scale + cam.y, width: b.width * cam.scale, height: b.height * cam.scale };
  });

  beforeAll(async () => {
    app = await openApp();
    ({ page, errors } = app);
    await page.setInputFiles('[data-testid="file-input"]', { name: 'thirty-parts.json', mimeType: 'application/json', buffer: Buffer.from(text) });
    await page.locator('.sheet-zoom').getByTitle('Fit drawing to view').click();
    await page.waitForSelector('[data-testid="analysis-overlay"] .ao-badge, [data-testid="analysis-overlay"] .ao-dot', { timeout: 30000 });
    await page.waitForFunction(() => !document.querySelector('.ao-busy'), undefined, { timeout: 30000 });
    await page.waitForTimeout(300);
  });
  afterAll(() => closeApp(app));

  it('fitted to the view every net is marked (badge or dot), no badge on a symbol', async () => {
    await page.screenshot({ path: artifactPath('overlay-30-dc.png') });
    const info = await overlayInfo(page);
    const { cam } = info;
    const bodies = symbolRects(cam);
    const onSymbols = info.badges.flatMap((b) => bodies.filter((s) => overlapArea(b, s) > 1).map((s) => `${b.net} on ${s.ref}`));
    const onBadges = info.badges.flatMap((a, i) => info.badges.slice(i + 1).filter((b) => overlapArea(a, b) > 1).map((b) => `${a.net} on ${b.net}`));
    console.log(`badges ${info.badges.length}, collapsed ${info.dots}, scale ${cam.scale.toFixed(2)}, font ${info.badges[0]?.font}px`, onSymbols, onBadges);
    expect(info.badges.length + info.dots).toBeGreaterThan(8);
    // the runs went to the Web Worker, not the same-thread fallback
    expect(await page.getAttribute('[data-testid="analysis-overlay"]', 'data-runner')).toBe('worker');
    // readable: text at least 8 px (common practice for dense annotation)
    for (const b of info.badges) expect(b.font).toBeGreaterThanOrEqual(8);
    expect(onSymbols).toEqual([]);
    expect(onBadges).toEqual([]);
    expect(errors).toEqual([]);
  });

  it('zoomed in to a readable size, the badges show their figures clear of the symbols', async () => {
    for (let i = 0; i < 12 && (await cameraScale(page)) < 1.3; i++) await page.locator('.sheet-zoom').getByTitle('Zoom in').click();
    // centre the view on the slowest node by dragging the sheet (middle button pans)
    const box = (await page.locator('[data-testid="sheet"]').boundingBox())!;
    const ring = await page.evaluate(() => {
      const el = document.querySelector('.ao-badge.slowest, .ao-dot.slowest') as HTMLElement | null;
      const r = el?.getBoundingClientRect();
      return r ? { x: r.left + r.width / 2, y: r.top + r.height / 2 } : null;
    });
    if (ring) {
      await page.mouse.move(ring.x, ring.y);
      await page.mouse.down({ button: 'middle' });
      await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2, { steps: 8 });
      await page.mouse.up({ button: 'middle' });
    }
    await page.waitForTimeout(300);
    await page.screenshot({ path: artifactPath('overlay-30-zoomed.png') });
    const info = await overlayInfo(page);
    const bodies = symbolRects(info.cam);
    const shown = info.badges.filter((b) => b.x + b.width > 0 && b.y + b.height > 0 && b.x < box.width && b.y < box.height);
    console.log(`zoomed: scale ${info.cam.scale.toFixed(2)}, badges on screen ${shown.length}, font ${shown[0]?.font}px`);
    expect(shown.length).toBeGreaterThan(2);
    for (const b of shown) expect(b.font).toBeGreaterThanOrEqual(8); // common practice: ≥ 8 px text
    expect(shown.flatMap((b) => bodies.filter((s) => overlapArea(b, s) > 1).map((s) => `${b.net} on ${s.ref}`))).toEqual([]);
    expect(shown.flatMap((a, i) => shown.slice(i + 1).filter((b) => overlapArea(a, b) > 1).map((b) => `${a.net} on ${b.net}`))).toEqual([]);
    await page.locator('.sheet-zoom').getByTitle('Fit drawing to view').click();
  });

  it('selecting a loop draws its path; hovering a pole lights its nets', async () => {
    await page.getByRole('tab', { name: /Loops/ }).click();
    await page.locator('.rp-loop-name').first().click();
    await page.waitForTimeout(300);
    await page.screenshot({ path: artifactPath('overlay-30-loop.png') });
    const loopPixels = await countColour(page, [0xb0, 0x17, 0x7a]);
    expect(loopPixels).toBeGreaterThan(50);
    await page.locator('.rp-loop-name').first().click(); // deselect
    await page.getByRole('tab', { name: /Poles/ }).click();
    await page.locator('[data-testid="pole-row"]').first().hover();
    await page.waitForTimeout(300);
    await page.screenshot({ path: artifactPath('overlay-30-pole-lit.png') });
    expect(await page.locator('.ao-badge.lit, .ao-dot.lit').count()).toBeGreaterThan(0);
    await page.getByRole('radio', { name: 'τ' }).click();
    await page.waitForTimeout(200);
    await page.screenshot({ path: artifactPath('overlay-30-tau.png') });
    expect(await page.getByTestId('analysis-legend').textContent()).toMatch(/time constant/);
    expect(errors).toEqual([]);
  });

  it('a structural error shows its message at the fault instead of the marks', async () => {
    const broken = JSON.parse(text);
    // leave Rf2's lower pin open: its ground symbol removed
    const gnd = Object.values(doc.parts).filter((p) => p.kind === 'ground')
      .find((g) => { const r = doc.parts['part:rf2' as never] ?? Object.values(doc.parts).find((p) => p.ref === 'Rf2')!; return Math.abs(g.x - r.x) <= 10 && g.y > r.y; });
    expect(gnd).toBeTruthy();
    delete broken.parts[gnd!.id];
    await page.setInputFiles('[data-testid="file-input"]', { name: 'broken.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(broken)) });
    await page.waitForSelector('[data-testid="analysis-faults"] .ao-fault', { timeout: 30000 });
    await page.waitForTimeout(200);
    await page.screenshot({ path: artifactPath('overlay-30-fault.png') });
    expect(await page.locator('[data-testid="analysis-overlay"]').count()).toBe(0);
    expect(await page.locator('.ao-fault').first().textContent()).toMatch(/\w{4}/);
    expect(errors).toEqual([]);
  });
});

/** Canvas pixels within ±24 of an RGB colour (sampled every 4th pixel). */
function countColour(page: Page, rgb: [number, number, number]): Promise<number> {
  return page.evaluate((c) => {
    let n = 0;
    for (const cv of Array.from(document.querySelectorAll('canvas'))) {
      const ctx = cv.getContext('2d');
      if (!ctx || cv.width === 0) continue;
      const d = ctx.getImageData(0, 0, cv.width, cv.height).data;
      for (let i = 0; i < d.length; i += 16) if (Math.abs(d[i] - c[0]) < 24 && Math.abs(d[i + 1] - c[1]) < 24 && Math.abs(d[i + 2] - c[2]) < 24 && d[i + 3] > 200) n++;
    }
    return n;
  }, rgb);
}

async function cameraScale(page: Page): Promise<number> {
  return (await overlayInfo(page)).cam.scale;
}

/** Camera of the overlay and the screen boxes (relative to the sheet) of the text badges. */
function overlayInfo(page: Page) {
  return page.evaluate(() => {
    const root = document.querySelector('[data-testid="analysis-overlay"]') as HTMLElement;
    const o = root.getBoundingClientRect();
    const [scale, x, y] = (root.dataset.camera ?? '1,0,0').split(',').map(Number);
    const badges = Array.from(root.querySelectorAll('.ao-badge')).map((el) => {
      const r = el.getBoundingClientRect();
      return { net: (el as HTMLElement).dataset.net!, x: r.left - o.left, y: r.top - o.top, width: r.width, height: r.height, font: parseFloat(getComputedStyle(el).fontSize) };
    });
    return { cam: { scale, x, y }, badges, dots: root.querySelectorAll('.ao-dot').length };
  });
}
