// Browser bench (not a test, never asserts): time from an edit to the updated analysis overlay in
// Chromium, on an invented drawing of 60 MNA unknowns. Run: `npx tsx tests/bench/browser-bench.ts`.
// Method: build the app, serve it (tests/browser/harness.ts), open the drawing, change one
// resistor's value in the property panel, then alternate the top bar's Undo / Redo. Each click
// stamps performance.now() in the page (capture listener, before the app sees it); a
// MutationObserver stamps the first change of the overlay's badge texts/titles, and the next
// requestAnimationFrame stamps the frame that shows it. The app's own performance measures
// ("ps:" names, src/live/perfMarks.ts) split each edit into netlist, worker, annotate and paint.
import { readFileSync, writeFileSync } from 'node:fs';
import { netlistToDrawing } from '../../src/layout/importNetlist';
import { nodeElk } from '../../src/layout/elkNode';
import { saveDrawing } from '../../src/schematic/file';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { analyze } from '../../src/engine/index';
import { placedBounds } from '../../src/schematic/symbols';
import { artifactPath, buildAndServe, HAVE_CHROMIUM, INSTALL_HINT, launchBrowser } from '../browser/harness';

const EDITS = Number(process.env.BENCH_EDITS ?? 16);
/** BENCH_PROFILE=1: an unminified build and a CPU profile of the page's main thread over the
 *  edits (Chrome DevTools Protocol), summarised as the functions with the most self time. */
const PROFILE = process.env.BENCH_PROFILE === '1';
/** BENCH_TRACE=<file>: a Chromium performance trace of the edits (open it in the browser's
 *  performance panel); the main thread's time per event kind is summarised. */
const TRACE = process.env.BENCH_TRACE ?? '';

/** Invented chain: 19 common-source stages, each loaded by R and followed by a two-section RC. */
function chainNetlist(stages: number) {
  const parts: unknown[] = [
    { name: 'Vin', kind: 'vsource', pins: { p: 'in', n: '0' }, values: {} },
    { name: 'Rs', kind: 'resistor', pins: { p: 'in', n: 'g1' }, values: { value: '1k' } },
  ];
  let gate = 'g1';
  for (let k = 1; k <= stages; k++) {
    const d = `d${k}`, a = `a${k}`, b = `b${k}`;
    parts.push(
      { name: `M${k}`, kind: 'nmos', pins: { d, g: gate, s: '0', b: '0' }, values: { id: '50u', gmid: '12', w: '10u', l: '0.5u' } },
      { name: `RL${k}`, kind: 'resistor', pins: { p: d, n: '0' }, values: { value: '20k' } },
      { name: `RA${k}`, kind: 'resistor', pins: { p: d, n: a }, values: { value: '5k' } },
      { name: `CA${k}`, kind: 'capacitor', pins: { p: a, n: '0' }, values: { value: '50f' } },
      { name: `RB${k}`, kind: 'resistor', pins: { p: a, n: b }, values: { value: '5k' } },
      { name: `CB${k}`, kind: 'capacitor', pins: { p: b, n: '0' }, values: { value: '80f' } },
    );
    gate = b;
  }
  return {
    format: 'polesketch-netlist', version: 1, title: 'Invented bench chain of common-source stages with RC sections',
    process: 'demo180-invented', input: 'Vin', output: { kind: 'voltage', node: gate }, parts,
  };
}

interface Stamp { draws0: { fillText: number; stroke: number }; draws: { fillText: number; stroke: number }; t0: number; t1: number; t2: number; snap: string; measures: { name: string; start: number; ms: number }[]; longTasks: { start: number; ms: number }[] }

const med = (v: number[]) => { const s = [...v].sort((a, b) => a - b); return s.length ? s[Math.floor(s.length / 2)] : NaN; };
const fmt = (v: number) => (Number.isFinite(v) ? v.toFixed(1) : '—');

