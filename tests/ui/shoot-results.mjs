// Visual check of the results panels in headless Chromium (not a test; run by hand):
//   npx vite --config src/vite.config.ts --port 5191 --strictPort &   then   node tests/ui/shoot-results.mjs [url] [example ids…]
// Writes screenshots into tests/artifacts/results-*.png and prints console problems of the page.
import { chromium } from 'playwright-core';
import { mkdirSync } from 'node:fs';

const base = process.argv[2] || 'http://localhost:5191/tests/ui/harness/results.html';
const out = new URL('../artifacts/', import.meta.url).pathname;
mkdirSync(out, { recursive: true });
const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
});
const problems = [];
async function open(example) {
  const page = await browser.newPage({ viewport: { width: 900, height: 860 } });
  page.on('console', (m) => { if (m.type() === 'error' || m.type() === 'warning') problems.push(`${example}: ${m.type()}: ${m.text()}`); });
  page.on('pageerror', (e) => problems.push(`${example}: pageerror: ${e.message}`));
  await page.goto(`${base}?example=${example}`, { waitUntil: 'networkidle' });
  await page.waitForFunction(() => window.store?.getState().stage === 2, null, { timeout: 20000 });
  await page.waitForTimeout(200);
  return page;
}
const shot = (page, name) => page.locator('aside.side').screenshot({ path: `${out}results-${name}.png` });
const tab = (page, name) => page.getByRole('tab', { name, exact: false }).first().click();

const examples = process.argv.slice(3);
for (const ex of examples.length ? examples : ['two-stage-miller-unity', 'readout-cascode-regulated']) {
  const page = await open(ex);
  const short = ex.split('-').slice(0, 2).join('-');
  await shot(page, `${short}-poles`);
  await tab(page, 'Nodes');
  await page.locator('[data-testid=node-row]').first().click();
  await shot(page, `${short}-nodes`);
  await tab(page, 'Loops');
  await page.locator('.rp-loop-name').first().click();
  await shot(page, `${short}-loops`);
  await page.locator('.rp-tab .rp-plots, .rp-tab').first().waitFor();
  await tab(page, 'Plots');
  for (const k of ['Bode', 'Loop T', '|Z(f)|', 's-plane', 'Step']) {
    await page.getByRole('tab', { name: k, exact: true }).click();
    await page.waitForTimeout(k === 'Loop T' || k === 's-plane' ? 1500 : 200);
    await shot(page, `${short}-plot-${k.replace(/[^a-z-]/gi, '').toLowerCase() || 'z'}`);
  }
  await tab(page, 'Loops');
  await page.getByRole('switch').first().click();
  await page.waitForFunction(() => (window.store?.getState().stage === 2 || window.store?.getState().failure) && window.store.getState().settings.offLoopIds.length === 1, null, { timeout: 20000 });
  await shot(page, `${short}-loop-off`);
  await tab(page, 'A/B');
  await page.getByRole('button', { name: 'Pin as A' }).click();
  await tab(page, 'Loops');
  await page.getByRole('switch', { name: /off$/ }).first().click();
  await page.waitForFunction(() => (window.store?.getState().stage === 2 || window.store?.getState().failure) && window.store.getState().settings.offLoopIds.length === 0, null, { timeout: 20000 });
  await tab(page, 'A/B');
  await shot(page, `${short}-compare`);
  await tab(page, 'Plots');
  await page.getByRole('tab', { name: 's-plane', exact: true }).click();
  await page.waitForTimeout(1500);
  await shot(page, `${short}-compare-splane`);
  await page.getByRole('button', { name: 'Larger view' }).click();
  await page.waitForTimeout(300);
  await page.screenshot({ path: `${out}results-${short}-large.png` });
  await page.close();
}
await browser.close();
console.log(problems.length ? problems.join('\n') : 'no console problems');
