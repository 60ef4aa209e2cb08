// ELK for node (tests, the command line): elkjs's bundled build, which runs the layout in-process.
import ELK from 'elkjs/lib/elk.bundled.js';
import type { ElkGraphJson, ElkRunner } from './elkGraph';

export function nodeElk(): ElkRunner {
  const elk = new ELK();
  return { layout: (g: ElkGraphJson) => elk.layout(g as never) as unknown as Promise<ElkGraphJson> };
}