async function main() {
  if (!HAVE_CHROMIUM) { console.log(INSTALL_HINT); return; }
  const imported = await netlistToDrawing(chainNetlist(19), nodeElk());
  if (!imported.ok) { console.log('bench drawing could not be made:', imported.messages.join('; ')); return; }
  const doc = imported.doc;
  const engineCheck = analyze(documentToNetlist(doc).netlist!);
  const unknowns = engineCheck.unknowns.nodes + engineCheck.unknowns.branches;
  console.log(`drawing: ${Object.keys(doc.parts).length} parts, ${unknowns} MNA unknowns (${engineCheck.unknowns.nodes} nodes + ${engineCheck.unknowns.branches} branches)`);

  const served = await buildAndServe({ minify: !PROFILE });
  const { browser, page } = await launchBrowser();
  try {
    // tsx keeps function names with a helper the page lacks; the flag turns on the app's ps: measures
    await page.addInitScript('window.__name = (f) => f; window.POLESKETCH_PERF = true;');
    // count the canvas text and stroke calls (how much of the drawing is redrawn per edit)
    await page.addInitScript(`(() => {
      const c = window.__draws = { fillText: 0, stroke: 0 };
      const P = CanvasRenderingContext2D.prototype;
      for (const k of ['fillText', 'stroke']) { const f = P[k]; P[k] = function (...a) { c[k]++; return f.apply(this, a); }; }
    })()`);
    await page.goto(served.url);
    await page.waitForSelector('canvas', { timeout: 20000 });
    await page.setInputFiles('[data-testid="file-input"]', { name: 'bench.json', mimeType: 'application/json', buffer: Buffer.from(saveDrawing(doc)) });
    await page.waitForFunction(() => document.querySelector('.doc-title')?.textContent?.includes('bench chain'), undefined, { timeout: 30000 });
    await page.waitForSelector('[data-testid="analysis-overlay"] .ao-badge, [data-testid="analysis-overlay"] .ao-dot', { timeout: 60000 });
    await page.waitForFunction(() => !document.querySelector('.ao-busy'), undefined, { timeout: 60000 });
    console.log('runner:', await page.getAttribute('[data-testid="analysis-overlay"]', 'data-runner'));

    // select RL10 by clicking its body, then give it a new value: the first edit on the history
    const cam = (await page.getAttribute('[data-testid="analysis-overlay"]', 'data-camera'))!.split(',').map(Number);
    const box = (await page.locator('[data-testid="sheet"]').boundingBox())!;
    const rl = Object.values(doc.parts).find((p) => p.ref === 'RL10')!;
    const bb = placedBounds(rl);
    await page.mouse.click(box.x + (bb.x + bb.width / 2) * cam[0] + cam[1], box.y + (bb.y + bb.height / 2) * cam[0] + cam[2]);
    const field = page.getByLabel(/Resistance/);
    await field.fill('7k');
    await field.press('Enter');
    await page.locator('.sheet').focus();
    await page.waitForFunction(() => !document.querySelector('.ao-busy'), undefined, { timeout: 60000 });

    await page.evaluate(() => {
      const w = window as unknown as { __bench: Stamp };
      const snap = () => {
        const root = document.querySelector('[data-testid="analysis-overlay"]');
        if (!root) return '';
        return Array.from(root.querySelectorAll('.ao-badge, .ao-dot')).map((e) => (e as HTMLElement).innerText + '|' + (e.getAttribute('title') ?? '')).join('\n');
      };
      const draws = (w as unknown as { __draws: { fillText: number; stroke: number } }).__draws;
      w.__bench = { t0: 0, t1: 0, t2: 0, snap: snap(), measures: [], longTasks: [], draws0: { ...draws }, draws: { ...draws } };
      // main-thread tasks over 50 ms (Long Tasks API): where the page could not answer input
      const long: { start: number; ms: number }[] = [];
      try {
        new PerformanceObserver((list) => { for (const e of list.getEntries()) long.push({ start: e.startTime, ms: e.duration }); }).observe({ type: 'longtask', buffered: false });
      } catch { /* no Long Tasks API */ }
      (w as unknown as { __long: typeof long }).__long = long;
      window.addEventListener('click', () => {
        performance.clearMeasures();
        w.__bench.t0 = performance.now(); w.__bench.t1 = 0; w.__bench.t2 = 0; w.__bench.snap = snap(); w.__bench.draws0 = { ...draws };
      }, true);
      new MutationObserver(() => {
        const b = w.__bench;
        if (!b.t0 || b.t1) return;
        const s = snap();
        if (s && s !== b.snap) {
          b.t1 = performance.now();
          requestAnimationFrame(() => {
            b.t2 = performance.now();
            b.draws = { ...draws };
            b.measures = performance.getEntriesByType('measure').filter((m) => m.name.startsWith('ps:')).map((m) => ({ name: m.name, start: m.startTime - b.t0, ms: m.duration }));
            b.longTasks = (w as unknown as { __long: { start: number; ms: number }[] }).__long.filter((t) => t.start + t.ms >= b.t0 && t.start <= b.t2).map((t) => ({ start: t.start - b.t0, ms: t.ms }));
          });
        }
      }).observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true, attributeFilter: ['title'] });
    });

    const cdp = PROFILE ? await page.context().newCDPSession(page) : null;
    if (cdp) {
      await cdp.send('Profiler.enable');
      await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
      await cdp.send('Profiler.start');
    }
    if (TRACE) await browser.startTracing(page, { path: TRACE, categories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'v8.execute', 'blink.user_timing'] });
    const toOverlay: number[] = [], toFrame: number[] = [];
    const split = new Map<string, number[]>();
    const offsets = new Map<string, number[]>();
    const longSum: number[] = [];
    const texts: number[] = [], strokes: number[] = [];
    for (let i = 0; i < EDITS; i++) {
      await page.getByRole('button', { name: i % 2 === 0 ? 'Undo' : 'Redo', exact: true }).click();
      try {
        await page.waitForFunction(() => (window as unknown as { __bench: Stamp }).__bench.t2 > 0, undefined, { timeout: 60000 });
      } catch (e) {
        await page.screenshot({ path: artifactPath('bench-timeout.png') });
        throw e;
      }
      const t = await page.evaluate(() => (window as unknown as { __bench: Stamp }).__bench);
      toOverlay.push(t.t1 - t.t0);
      toFrame.push(t.t2 - t.t0);
      // per edit: sum of each measure's durations that started after the click
      const sums = new Map<string, number>();
      for (const m of t.measures) {
        if (m.start < -1) continue; // measures of earlier edits (a worker duration may start a hair early)
        sums.set(m.name, (sums.get(m.name) ?? 0) + m.ms);
        if (!offsets.has(m.name) || offsets.get(m.name)!.length < toFrame.length) offsets.set(m.name, [...(offsets.get(m.name) ?? []), m.start]);
      }
      for (const [name, ms] of sums) split.set(name, [...(split.get(name) ?? []), ms]);
      longSum.push(t.longTasks.reduce((s2, x) => s2 + x.ms, 0));
      texts.push(t.draws.fillText - t.draws0.fillText);
      strokes.push(t.draws.stroke - t.draws0.stroke);
      // the feedback stage must not overlap the next click's clock
      await page.waitForFunction(() => !document.querySelector('.ao-busy'), undefined, { timeout: 60000 });
    }
    if (TRACE) { await browser.stopTracing(); printTrace(TRACE, EDITS); }
    if (cdp) {
      const prof = (await cdp.send('Profiler.stop')).profile as CpuProfile;
      printProfile(prof);
      if (process.env.BENCH_PROFILE_OUT) writeFileSync(process.env.BENCH_PROFILE_OUT, JSON.stringify(prof));
    }
    // a look by eye at the overlay after the edits (zoomed in to a readable size)
    for (let i = 0; i < 4; i++) await page.locator('.sheet-zoom').getByTitle('Zoom in').click();
    await page.waitForTimeout(300);
    await page.screenshot({ path: artifactPath('bench-overlay.png') });
    console.log(`edit → overlay DOM updated: median ${fmt(med(toOverlay))} ms (min ${fmt(Math.min(...toOverlay))}, max ${fmt(Math.max(...toOverlay))}) over ${EDITS} undo/redo clicks`);
    console.log(`edit → frame showing it:   median ${fmt(med(toFrame))} ms (min ${fmt(Math.min(...toFrame))}, max ${fmt(Math.max(...toFrame))}); ratio to one 60 Hz frame ${(med(toFrame) / (1000 / 60)).toFixed(1)}×`);
    if (split.size === 0) console.log('(no ps: performance measures recorded by this build)');
    for (const [name, v] of [...split].sort()) {
      console.log(`  ${name.padEnd(20)} median ${fmt(med(v))} ms (min ${fmt(Math.min(...v))}, max ${fmt(Math.max(...v))}, ${v.length} edits); starts ${fmt(med(offsets.get(name) ?? []))} ms after the click`);
    }
    console.log(`  canvas calls per edit (click → frame): fillText median ${med(texts)}, stroke median ${med(strokes)}`);
    console.log(`  main-thread long tasks (> 50 ms) per edit: median ${fmt(med(longSum))} ms (max ${fmt(Math.max(...longSum))})`);
  } finally {
    await browser.close();
    await served.close();
  }
}

