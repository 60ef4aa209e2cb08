// @vitest-environment jsdom
// The Drawing menu's exports in the app: the SVG is the overlay's annotations as shown, the report
// is JSON + CSV of the shown settings, the plots are the results panel's scenes as SVG files.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { act, fireEvent, render, screen } from '@testing-library/react';
import { App } from '../../src/App';
import { createEditor } from '../../src/editor/editor';
import { EXAMPLE_DRAWINGS } from '../../src/examples/index';
import { createLiveStore } from '../../src/live/store';
import { shownSvg } from '../../src/export/exportDrawing';
import { liveAnnotations } from '../../src/live/annotateLive';
import { readFileText } from '../../src/panels/browserHost';

async function until(cond: () => boolean, ms = 15000): Promise<void> {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > ms) throw new Error('condition not met in time');
    await act(async () => { await new Promise((r) => setTimeout(r, 25)); });
  }
}

function captureDownloads() {
  const files: { name: string; blob: Blob }[] = [];
  const blobs: Blob[] = [];
  (URL as unknown as { createObjectURL: (b: Blob) => string }).createObjectURL = (b: Blob) => { blobs.push(b); return `blob:${blobs.length}`; };
  (URL as unknown as { revokeObjectURL: () => void }).revokeObjectURL = () => undefined;
  vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
    files.push({ name: this.download, blob: blobs[Number(this.href.split(':').pop()) - 1] });
  });
  return files;
}

afterEach(() => vi.restoreAllMocks());

function menuItem(label: RegExp) {
  fireEvent.click(screen.getByRole('button', { name: /Drawing/ }));
  fireEvent.click(screen.getByRole('menuitem', { name: label }));
}

describe('export menu in the app', () => {
  it('exports the SVG as shown, the report and the plots', async () => {
    const files = captureDownloads();
    const store = createLiveStore();
    const editor = createEditor(EXAMPLE_DRAWINGS[0].load());
    render(<App editor={editor} storage={null} analysisStore={store} />);
    await until(() => store.getState().status === 'idle' && store.getState().result !== null && store.getState().doc === editor.document);

    menuItem(/Export SVG/);
    expect(files.map((f) => f.name)).toEqual([expect.stringMatching(/\.svg$/)]);
    const svg = await readFileText(files[0].blob);
    // The file is exactly what the canvas overlay's annotations give (one source of overlay truth).
    const ann = liveAnnotations(store.getState())!;
    const date = new Date().toISOString().slice(0, 10);
    expect(svg).toBe(shownSvg(editor.document, { annotations: ann, result: store.getState().result! }, { date }));
    expect(svg).toContain(editor.document.title!.trim().replace(/&/g, '&amp;'));

    menuItem(/Export report/);
    const [json, csv] = files.slice(1);
    expect(json.name).toMatch(/-report\.json$/);
    expect(csv.name).toMatch(/-report\.csv$/);
    const rep = JSON.parse(await readFileText(json.blob));
    expect(rep.format).toBe('polesketch-report');
    expect(rep.sides.map((s: { name: string }) => s.name)).toEqual(['A']);
    // Same poles as the live result (same engine, same settings).
    expect(rep.sides[0].poles.length).toBe(store.getState().result!.poles.length);

    menuItem(/Export plots/);
    const plots = files.slice(3);
    expect(plots.map((f) => f.name.replace(/^.*-(bode|impedance|s-plane|step).*$/, '$1'))).toEqual(expect.arrayContaining(['bode', 'impedance', 's-plane']));
    for (const p of plots) expect(await readFileText(p.blob)).toMatch(/^<\?xml[^]*<svg[^]*<\/svg>\s*$/);
  });
});
