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
import { placedBounds } from '../../src/schematic/symbols';
import { boxArea } from '../../src/export/badgeLayout';
import { badgesOnScreen } from '../../src/canvas/overlayModel';

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
    // Badge boxes: one placement (annotate → badgeLayout), clear of symbol bodies and of each
    // other, and the canvas draws exactly those boxes (world → screen by the camera only).
    expect(exported.badges.map((b) => [b.net, b.box, b.leader])).toEqual(canvas.badges.map((b) => [b.net, b.box, b.leader]));
    expect(canvas.badges.length).toBeGreaterThan(2);
    const bodies = Object.values(doc.parts).map((p) => ({ ref: p.ref, ...placedBounds(p) }));
    const hits = canvas.badges.flatMap((b) => bodies.filter((p) => boxArea(b.box, p) > 0).map((p) => `${b.net} on ${p.ref}`));
    expect(hits).toEqual([]);
    const pairs = canvas.badges.flatMap((a, i) => canvas.badges.slice(i + 1).filter((b) => boxArea(a.box, b.box) > 0).map((b) => `${a.net}/${b.net}`));
    expect(pairs).toEqual([]);
    const cam = { scale: 1.5, x: 40, y: -20 };
    expect(badgesOnScreen(canvas.badges, cam).map((b) => [b.left, b.top, b.width, b.height]))
      .toEqual(canvas.badges.map((b) => [b.box.x * 1.5 + 40, b.box.y * 1.5 - 20, b.box.width * 1.5, b.box.height * 1.5]));
    // Loop path points: the same in both, closed, and routed through member parts' centres
    // between the nets (the points that are not net anchors are member bodies' centres).
    expect(exported.loop!.points).toEqual(canvas.loop!.points);
    const pts = canvas.loop!.points;
    expect(pts[pts.length - 1]).toEqual(pts[0]);
    const members = new Set(s.loops[loopId].parts);
    const centres = Object.values(doc.parts).filter((p) => members.has(p.ref)).map((p) => { const r = placedBounds(p); return { x: r.x + r.width / 2, y: r.y + r.height / 2 }; });
    const via = pts.filter((_, i) => i % 2 === 1);
    expect(via.length).toBeGreaterThan(0);
    for (const p of via) expect(centres).toContainEqual(p);
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