/** Main-thread (renderer) time per trace event name, per edit: complete events only, nested
 *  events counted under their own names as well. */
function printTrace(file: string, edits: number) {
  const events = (JSON.parse(readFileSync(file, 'utf8')) as { traceEvents: { name: string; ph: string; dur?: number; tid: number; pid: number; args?: { name?: string } }[] }).traceEvents;
  const main = events.find((e) => e.name === 'thread_name' && e.args?.name === 'CrRendererMain');
  if (!main) { console.log('trace: no renderer main thread found'); return; }
  const sums = new Map<string, number>();
  for (const e of events) if (e.ph === 'X' && e.tid === main.tid && e.pid === main.pid && e.dur) sums.set(e.name, (sums.get(e.name) ?? 0) + e.dur / 1000);
  console.log(`trace ${file}: renderer main thread, ms per edit by event kind`);
  for (const [n, ms] of [...sums].sort((a, b) => b[1] - a[1]).slice(0, 18)) console.log(`  ${(ms / edits).toFixed(1).padStart(7)}  ${n}`);
}

interface CpuProfile { nodes: { id: number; callFrame: { functionName: string; url: string; lineNumber: number } }[]; samples: number[]; timeDeltas: number[] }

/** Self time per function (main thread, whole edit loop incl. idle waits between edits). */
function printProfile(p: CpuProfile) {
  const byId = new Map(p.nodes.map((n) => [n.id, n]));
  const self = new Map<string, number>();
  p.samples.forEach((id, i) => {
    const f = byId.get(id)!.callFrame;
    const name = `${f.functionName || '(anonymous)'} ${f.url.split('/').pop()}:${f.lineNumber}`;
    self.set(name, (self.get(name) ?? 0) + (p.timeDeltas[i] ?? 0) / 1000);
  });
  const busy = [...self].filter(([n]) => !n.startsWith('(idle)') && !n.startsWith('(program)'));
  const total = busy.reduce((s, [, ms]) => s + ms, 0);
  console.log(`main-thread CPU profile: ${total.toFixed(0)} ms busy over the edits; top self time:`);
  for (const [n, ms] of busy.sort((a, b) => b[1] - a[1]).slice(0, 25)) console.log(`  ${ms.toFixed(1).padStart(8)} ms  ${n}`);
}

await main();
