// Browser-test harness: builds the app once, serves it on localhost and drives Debian's Chromium
// with playwright-core (never a downloaded browser). Where Chromium is missing the suites using
// `browserSuite` report themselves skipped with the install hint.
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const ARTIFACTS = join(ROOT, 'tests', 'artifacts');
export const CHROMIUM = process.env.CHROMIUM_PATH || '/usr/bin/chromium';
export const HAVE_CHROMIUM = existsSync(CHROMIUM);
export const INSTALL_HINT =
  'browser tests skipped: Chromium not found at ' + CHROMIUM +
  ' (install it with `apt-get install -y chromium`, or set CHROMIUM_PATH)';

/** `describe` that skips, with the install hint in its title, where Chromium is missing. */
export function browserSuite(name: string, body: () => void): void {
  if (HAVE_CHROMIUM) describe(name, body);
  else describe.skip(`${name} — ${INSTALL_HINT}`, body);
}

export interface Served { url: string; close(): Promise<void> }

/** Build the app once per test run (shared by every browser test file: vitest's forked workers
 *  share the parent's pid, so the first one builds under a lock and the others wait), then serve it
 *  with Vite's preview server on a free port. */
export async function buildAndServe(opts: { minify?: boolean } = {}): Promise<Served> {
  const { preview } = await import('vite');
  const configFile = join(ROOT, 'src', 'vite.config.ts');
  const outDir = await sharedBuild(configFile, opts.minify ?? true);
  const server = await preview({
    configFile,
    logLevel: 'error',
    build: { outDir },
    preview: { port: 0, host: '127.0.0.1', strictPort: false },
  });
  const url = server.resolvedUrls?.local[0] ?? `http://127.0.0.1:${(server.httpServer.address() as { port: number }).port}/`;
  return { url, close: () => new Promise<void>((r) => server.httpServer.close(() => r())) };
}

/** `minify: false` builds a separate copy with readable function names (for CPU profiles). */
async function sharedBuild(configFile: string, minify: boolean): Promise<string> {
  const outDir = join(tmpdir(), `polesketch-build-${process.ppid}${minify ? '' : '-plain'}`);
  const done = join(outDir, '.built');
  const lock = `${outDir}.lock`;
  let mine = false;
  try { mkdirSync(lock); mine = true; } catch { /* another worker builds */ }
  if (mine) {
    const { build } = await import('vite');
    await build({ configFile, logLevel: 'error', build: { outDir, emptyOutDir: true, ...(minify ? {} : { minify: false }) } });
    writeFileSync(done, new Date().toISOString());
    return outDir;
  }
  for (let waited = 0; !existsSync(done); waited += 250) {
    if (waited > 240_000) throw new Error(`timed out waiting for the shared build in ${outDir}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return outDir;
}

// playwright gives every launch a fresh temporary profile (user-data dir).
export async function launchBrowser(): Promise<{ browser: Browser; context: BrowserContext; page: Page }> {
  const { chromium } = await import('playwright-core');
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic',
    ],
  });
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, acceptDownloads: true });
  const page = await context.newPage();
  return { browser, context, page };
}

/** The app built, served and open in a page (canvas drawn), with the page's uncaught errors. */
export interface AppSession { served: Served; browser: Browser; page: Page; errors: string[] }

export async function openApp(): Promise<AppSession> {
  const served = await buildAndServe();
  const { browser, page } = await launchBrowser();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(String(e)));
  await page.goto(served.url);
  await page.waitForSelector('canvas', { timeout: 20000 });
  return { served, browser, page, errors };
}

export async function closeApp(app: AppSession | undefined): Promise<void> {
  await app?.browser.close();
  await app?.served.close();
}

export function artifactPath(name: string): string {
  mkdirSync(ARTIFACTS, { recursive: true });
  return join(ARTIFACTS, name);
}
