// Helpers that turn analysis pieces into the public result: part switches (scale/off), the sweep
// range, the node table, a named issue for singular equations, and a final no-NaN pass.

import type { Cx, Element, EngineIssue, MnaSystem } from '../types';
import type { DcFactor } from './dc';
import type { DcImpedance } from './impedance';
import type { NodeTimeConstant } from './octc';
import type { Pole } from './poles';
import type { Zero } from './zeros';

export interface NodeRow {
  name: string;
  /** A node private to a part macro ("<part>#<label>"). */
  internal: boolean;
  /** |Z| to ground at DC in ohms; null = open at DC (or undefined, see note). */
  dcOhms: number | null;
  openAtDc: boolean;
  /** Z at the chosen frequency: complex ohms, magnitude and phase; null when undefined there. */
  z: { re: number; im: number; mag: number; phaseDeg: number } | null;
  farads: number;
  tau: number | null;
  poleHz: number | null;
  slowest: boolean;
  note?: string;
}

/** Unit of the transfer's gain from the kinds of its input and output: voltage → voltage V/V,
 *  current → voltage Ω (transimpedance), voltage → current S (transconductance), current → current A/A. */
export type GainUnit = 'V/V' | 'Ω' | 'S' | 'A/A';

export function gainUnitOf(sys: Pick<MnaSystem, 'elements' | 'input' | 'output'>): GainUnit | null {
  if (!sys.input || !sys.output) return null;
  const src = sys.elements.find((e) => e.part === sys.input && (e.type === 'vsource' || e.type === 'isource'));
  if (!src) return null;
  const currentIn = src.type === 'isource';
  const currentOut = sys.output.kind === 'current';
  return currentIn ? (currentOut ? 'A/A' : 'Ω') : (currentOut ? 'S' : 'V/V');
}

export interface SweepRange {
  fMin: number;
  fMax: number;
  perDecade: number;
}

/** Map scale/off entries (element ids or part names) onto controlled-source element ids. */
export function resolveSwitches(elements: Element[], scale: Record<string, number>, off: string[]) {
  const issues: EngineIssue[] = [];
  const ids = new Map<string, string[]>();
  for (const e of elements) {
    if (e.type !== 'vccs' && e.type !== 'vcvs') continue;
    ids.set(e.id, [e.id]);
    ids.set(e.part, [...(ids.get(e.part) ?? []), e.id]);
  }
  const out: Record<string, number> = {};
  const lookup = (key: string, field: string): string[] => {
    const hit = ids.get(key);
    if (!hit) {
      issues.push({ severity: 'error', code: 'unknown-part', field, part: key,
        message: `${field}: "${key}" is not a controlled source of this netlist (give a part name or "<part>.<role>", e.g. "M1.gm")` });
      return [];
    }
    return hit;
  };
  for (const [key, f] of Object.entries(scale)) {
    if (typeof f !== 'number' || !Number.isFinite(f)) {
      issues.push({ severity: 'error', code: 'bad-value', field: 'scale', part: key, message: `scale.${key}: the factor must be a finite number` });
      continue;
    }
    for (const id of lookup(key, 'scale')) out[id] = (out[id] ?? 1) * f;
  }
  for (const key of off) for (const id of lookup(key, 'off')) out[id] = 0;
  const offIds = Object.keys(out).filter((k) => out[k] === 0).sort();
  const scaled: Record<string, number> = {};
  for (const k of Object.keys(out).sort()) if (out[k] !== 0) scaled[k] = out[k];
  return { scale: out, off: offIds, scaled, issues };
}

const MAX_PER_DECADE = 200;
const MAX_POINTS = 4000;

