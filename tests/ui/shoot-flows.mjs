// Browser flows in headless Chromium (not a test; run by hand against a dev server, see shoot.mjs):
// inspector editing, drag from the shelf, copy in one tab and paste in another, autosave + reload.
import { chromium } from 'playwright-core';
import { mkdirSync } from 'node:fs';

const url = process.argv[2] ?? 'http://localhost:5190/';
const out = new URL('../artifacts/', import.meta.url).pathname;
mkdirSync(out, { recursive: true });
const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
});
const context = await browser.newContext({ viewport: { width: 1400, height: 860 } });
const problems = [];
const watch = (page, name) => {
  page.on('console', (m) => { if (m.type() === 'error' || m.type() === 'warning') problems.push(`${name} ${m.type()}: ${m.text()}`); });
  page.on('pageerror', (e) => problems.push(`${name} pageerror: ${e.message}`));
};
const a = await context.newPage();
watch(a, 'A');
await a.goto(url, { waitUntil: 'networkidle' });
await a.evaluate(() => localStorage.clear());
await a.reload({ waitUntil: 'networkidle' });
await a.waitForSelector('.sheet canvas');
const sheet = await a.locator('.sheet').boundingBox();
const at = (fx, fy) => ({ x: sheet.x + sheet.width * fx, y: sheet.y + sheet.height * fy });
const report = {};

// New drawing, place a resistor by dragging from the shelf.
await a.getByRole('button', { name: /Drawing/ }).click();
await a.getByRole('menuitem', { name: 'New empty drawing' }).click();
const drop = at(0.4, 0.4);
await a.getByRole('button', { name: 'Place Resistor' }).dragTo(a.locator('.sheet'), { targetPosition: { x: drop.x - sheet.x, y: drop.y - sheet.y } });
await a.waitForTimeout(100);
report.afterDrag = await a.locator('.status').textContent();
report.modeAfterDrag = await a.locator('.status .mode').textContent();

// Click it, edit its value in the inspector.
await a.mouse.click(drop.x, drop.y);
await a.waitForTimeout(100);
const field = a.getByLabel(/Resistance/);
report.inspectorShown = await field.count();
if (report.inspectorShown) {
  await field.fill('4.7kx');
  await a.screenshot({ path: `${out}flow-01-bad-value.png` });
  await field.fill('4.7k');
  await field.press('Enter');
}
await a.screenshot({ path: `${out}flow-02-applied.png` });

// Copy in tab A, paste in tab B.
await a.locator('.sheet').click({ position: { x: drop.x - sheet.x, y: drop.y - sheet.y } });
await a.keyboard.press('Control+c');
const b = await context.newPage();
watch(b, 'B');
await b.goto(url, { waitUntil: 'networkidle' });
await b.waitForSelector('.sheet canvas');
await b.waitForTimeout(600);
report.bRestoredTitle = await b.locator('.doc-title').textContent();
await b.getByRole('button', { name: /Drawing/ }).click();
await b.getByRole('menuitem', { name: 'New empty drawing' }).click();
await b.mouse.move(at(0.6, 0.6).x, at(0.6, 0.6).y);
await b.keyboard.press('Control+v');
await b.waitForTimeout(200);
report.bAfterPaste = await b.evaluate(() => document.querySelector('.status')?.textContent);
await b.screenshot({ path: `${out}flow-03-pasted-in-b.png` });

// Autosave + reload in A keeps the edited drawing.
await a.bringToFront();
await a.waitForTimeout(600);
await a.reload({ waitUntil: 'networkidle' });
await a.waitForSelector('.sheet canvas');
await a.waitForTimeout(300);
report.aAfterReload = await a.locator('.status').textContent();
await a.screenshot({ path: `${out}flow-04-reloaded.png` });

console.log(JSON.stringify(report, null, 1));
console.log(problems.length ? problems.join('\n') : 'no console errors');
await browser.close();
