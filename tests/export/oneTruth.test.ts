// One source of overlay truth: the canvas overlay's annotations (src/live liveAnnotations) and the
// exported SVG's annotations (src/export annotationsFor) are the same data for the same settings,
// here with a feedback loop selected and nets coloured by τ; the command line's --svg with no
// settings equals the export of a freshly opened drawing. Common practice: one model, two views.
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createLiveStore } from '../../src/live/store';
import { createSameThreadRunner } from '../../src/worker/runner';
import { liveAnnotations } from '../../src/live/annotateLive';
import type { LiveState } from '../../src/live/types';
import { EXAMPLE_DRAWINGS } from '../../src/examples/index';
import { analyseDrawing, annotatedSvg, annotationsFor, shownSvg } from '../../src/export/exportDrawing';
import { exportOptionsOf } from '../../src/export/liveOptions';
import { writeSvgFile } from '../../src/export/cliExport';
import { saveDrawing } from '../../src/schematic/file';

function until(store: ReturnType<typeof createLiveStore>, ok: (s: LiveState) => boolean, ms = 30000): Promise<LiveState> {
  return new Promise((resolve, reject) => {
    if (ok(store.getState())) return resolve(store.getState());
    const t = setTimeout(() => { off(); reject(new Error('timed out waiting for the store')); }, ms);
    const off = store.subscribe(() => { if (ok(store.getState())) { clearTimeout(t); off(); resolve(store.getState()); } });
  });
}

const date = '2024-05-06';
const settled = (s: LiveState) => s.stage === 2 && s.status === 'idle' && !!s.result;

describe('canvas overlay and SVG export share the annotations', () => {
  it('with a loop selected and τ colouring, for an example with feedback', async () => {
    const ex = EXAMPLE_DRAWINGS.find((e) => e.id === 'two-stage-miller-unity')!;
    const doc = ex.load();
    const store = createLiveStore({ runner: createSameThreadRunner() });
    store.actions.submit(doc);
    let s = await until(store, settled);
    const loopId = Object.keys(s.loops)[0];
    expect(loopId).toBeDefined();
    store.actions.selectLoop(loopId);
    store.actions.setColorMode('timeConstant');
    s = await until(store, (x) => settled(x) && x.settings.selectedLoopId === loopId && x.settings.colorMode === 'timeConstant');
    const canvas = liveAnnotations(s)!;
    expect(canvas.loop?.loopId).toBe(loopId);
    expect(canvas.legend?.title).toMatch(/time constant/);

    const opts = exportOptionsOf(s.settings, s.loops, date);
    const exported = annotationsFor(doc, analyseDrawing(doc, opts), opts);
    expect(exported).toEqual(canvas);
    // And so the SVG text: recomputed from the drawing = drawn from what the canvas shows.
    expect(annotatedSvg(doc, opts)).toBe(shownSvg(doc, { annotations: canvas, result: s.result! }, opts));
    store.actions.dispose();
  });

  it('npm run analyze -- <drawing> --svg writes what a freshly opened drawing shows', async () => {
    const ex = EXAMPLE_DRAWINGS.find((e) => e.id === 'sensor-cs-miller')!;
    const doc = ex.load();
    const store = createLiveStore({ runner: createSameThreadRunner() });
    store.actions.submit(doc);
    const s = await until(store, settled);
    const today = new Date().toISOString().slice(0, 10);
    const path = join(mkdtempSync(join(tmpdir(), 'onetruth-')), 'out.svg');
    expect(await writeSvgFile(JSON.parse(saveDrawing(doc)), path)).toEqual([]);
    expect(readFileSync(path, 'utf8')).toBe(shownSvg(doc, { annotations: liveAnnotations(s)!, result: s.result! }, { date: today }));
    store.actions.dispose();
  });
});