/** Sweep range: the caller's, else two decades beyond the poles and zeros, decade-aligned. */
export function chooseSweep(req: { fMin?: number; fMax?: number; perDecade?: number } | undefined, poles: Pole[], zeros: Zero[]): SweepRange {
  const ok = (f: number) => f > 0 && Number.isFinite(f);
  const ph = poles.map((p) => p.hz).filter(ok);
  // Zeros far outside the pole span (often ill-determined near-infinite ones) do not stretch the range.
  const pLo = ph.length ? Math.min(...ph) / 1e4 : 0, pHi = ph.length ? Math.max(...ph) * 1e4 : Infinity;
  const fs = [...ph, ...zeros.map((z) => z.hz).filter((f) => ok(f) && f >= pLo && f <= pHi)];
  let lo = fs.length ? Math.min(...fs) / 100 : 1;
  let hi = fs.length ? Math.max(...fs) * 100 : 1e9;
  lo = Math.pow(10, Math.floor(Math.log10(lo)));
  hi = Math.pow(10, Math.ceil(Math.log10(hi)));
  if (hi / lo > 1e16) lo = hi / 1e16; // at most 16 decades by default
  if (hi <= lo) hi = lo * 10;
  const fMin = req?.fMin !== undefined && req.fMin > 0 ? req.fMin : lo;
  const fMaxReq = req?.fMax !== undefined && req.fMax > fMin ? req.fMax : undefined;
  const fMax = fMaxReq ?? Math.max(hi, fMin * 10);
  let perDecade = req?.perDecade !== undefined && req.perDecade >= 1 ? Math.min(Math.floor(req.perDecade), MAX_PER_DECADE) : 10;
  // Keep the grid bounded whatever range was asked for.
  const decades = Math.log10(fMax / fMin);
  if (decades * perDecade > MAX_POINTS) perDecade = Math.max(1, Math.floor(MAX_POINTS / decades));
  return { fMin, fMax, perDecade };
}

export function nodeRows(sys: Pick<MnaSystem, 'nodeNames'>, zDc: DcImpedance[], zAt: (Cx | null)[], tc: NodeTimeConstant[]): NodeRow[] {
  return sys.nodeNames.map((name, k) => {
    const z = zAt[k];
    const row: NodeRow = {
      name,
      internal: name.includes('#'),
      dcOhms: zDc[k].ohms === null ? null : Math.abs(zDc[k].ohms!),
      openAtDc: zDc[k].openAtDc,
      z: z ? { re: z.re, im: z.im, mag: Math.hypot(z.re, z.im), phaseDeg: (Math.atan2(z.im, z.re) * 180) / Math.PI } : null,
      farads: tc[k].farads,
      tau: tc[k].tau,
      poleHz: tc[k].poleHz,
      slowest: tc[k].slowest,
    };
    if (zDc[k].reason) row.note = zDc[k].reason;
    if (zDc[k].ohms !== null && zDc[k].ohms! < 0) row.note = 'negative resistance at DC (|Z| shown)';
    return row;
  });
}

/** Warning for a degenerate DC solution (see DcStatus), naming the unknowns involved. */
export function degenerateDcIssue(sys: Pick<MnaSystem, 'nodeNames' | 'branchNames' | 'nodeCount'>, dc: DcFactor): EngineIssue {
  const names = new Set<string>();
  for (const w of dc.right) {
    w.forEach((v, i) => {
      if (Math.abs(v) > 1e-6) names.add(i < sys.nodeCount ? `node "${sys.nodeNames[i]}"` : `branch "${sys.branchNames[i - sys.nodeCount]}"`);
    });
  }
  const list = [...names].slice(0, 6).join(', ');
  const first = [...names][0]?.match(/node "(.*)"/)?.[1];
  return { severity: 'warning', code: 'singular', ...(first ? { node: first } : {}),
    message: `DC figures are left empty: a repeated pole at s = 0 (e.g. cascaded integrators) or degenerate DC equations${list ? ` (involving ${list})` : ''}` };
}

/** Replace any non-finite number by null (and say where), so the result is JSON-safe. */
export function sanitize<T extends { issues: EngineIssue[] }>(res: T): T {
  const bad: string[] = [];
  const walk = (v: unknown, path: string): unknown => {
    if (typeof v === 'number') {
      if (Number.isFinite(v)) return v;
      bad.push(path);
      return null;
    }
    if (Array.isArray(v)) return v.map((x, i) => walk(x, `${path}[${i}]`));
    if (v && typeof v === 'object') {
      const o = v as Record<string, unknown>;
      for (const k of Object.keys(o)) o[k] = walk(o[k], path ? `${path}.${k}` : k);
      return o;
    }
    return v;
  };
  walk(res, '');
  if (bad.length) {
    res.issues.push({ severity: 'warning', code: 'singular', field: bad[0],
      message: `${bad.length} figure(s) could not be computed and are left empty (first: ${bad[0]})` });
  }
  return res;
}
