// Visual check in headless Chromium (not a test; run by hand):
//   npx vite --config src/vite.config.ts --port 5190 &   then   node tests/ui/shoot.mjs [url]
// Writes screenshots into tests/artifacts/ (git-ignored) and prints console errors of the page.
import { chromium } from 'playwright-core';
import { mkdirSync } from 'node:fs';

const url = process.argv[2] ?? 'http://localhost:5190/';
const out = new URL('../artifacts/', import.meta.url).pathname;
mkdirSync(out, { recursive: true });

const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
});
const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
const problems = [];
page.on('console', (m) => { if (m.type() === 'error' || m.type() === 'warning') problems.push(`${m.type()}: ${m.text()}`); });
page.on('pageerror', (e) => problems.push(`pageerror: ${e.message}`));
await page.goto(url, { waitUntil: 'networkidle' });
try {
  await page.waitForSelector('.sheet canvas', { timeout: 8000 });
} catch (e) {
  await page.screenshot({ path: `${out}ui-00-failed.png` });
  console.log(problems.join('\n'));
  throw e;
}
await page.waitForTimeout(400);
await page.screenshot({ path: `${out}ui-01-start.png` });

const sheet = await page.locator('.sheet').boundingBox();
const at = (fx, fy) => ({ x: sheet.x + sheet.width * fx, y: sheet.y + sheet.height * fy });

// Place a resistor from the shelf, turn it while placing.
await page.getByRole('button', { name: 'Place Resistor' }).click();
let p = at(0.2, 0.25);
await page.mouse.move(p.x, p.y);
await page.keyboard.press('t');
await page.mouse.move(p.x + 3, p.y + 3);
await page.screenshot({ path: `${out}ui-02-ghost.png` });
await page.mouse.click(p.x + 3, p.y + 3);
await page.keyboard.press('Escape');
await page.waitForTimeout(100);
await page.screenshot({ path: `${out}ui-03-placed.png` });

// Draw a wire.
await page.keyboard.press('c');
const a = at(0.15, 0.6), b = at(0.35, 0.75);
await page.mouse.click(a.x, a.y);
await page.mouse.move(b.x, b.y);
await page.screenshot({ path: `${out}ui-04-wire.png` });
await page.mouse.dblclick(b.x, b.y);
await page.keyboard.press('Escape');

// Rubber band.
const c = at(0.05, 0.1), d = at(0.45, 0.9);
await page.mouse.move(c.x, c.y);
await page.mouse.down();
await page.mouse.move(d.x, d.y, { steps: 5 });
await page.screenshot({ path: `${out}ui-05-band.png` });
await page.mouse.up();

// Zoom at a point with the wheel, then fit.
await page.mouse.move(at(0.5, 0.5).x, at(0.5, 0.5).y);
await page.mouse.wheel(0, -400);
await page.waitForTimeout(100);
await page.screenshot({ path: `${out}ui-06-zoomed.png` });
await page.keyboard.press('h');
await page.waitForTimeout(100);
await page.screenshot({ path: `${out}ui-06b-fit.png` });

// Help overlay.
await page.keyboard.press('?');
await page.waitForTimeout(100);
await page.screenshot({ path: `${out}ui-07-help.png` });
await page.keyboard.press('Escape');

await page.getByRole('button', { name: /Drawing/ }).click();
await page.screenshot({ path: `${out}ui-08-menu.png` });

console.log(problems.length ? problems.join('\n') : 'no console errors');
await browser.close();
