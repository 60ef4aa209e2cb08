/// <reference types="vite/client" />
// ELK for the browser: elkjs's layout code in a web worker, so a large drawing never blocks the page.
import ELK from 'elkjs/lib/elk-api.js';
import workerUrl from 'elkjs/lib/elk-worker.min.js?url';
import type { ElkGraphJson, ElkRunner } from './elkGraph';

let shared: ElkRunner | null = null;

/** One worker for the page, started on first use. */
export function workerElk(): ElkRunner {
  if (!shared) {
    const elk = new ELK({ workerUrl });
    shared = { layout: (g: ElkGraphJson) => elk.layout(g as never) as unknown as Promise<ElkGraphJson> };
  }
  return shared;
}
