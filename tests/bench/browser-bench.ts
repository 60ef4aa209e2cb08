// Browser bench (not a test, never asserts): time from an edit to the updated analysis overlay in
// Chromium, on an invented drawing of 60 MNA unknowns. Run: `npx tsx tests/bench/browser-bench.ts`.
// Method: build the app, serve it (tests/browser/harness.ts), open the drawing, change one
// resistor's value in the property panel, then alternate the top bar's Undo / Redo. Each click
// stamps performance.now() in the page (capture listener, before the app sees it). Three times
// per edit: (a) click → end of the frame that draws the edited value on the canvas (the first
// fillText of the new value text), (b) that frame → end of the frame that shows the updated
// overlay (a MutationObserver sees the badge texts/titles change; the wire colours are drawn in
// the same frame), (c) click → end of the overlay frame, (d) how many frames apart the edit and
// the overlay are shown (a requestAnimationFrame callback at the start of every frame numbers the
// frames; the page shows a change in the frame after the one running when it is made; the app
// holds a committed edit's render for its stage 1, src/live/editGate.ts, so 0 is the aim). "End of
// a frame" is a MessageChannel task posted from that frame's requestAnimationFrame step: it runs
// once the main thread has done the frame's style, layout, paint and commit (common practice for
// timing a frame). The app's own performance measures ("ps:" names, src/live/perfMarks.ts) split each edit into
// netlist, worker, annotate and paint.
import { readFileSync, writeFileSync } from 'node:fs';
import { netlistToDrawing } from '../../src/layout/importNetlist';
import { nodeElk } from '../../src/layout/elkNode';
import { saveDrawing } from '../../src/schematic/file';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { analyze } from '../../src/engine/index';
import { placedBounds, symbolOf } from '../../src/schematic/symbols';
import { partValueText } from '../../src/canvas/partText';
import { artifactPath, buildAndServe, HAVE_CHROMIUM, INSTALL_HINT, launchBrowser } from '../browser/harness';

const EDITS = Number(process.env.BENCH_EDITS ?? 16);
/** BENCH_GAP_MS=<ms>: click again that long after each overlay frame, while the loops may still be
 *  computed (default: wait until the page's busy mark is gone). */
const GAP_MS = process.env.BENCH_GAP_MS === undefined ? -1 : Number(process.env.BENCH_GAP_MS);
/** BENCH_PROFILE=1: an unminified build and a CPU profile of the page's main thread (Chrome
 *  DevTools Protocol), summarised over the click → overlay-frame windows of the edits only. */
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

