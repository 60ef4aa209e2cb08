// The selected loop's detail (loopDetail.ts), computed off the main thread when a Worker exists,
// else deferred on the same thread. Only the newest request's answer is kept.
import { useEffect, useRef, useState } from 'react';
import type { Netlist } from '../../engine/index';
import { computeLoopDetail, type LoopDetail, type LoopDetailRequest } from './loopDetail';

export interface LoopDetailAsk {
  netlist: Netlist;
  key: string;
  offSources: string[];
  fMin: number;
  fMax: number;
  perDecade: number;
  part: 'gain' | 'locus';
}

interface Channel { post(req: LoopDetailRequest): void; close(): void }

function openChannel(onAnswer: (d: LoopDetail) => void): Channel {
  if (typeof Worker !== 'undefined') {
    try {
      const w = new Worker(new URL('./loopDetail.worker.ts', import.meta.url), { type: 'module' });
      let broken = false;
      let last: LoopDetailRequest | null = null;
      w.onmessage = (e: MessageEvent<LoopDetail>) => onAnswer(e.data);
      w.onerror = (e) => { e.preventDefault?.(); broken = true; w.terminate(); if (last) onAnswer(computeLoopDetail(last)); };
      return {
        post(req) { last = req; if (broken) setTimeout(() => onAnswer(computeLoopDetail(req)), 0); else w.postMessage(req); },
        close() { w.terminate(); },
      };
    } catch { /* fall through to the same-thread channel */ }
  }
  const timers = new Set<ReturnType<typeof setTimeout>>();
  return {
    post(req) {
      const t = setTimeout(() => { timers.delete(t); onAnswer(computeLoopDetail(req)); }, 0);
      timers.add(t);
    },
    close() { timers.forEach(clearTimeout); timers.clear(); },
  };
}

/** Detail of the asked loop, or null while it is coming (or when nothing is asked). */
export function useLoopDetail(ask: LoopDetailAsk | null): { detail: LoopDetail | null; pending: boolean } {
  const [detail, setDetail] = useState<LoopDetail | null>(null);
  const latest = useRef(0);
  const channel = useRef<Channel | null>(null);
  useEffect(() => () => { channel.current?.close(); channel.current = null; }, []);
  const askKey = ask ? JSON.stringify([ask.key, ask.part, ask.offSources, ask.fMin, ask.fMax, ask.perDecade]) : '';
  const netlist = ask?.netlist;
  useEffect(() => {
    if (!ask) return;
    if (!channel.current) channel.current = openChannel((d) => { if (d.id === latest.current) setDetail(d); });
    latest.current += 1;
    channel.current.post({ id: latest.current, ...ask });
  }, [askKey, netlist]);
  if (!ask) return { detail: null, pending: false };
  const fresh = detail && detail.id === latest.current && detail.key === ask.key && detail.part === ask.part ? detail : null;
  return { detail: fresh, pending: !fresh };
}
