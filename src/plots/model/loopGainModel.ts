// Loop gain T(jω) of the selected loop (Bode's return ratio at its key source): magnitude and phase
// with the crossover |T| = 1, the phase margin (180° + ∠T at crossover) drawn as a bar up from the
// −180° line, and the gain margin (−|T| in dB where ∠T reaches −180°) as a bar down from 0 dB.
import type { LoopGainInput, MarginsInput, PlotSize } from '../types';
import type { HoverPoint, Scene } from './scene';
import { formatSi, plainLabel } from './scales';
import { addNote, addWrappedNote, newScene, textWidth, titleItem, FONT_SIZE, type Panel } from './frame';
import { frequencyPanels } from './freqPanels';
import { LINES, PALETTE } from './palette';

export function loopGainModel(input: LoopGainInput, size: PlotSize = {}): Scene {
  const width = size.width ?? 640, height = size.height ?? 440;
  const title = input.label ? `Loop gain T: ${input.label}` : 'Loop gain T';
  const scene = newScene(width, height, title, 'Magnitude and phase of the loop gain (return ratio) against frequency, with crossover and margins');
  titleItem(scene, 66);
  const fp = frequencyPanels(scene, input, { width, height, symbol: 'T', includeDb: [0], includeDeg: [-180, 0] });
  const m = input.margins ? finiteMargins(input.margins) : null;
  const notes: string[] = [];
  if (m?.message) notes.push(m.message);
  if (fp) {
    const { mag, phase } = fp;
    hLine(scene, mag, 0, 'ref-0db');
    const marks: HoverPoint[] = [];
    const fc = m?.unityGainHz ?? null;
    let ref = -180;
    if (fc !== null && inBand(mag, fc)) {
      const x = mag.xs.map(fc);
      const phFc = interpLog(input.hz, input.phaseDeg, fc);
      const pm = m?.phaseMarginDeg ?? null;
      // the −180° line on the same 360° branch as the plotted phase
      if (phFc !== null && pm !== null) ref = -180 + 360 * Math.round((phFc - pm + 180) / 360);
      scene.items.push({ kind: 'line', role: 'crossover', x1: x, y1: mag.y, x2: x, y2: phase.y + phase.h, style: LINES.tertiary });
      scene.items.push({ kind: 'marker', role: 'crossover-mark', shape: 'circle', x, y: mag.ys.map(0), size: 4, style: { stroke: PALETTE.violet, width: 2, fill: PALETTE.background } });
      const lines = [`crossover ${formatSi(fc, 'Hz')}`];
      if (pm !== null) {
        const y0 = phase.ys.map(ref), y1 = phase.ys.map(ref + pm);
        scene.items.push({ kind: 'line', role: 'phase-margin', x1: x, y1: y0, x2: x, y2: y1, style: LINES.margin });
        scene.items.push(label('phase-margin-label', x, (y0 + y1) / 2, `PM ${plainLabel(Number(pm.toFixed(1)))}°`, phase.x + phase.w));
        lines.push(`phase margin ${plainLabel(Number(pm.toFixed(1)))}°`);
      }
      marks.push({ x, y: mag.ys.map(0), dots: [], lines });
    } else notes.push(m?.status === 'positive-feedback' ? 'T < 0 at DC: positive feedback; no phase margin.' : '|T| does not cross 1 in the plotted band: no phase margin.');
    hLine(scene, phase, ref, 'ref-180');
    const f180 = m?.phaseCrossHz ?? null;
    const gm = m?.gainMarginDb ?? null;
    if (f180 !== null && gm !== null && inBand(mag, f180)) {
      const x = mag.xs.map(f180);
      const y0 = mag.ys.map(0), y1 = mag.ys.map(-gm);
      scene.items.push({ kind: 'line', role: 'gain-margin', clip: 'mag', x1: x, y1: y0, x2: x, y2: y1, style: LINES.margin });
      scene.items.push(label('gain-margin-label', x, (y0 + y1) / 2, `GM ${plainLabel(Number(gm.toFixed(1)))} dB`, mag.x + mag.w));
      scene.items.push({ kind: 'marker', role: 'phase-cross-mark', shape: 'diamond', x, y: phase.ys.map(ref), size: 4, style: { stroke: PALETTE.violet, width: 2, fill: PALETTE.background } });
      marks.push({ x, y: phase.ys.map(ref), dots: [], lines: [`∠T = −180° at ${formatSi(f180, 'Hz')}`, `gain margin ${plainLabel(Number(gm.toFixed(1)))} dB`] });
    } else if (fc !== null) notes.push('∠T does not reach −180° in the plotted band: no gain margin.');
    if (marks.length) scene.hover.unshift({ id: 'margins', mode: 'xy', area: { x: mag.x, y: mag.y, w: mag.w, h: phase.y + phase.h - mag.y }, radius: 10, points: marks });
  }
  if (notes.length) {
    // One line at the foot when it fits; else wrapped inside the top of the magnitude panel.
    const text = notes.join(' ');
    if (!fp || 8 + textWidth(text, FONT_SIZE - 1) <= width - 8) addNote(scene, text, 8, height - 12);
    else addWrappedNote(scene, text, fp.mag.x + 6, fp.mag.y + 4, fp.mag.w - 12);
  }
  return scene;
}

const fin = (v: number | null | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
function finiteMargins(m: MarginsInput): MarginsInput {
  return { ...m, unityGainHz: fin(m.unityGainHz), phaseMarginDeg: fin(m.phaseMarginDeg), phaseCrossHz: fin(m.phaseCrossHz), gainMarginDb: fin(m.gainMarginDb) };
}

function inBand(p: Panel, f: number): boolean {
  return f >= p.xs.d0 * (1 - 1e-9) && f <= p.xs.d1 * (1 + 1e-9);
}

function hLine(scene: Scene, p: Panel, v: number, role: string): void {
  const y = p.ys.map(v);
  scene.items.push({ kind: 'line', role, clip: p.id, x1: p.x, y1: y, x2: p.x + p.w, y2: y, style: LINES.reference });
}

/** A margin label beside the line at x: to its right, or to its left when it would pass `right`. */
function label(role: string, x: number, y: number, text: string, right: number) {
  const toLeft = x + 6 + textWidth(text, FONT_SIZE) > right;
  return { kind: 'text' as const, role, x: toLeft ? x - 6 : x + 6, y, text, anchor: toLeft ? 'end' as const : 'start' as const, baseline: 'middle' as const, size: FONT_SIZE, fill: PALETTE.violet, weight: 'bold' as const };
}

/** Value at f by linear interpolation in log f between the bracketing samples (null if missing). */
export function interpLog(hz: number[], v: (number | null)[], f: number): number | null {
  for (let i = 0; i + 1 < hz.length; i++) {
    if (!(hz[i] > 0) || !(hz[i] <= f && f <= hz[i + 1])) continue;
    const a = v[i], b = v[i + 1];
    if (a === null || b === null) return a ?? b;
    const t = Math.log(f / hz[i]) / Math.log(hz[i + 1] / hz[i] || 1);
    return a + (b - a) * (Number.isFinite(t) ? t : 0);
  }
  return null;
}
