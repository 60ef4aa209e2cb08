// Visual check (not a test; run by hand) after render-samples.ts:
//   node tests/plots/shoot-plots.mjs "$PWD/tests/artifacts/plots/" [name-filter]
// Screenshots every SVG in the folder with headless Chromium (CHROMIUM_PATH, default /usr/bin/chromium).
import { chromium } from 'playwright-core';
import { readdirSync } from 'node:fs';
const dir = process.argv[2];
const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const page = await browser.newPage({ viewport: { width: 660, height: 500 } });
for (const f of readdirSync(dir).filter((x) => x.endsWith('.svg') && (process.argv[3] ? x.includes(process.argv[3]) : true))) {
  await page.goto('file://' + dir + f);
  await page.screenshot({ path: dir + f.replace('.svg', '.png') });
}
await browser.close();