interface Stamp { editFrameNo: number; overlayFrameNo: number; tEditDraw: number; tEditFrame: number; watch: string; draws0: { fillText: number; stroke: number }; draws: { fillText: number; stroke: number }; t0: number; t1: number; t2: number; snap: string; measures: { name: string; start: number; ms: number }[]; longTasks: { start: number; ms: number }[] }

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
    // (before the app loads, so Konva's frame requests go through the wrapped requestAnimationFrame)
    await page.addInitScript(`(() => {
      const raf = window.requestAnimationFrame.bind(window);
      let inFrame = 0;
      window.requestAnimationFrame = (cb) => raf((t) => { inFrame++; try { cb(t); } finally { inFrame--; } });
      // frame counter: a callback at the start of every frame (registered before any other of the
      // frame's callbacks, so the number is the current frame's while they run)
      window.__frameNo = 0;
      const tick = () => { window.__frameNo++; raf(tick); };
      raf(tick);
      // the number of the frame that will show a change made now
      window.__showingFrame = () => window.__frameNo + (inFrame > 0 ? 0 : 1);
      const mc = new MessageChannel(), queue = [];
      mc.port1.onmessage = () => { const fn = queue.shift(); if (fn) fn(performance.now()); };
      // fn(time) once the frame that shows what was just drawn is done on the main thread
      window.__afterFrame = (fn) => {
        const post = () => { queue.push(fn); mc.port2.postMessage(0); };
        if (inFrame > 0) post(); else raf(post);
      };
      // time the page spends handing requests to the worker (structured clone of the netlist)
      const wp = Worker.prototype.postMessage;
      window.__postMs = 0;
      Worker.prototype.postMessage = function (...a) { const t = performance.now(); try { return wp.apply(this, a); } finally { window.__postMs += performance.now() - t; } };
      const c = window.__draws = { fillText: 0, stroke: 0 };
      const P = CanvasRenderingContext2D.prototype;
      for (const k of ['fillText', 'stroke']) { const f = P[k]; P[k] = function (...a) { c[k]++; return f.apply(this, a); }; }
      const fill = P.fillText;
      P.fillText = function (text, ...rest) {
        const b = window.__bench;
        if (b && b.t0 && !b.tEditDraw && b.watch && text === b.watch) {
          b.tEditDraw = performance.now();
          b.editFrameNo = window.__showingFrame();
          performance.mark('bench:edit-drawn');
          window.__afterFrame((t) => { b.tEditFrame = t; });
        }
        return fill.call(this, text, ...rest);
      };
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
    const valueText = (value: string) => partValueText({ ...rl, params: { ...rl.params, value } }, symbolOf(rl.kind));
    const bb = placedBounds(rl);
    await page.mouse.click(box.x + (bb.x + bb.width / 2) * cam[0] + cam[1], box.y + (bb.y + bb.height / 2) * cam[0] + cam[2]);
    const field = page.getByLabel(/Resistance/);
    await field.fill('7k');
    await field.press('Enter');
    await page.locator('.sheet').focus();
    await page.waitForFunction(() => !document.querySelector('.ao-busy'), undefined, { timeout: 60000 });

    await page.evaluate((profiling) => {
      const w = window as unknown as { __bench: Stamp };
      const snap = () => {
        const root = document.querySelector('[data-testid="analysis-overlay"]');
        if (!root) return '';
        // textContent, not innerText: reading must not force a layout of the page
        return Array.from(root.querySelectorAll('.ao-badge, .ao-dot')).map((e) => e.textContent + '|' + (e.getAttribute('title') ?? '')).join('\n');
      };
      const draws = (w as unknown as { __draws: { fillText: number; stroke: number } }).__draws;
      w.__bench = { editFrameNo: -1, overlayFrameNo: -1, t0: 0, t1: 0, t2: 0, tEditDraw: 0, tEditFrame: 0, watch: '', snap: snap(), measures: [], longTasks: [], draws0: { ...draws }, draws: { ...draws } };
      // main-thread tasks over 50 ms (Long Tasks API): where the page could not answer input
      const long: { start: number; ms: number }[] = [];
      try {
        new PerformanceObserver((list) => { for (const e of list.getEntries()) long.push({ start: e.startTime, ms: e.duration }); }).observe({ type: 'longtask', buffered: false });
      } catch { /* no Long Tasks API */ }
      (w as unknown as { __long: typeof long }).__long = long;
      // a named spin that marks the click in a CPU profile (BENCH_PROFILE)
      const mark = { __benchClickMark() { const end = performance.now() + 1; while (performance.now() < end) { /* spin */ } } };
      window.addEventListener('click', () => {
        if (profiling) mark.__benchClickMark();
        performance.clearMeasures();
        w.__bench.t0 = performance.now(); w.__bench.t1 = 0; w.__bench.t2 = 0; w.__bench.tEditDraw = 0; w.__bench.tEditFrame = 0; w.__bench.editFrameNo = -1; w.__bench.overlayFrameNo = -1; w.__bench.snap = snap(); w.__bench.draws0 = { ...draws };
      }, true);
      // which elements the page changes per edit (BENCH_MUTATIONS=1 prints them)
      const changed = new Map<string, number>();
      (w as unknown as { __changed: typeof changed }).__changed = changed;
      new MutationObserver((list) => {
        if (!w.__bench.t0) return;
        for (const m of list) {
          const el = (m.target.nodeType === 1 ? m.target : m.target.parentElement) as Element | null;
          const key = `${m.type}:${el?.tagName.toLowerCase() ?? '?'}.${String(el?.getAttribute('class') ?? '').split(' ')[0]}${m.attributeName ? '@' + m.attributeName : ''}`;
          changed.set(key, (changed.get(key) ?? 0) + 1);
        }
      }).observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true });
      new MutationObserver(() => {
        const b = w.__bench;
        if (!b.t0 || b.t1) return;
        const s = snap();
        if (s && s !== b.snap) {
          b.t1 = performance.now();
          b.overlayFrameNo = (window as unknown as { __showingFrame: () => number }).__showingFrame();
          performance.mark('bench:overlay-dom');
          (window as unknown as { __afterFrame: (fn: (t: number) => void) => void }).__afterFrame((t) => {
            b.t2 = t;
            b.draws = { ...draws };
            b.measures = performance.getEntriesByType('measure').filter((m) => m.name.startsWith('ps:')).map((m) => ({ name: m.name, start: m.startTime - b.t0, ms: m.duration }));
            b.longTasks = (w as unknown as { __long: { start: number; ms: number }[] }).__long.filter((t) => t.start + t.ms >= b.t0 && t.start <= b.t2).map((t) => ({ start: t.start - b.t0, ms: t.ms }));
          });
        }
      }).observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true, attributeFilter: ['title'] });
    }, PROFILE);

    const cdp = PROFILE ? await page.context().newCDPSession(page) : null;
    if (cdp) {
      await cdp.send('Profiler.enable');
      await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
      await cdp.send('Profiler.start');
    }
    if (TRACE) await browser.startTracing(page, { path: TRACE, categories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'v8.execute', 'blink.user_timing'] });
    const toOverlay: number[] = [], toFrame: number[] = [], editFrame: number[] = [], editToOverlay: number[] = [], overlayPaint: number[] = [];
    const split = new Map<string, number[]>();
    const offsets = new Map<string, number[]>();
    const longSum: number[] = [], posts: number[] = [];
    const texts: number[] = [], strokes: number[] = [];
    const framesApart: number[] = [];
    for (let i = 0; i < EDITS; i++) {
      // the value text the edit puts on the canvas: Undo goes back to the drawn value, Redo to 7k
      const watch = i % 2 === 0 ? valueText(rl.params.value ?? '') : valueText('7k');
      const post0 = await page.evaluate((text) => { (window as unknown as { __bench: Stamp }).__bench.watch = text; return (window as unknown as { __postMs: number }).__postMs; }, watch);
      await page.getByRole('button', { name: i % 2 === 0 ? 'Undo' : 'Redo', exact: true }).click();
      try {
        await page.waitForFunction(() => (window as unknown as { __bench: Stamp }).__bench.t2 > 0, undefined, { timeout: 60000 });
        await page.waitForFunction(() => (window as unknown as { __bench: Stamp }).__bench.tEditFrame > 0, undefined, { timeout: 3000 }).catch(() => undefined);
      } catch (e) {
        await page.screenshot({ path: artifactPath('bench-timeout.png') });
        throw e;
      }
      const t = await page.evaluate(() => (window as unknown as { __bench: Stamp }).__bench);
      toOverlay.push(t.t1 - t.t0);
      toFrame.push(t.t2 - t.t0);
      editFrame.push(t.tEditFrame > 0 ? t.tEditFrame - t.t0 : NaN);
      editToOverlay.push(t.tEditFrame > 0 ? Math.max(0, t.t2 - t.tEditFrame) : NaN);
      overlayPaint.push(t.t2 - t.t1);
      framesApart.push(t.editFrameNo >= 0 && t.overlayFrameNo >= 0 ? t.overlayFrameNo - t.editFrameNo : NaN);
      // per edit: sum of each measure's durations that started after the click
      const sums = new Map<string, number>();
      for (const m of t.measures) {
        if (m.start < -1) continue; // measures of earlier edits (a worker duration may start a hair early)
        sums.set(m.name, (sums.get(m.name) ?? 0) + m.ms);
        if (!offsets.has(m.name) || offsets.get(m.name)!.length < toFrame.length) offsets.set(m.name, [...(offsets.get(m.name) ?? []), m.start]);
      }
      for (const [name, ms] of sums) split.set(name, [...(split.get(name) ?? []), ms]);
      longSum.push(t.longTasks.reduce((s2, x) => s2 + x.ms, 0));
      posts.push((await page.evaluate(() => (window as unknown as { __postMs: number }).__postMs)) - post0);
      texts.push(t.draws.fillText - t.draws0.fillText);
      strokes.push(t.draws.stroke - t.draws0.stroke);
      // the feedback stage must not overlap the next click's clock, unless edits in quick
      // succession are asked for (BENCH_GAP_MS: the next click that long after the overlay frame)
      if (GAP_MS >= 0) await page.waitForTimeout(GAP_MS);
      else await page.waitForFunction(() => !document.querySelector('.ao-busy'), undefined, { timeout: 60000 });
    }
    if (TRACE) { await browser.stopTracing(); printTrace(TRACE, EDITS); }
    if (process.env.BENCH_LAYERS === '1') {
      // the compositor's layers of the page (each is pushed to the compositor at every commit)
      const lt = await page.context().newCDPSession(page);
      const got = new Promise<{ layers?: { layerId: string; width: number; height: number; drawsContent: boolean; backendNodeId?: number }[] }>((r) => lt.on('LayerTree.layerTreeDidChange', r));
      await lt.send('LayerTree.enable');
      await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r(0))));
      const layers = (await got).layers ?? [];
      const drawing = layers.filter((l) => l.drawsContent);
      console.log(`compositor layers: ${layers.length} (${drawing.length} draw content); largest:`);
      for (const l of [...drawing].sort((a, b) => b.width * b.height - a.width * a.height).slice(0, Number(process.env.BENCH_LAYERS_SHOW ?? 8))) {
        let what = '';
        if (l.backendNodeId) {
          try {
            const { object } = await lt.send('DOM.resolveNode', { backendNodeId: l.backendNodeId }) as { object: { objectId: string } };
            const r = await lt.send('Runtime.callFunctionOn', { objectId: object.objectId, functionDeclaration: 'function () { return this.nodeName + "." + (this.className || "") }', returnByValue: true }) as { result: { value: string } };
            what = r.result.value;
          } catch { /* a node without a DOM element */ }
        }
        console.log(`  ${l.width}×${l.height} ${what}`);
      }
    }
    if (process.env.BENCH_MUTATIONS === '1') {
      const changed = await page.evaluate(() => [...(window as unknown as { __changed: Map<string, number> }).__changed]);
      console.log('DOM mutations per edit (whole edit loop):');
      for (const [k, n] of changed.sort((a, b) => b[1] - a[1]).slice(0, 25)) console.log(`  ${(n / EDITS).toFixed(1).padStart(7)}  ${k}`);
    }
    if (cdp) {
      const prof = (await cdp.send('Profiler.stop')).profile as CpuProfile;
      printProfile(prof, 'click → overlay frame', toFrame.map((t) => [0, t]));
      printProfile(prof, 'click → edit frame', editFrame.map((t) => [0, Number.isFinite(t) ? t : 0]));
      printProfile(prof, 'edit frame → overlay frame', editFrame.map((t, i) => [Number.isFinite(t) ? t : 0, toFrame[i]]));
      if (process.env.BENCH_PROFILE_OUT) writeFileSync(process.env.BENCH_PROFILE_OUT, JSON.stringify(prof));
    }
    // a look by eye at the overlay after the edits (zoomed in to a readable size)
    for (let i = 0; i < 4; i++) await page.locator('.sheet-zoom').getByTitle('Zoom in').click();
    await page.waitForTimeout(300);
    await page.screenshot({ path: artifactPath('bench-overlay.png') });
    const seen = editFrame.filter(Number.isFinite);
    const frame = 1000 / 60;
    console.log(`(a) click → frame showing the edit:        median ${fmt(med(seen))} ms (min ${fmt(Math.min(...seen))}, max ${fmt(Math.max(...seen))}; seen in ${seen.length} of ${EDITS} edits)`);
    const b = editToOverlay.filter(Number.isFinite);
    console.log(`(b) edit frame → frame showing the overlay: median ${fmt(med(b))} ms (min ${fmt(Math.min(...b))}, max ${fmt(Math.max(...b))}); within one 60 Hz frame (≤ 16.7 ms) in ${b.filter((x) => x <= frame).length} of ${b.length}; same frame in ${b.filter((x) => x === 0).length}`);
    console.log(`(c) click → frame showing the overlay:      median ${fmt(med(toFrame))} ms (min ${fmt(Math.min(...toFrame))}, max ${fmt(Math.max(...toFrame))}) = ${(med(toFrame) / frame).toFixed(1)} frames`);
    const fa = framesApart.filter(Number.isFinite);
    console.log(`(d) frames from the edit's frame to the overlay's frame: 0 (same frame) in ${fa.filter((x) => x <= 0).length}, 1 (the next frame) in ${fa.filter((x) => x === 1).length}, 2 in ${fa.filter((x) => x === 2).length}, more in ${fa.filter((x) => x > 2).length} (of ${fa.length})`);
    console.log(`    overlay DOM change → end of its frame: median ${fmt(med(overlayPaint))} ms`);
    console.log(`edit → overlay DOM updated: median ${fmt(med(toOverlay))} ms (min ${fmt(Math.min(...toOverlay))}, max ${fmt(Math.max(...toOverlay))}) over ${EDITS} undo/redo clicks`);
    console.log(`edit → frame showing it:   median ${fmt(med(toFrame))} ms (min ${fmt(Math.min(...toFrame))}, max ${fmt(Math.max(...toFrame))}); ratio to one 60 Hz frame ${(med(toFrame) / (1000 / 60)).toFixed(1)}×`);
    if (split.size === 0) console.log('(no ps: performance measures recorded by this build)');
    for (const [name, v] of [...split].sort()) {
      console.log(`  ${name.padEnd(20)} median ${fmt(med(v))} ms (min ${fmt(Math.min(...v))}, max ${fmt(Math.max(...v))}, ${v.length} edits); starts ${fmt(med(offsets.get(name) ?? []))} ms after the click`);
    }
    console.log(`  canvas calls per edit (click → frame): fillText median ${med(texts)}, stroke median ${med(strokes)}`);
    console.log(`  Worker.postMessage on the page per edit: median ${fmt(med(posts))} ms`);
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

interface CpuProfile { nodes: { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; children?: number[] }[]; samples: number[]; timeDeltas: number[] }

/** The page's click marker (a named spin of 1 ms in the click listener) locates each click in
 *  the profile's own clock; only samples inside each edit's window (ms after its click) count.
 *  Prints self time and inclusive time (each function once per sample) per edit. */
function printProfile(p: CpuProfile, title: string, windowsMs: [number, number][]) {
  const byId = new Map(p.nodes.map((n) => [n.id, n]));
  const parent = new Map<number, number>();
  for (const n of p.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  const nameOf = (id: number) => { const f = byId.get(id)!.callFrame; return `${f.functionName || '(anonymous)'} ${f.url.split('/').pop()}:${f.lineNumber}`; };
  const at: number[] = [];
  let t = 0;
  for (let i = 0; i < p.samples.length; i++) { t += (p.timeDeltas[i] ?? 0) / 1000; at.push(t); }
  const clicks: number[] = [];
  p.samples.forEach((id, i) => {
    if (byId.get(id)!.callFrame.functionName !== '__benchClickMark') return;
    if (clicks.length === 0 || at[i] - clicks[clicks.length - 1] > 5) clicks.push(at[i]);
  });
  const inWindow = (ms: number) => clicks.some((c, k) => windowsMs[k] !== undefined && ms >= c + windowsMs[k][0] && ms <= c + windowsMs[k][1]);
  const self = new Map<string, number>(), incl = new Map<string, number>();
  p.samples.forEach((id, i) => {
    if (!inWindow(at[i])) return;
    const d = (p.timeDeltas[i + 1] ?? p.timeDeltas[i] ?? 0) / 1000;
    const name = nameOf(id);
    self.set(name, (self.get(name) ?? 0) + d);
    if (name.startsWith('(idle)') || name.startsWith('(program)')) return;
    const seen = new Set<string>();
    for (let n: number | undefined = id; n !== undefined; n = parent.get(n)) seen.add(nameOf(n));
    for (const s of seen) incl.set(s, (incl.get(s) ?? 0) + d);
  });
  const per = Math.max(1, clicks.length);
  const busy = [...self].filter(([n]) => !n.startsWith('(idle)') && !n.startsWith('(program)'));
  const total = busy.reduce((s, [, ms]) => s + ms, 0);
  console.log(`main-thread CPU profile, ${title} of ${clicks.length} edits: ${(total / per).toFixed(1)} ms busy per edit (idle ${((self.get('(idle) :-1') ?? 0) / per).toFixed(1)}, program ${((self.get('(program) :-1') ?? 0) / per).toFixed(1)}); self time per edit:`);
  for (const [n, ms] of busy.sort((a, b) => b[1] - a[1]).slice(0, 22)) console.log(`  ${(ms / per).toFixed(2).padStart(8)} ms  ${n}`);
  console.log('inclusive time per edit:');
  for (const [n, ms] of [...incl].sort((a, b) => b[1] - a[1]).slice(0, 40)) console.log(`  ${(ms / per).toFixed(2).padStart(8)} ms  ${n}`);
}

await main();
