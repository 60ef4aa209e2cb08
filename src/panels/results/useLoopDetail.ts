// The selected loop's detail (src/worker/loopDetail.ts), asked of the live store, which hands the
// request to the analysis worker (or computes it on the same thread where there is none). Only
// the answer to the newest ask is shown.
import { useEffect, useRef } from 'react';
import type { LoopDetail } from '../../worker/loopDetail';
import type { LoopDetailAsk } from '../../live/types';

export type { LoopDetailAsk };

/** Detail of the asked loop, or null while it is coming (or when nothing is asked). */
export function useLoopDetail(
  ask: LoopDetailAsk | null, answer: LoopDetail | null, askLoopDetail: (ask: LoopDetailAsk) => number,
): { detail: LoopDetail | null; pending: boolean } {
  const latest = useRef(0);
  const askKey = ask ? JSON.stringify([ask.key, ask.part, ask.offSources, ask.fMin, ask.fMax, ask.perDecade]) : '';
  const netlist = ask?.netlist;
  useEffect(() => {
    if (!ask) return;
    latest.current = askLoopDetail(ask);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [askKey, netlist, askLoopDetail]);
  if (!ask) return { detail: null, pending: false };
  const fresh = answer && answer.id === latest.current && answer.key === ask.key && answer.part === ask.part ? answer : null;
  return { detail: fresh, pending: !fresh };
}
