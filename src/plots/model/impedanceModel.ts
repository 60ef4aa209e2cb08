// |Z| of the selected node against frequency, log-log, in ohms with SI prefixes.
import type { ImpedanceInput, PlotSize } from '../types';
import type { Scene } from './scene';
import { decadeDomain, formatSi, logScale, logTicks } from './scales';
import { addNote, addPanel, axesItems, xLabelBudget, curveRuns, extent, newScene, titleItem, type Panel } from './frame';
import { LINES } from './palette';

export function impedanceModel(input: ImpedanceInput, size: PlotSize = {}): Scene {
  const width = size.width ?? 640, height = size.height ?? 360;
  const scene = newScene(width, height, `Node impedance |Z|: ${input.node}`, `Impedance magnitude of node ${input.node} to ground against frequency`);
  titleItem(scene, 66);
  const left = 66, right = 18, top = 30, bottom = 42;
  const used: number[] = [];
  for (let i = 0; i < input.hz.length; i++) if (input.hz[i] > 0 && Number.isFinite(input.hz[i])) used.push(i);
  const zs = used.map((i) => input.ohms[i]).filter((v): v is number => v !== null && v > 0 && Number.isFinite(v));
  if (used.length < 2 || zs.length === 0) {
    addNote(scene, `No impedance samples to draw for node ${input.node}.`, left, top);
    return scene;
  }
  const fLo = input.hz[used[0]], fHi = input.hz[used[used.length - 1]];
  const [zLo, zHi] = decadeDomain(...(extent(zs) as [number, number]));
  const w = width - left - right, h = height - top - bottom;
  const p: Panel = { id: 'z', x: left, y: top, w, h, xs: logScale(fLo, fHi, left, left + w), ys: logScale(zLo, zHi, top + h, top) };
  addPanel(scene, p);
  scene.items.push(...axesItems(p, logTicks(fLo, fHi, 'Hz', xLabelBudget(w)), logTicks(zLo, zHi, 'Ω', 7), { xTitle: 'frequency', yTitle: '|Z|' }));
  const hz = used.map((i) => input.hz[i]);
  scene.items.push({ kind: 'path', role: 'curve-z', clip: 'z', runs: curveRuns(p, hz, used.map((i) => input.ohms[i])), style: LINES.primary });
  for (const f of input.markHz ?? []) {
    if (!(f >= fLo && f <= fHi)) continue;
    const x = p.xs.map(f);
    scene.items.push({ kind: 'line', role: 'mark-hz', x1: x, y1: p.y, x2: x, y2: p.y + p.h, style: LINES.tertiary });
  }
  scene.hover.push({
    id: 'curve', mode: 'x', area: { x: p.x, y: p.y, w: p.w, h: p.h },
    points: used.map((i) => {
      const x = p.xs.map(input.hz[i]);
      const z = input.ohms[i];
      const ok = z !== null && z > 0 && Number.isFinite(z);
      return { x, y: ok ? p.ys.map(z) : p.y, dots: ok ? [[x, p.ys.map(z)] as [number, number]] : [], lines: [`f = ${formatSi(input.hz[i], 'Hz')}`, ok ? `|Z| = ${formatSi(z, 'Ω')}` : '|Z| undefined'] };
    }),
  });
  if (zs.length < used.length) addNote(scene, 'Some samples have no finite impedance (the node is open there) and are left out.', 8, height - 12);
  return scene;
}
