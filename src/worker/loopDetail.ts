// What the plots need of the selected loop beyond the feedback result: its key source's return
// ratio T(jω) over the sweep (Bode 1945) and its root locus (engine/feedback/locus.ts). Pure; one
// more request kind of the analysis worker (protocol.ts, scheduler.ts), or on the same thread
// where there is no Worker. Never throws: a failure comes back as a message naming the loop.
import { buildMna, logGrid } from '../engine/index';
import type { Netlist } from '../engine/index';
import { returnRatios, rootLocus } from '../engine/feedback/index';
import type { RootLocus } from '../engine/feedback/index';
import type { Cx } from '../engine/types';

export interface LoopDetailRequest {
  kind: 'loopDetail';
  /** Request number: answers to older requests are dropped by the receiver. */
  id: number;
  netlist: Netlist;
  /** Key source of the loop ("A1.A0"). */
  key: string;
  /** Source ids switched off (factor 0) for this result. */
  offSources: string[];
  fMin: number;
  fMax: number;
  perDecade: number;
  /** What to compute: the loop gain sweep (quick) or the root locus (one QZ per step, slower). */
  part: 'gain' | 'locus';
}

export interface LoopDetail {
  id: number;
  key: string;
  part: 'gain' | 'locus';
  hz: number[];
  /** T(j2πf) per frequency; null where it is undefined. */
  values: (Cx | null)[];
  locus: RootLocus | null;
  /** Why something is missing, naming the loop. */
  message?: string;
}

/** Steps of the locus: enough for smooth branches, bounded so a large stage stays quick. */
const LOCUS_STEPS = 160;

export function computeLoopDetail(req: LoopDetailRequest): LoopDetail {
  const empty: LoopDetail = { id: req.id, key: req.key, part: req.part, hz: [], values: [], locus: null };
  try {
    const built = buildMna(req.netlist);
    if (!built.system) return { ...empty, message: `loop ${req.key}: the circuit does not build (${built.issues.find((i) => i.severity === 'error')?.message ?? 'errors in the drawing'})` };
    const scale: Record<string, number> = {};
    for (const id of req.offSources) scale[id] = 0;
    if (req.part === 'locus') {
      const locus = rootLocus(built.system, req.key, { scale, maxSteps: LOCUS_STEPS });
      return { ...empty, locus, message: locus.message };
    }
    const hz = Array.from(logGrid(req.fMin, req.fMax, req.perDecade));
    const sweep = returnRatios(built.system, { ids: [req.key], freqsHz: hz, scale })[0];
    if (!sweep) return { ...empty, message: `loop ${req.key}: no controlled source of that name in this circuit` };
    const values = sweep.points.map((p) => (p.value && Number.isFinite(p.value.re) && Number.isFinite(p.value.im) ? p.value : null));
    return { ...empty, hz, values, message: sweep.message };
  } catch (e) {
    return { ...empty, message: `loop ${req.key}: ${e instanceof Error ? e.message : String(e)}` };
  }
}
