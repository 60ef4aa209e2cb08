// Performance measures of the live path (User Timing, W3C), named "ps:<step>": netlist, the
// worker's stages (their compute time as the worker reports it), waiting for stage 1, applying a
// message, annotate, render. Off unless globalThis.POLESKETCH_PERF is true (the browser bench sets
// it), so a normal session leaves no entries in the performance timeline.
const perf = typeof performance !== 'undefined' && typeof performance.measure === 'function' ? performance : null;
const enabled = () => perf !== null && (globalThis as { POLESKETCH_PERF?: unknown }).POLESKETCH_PERF === true;

export const perfNow = (): number => (perf ? perf.now() : Date.now());

/** Record step `name` from `start` to `end` (performance.now() times). */
export function perfMeasure(name: string, start: number, end = perfNow()): void {
  if (!enabled()) return;
  try {
    perf!.measure(`ps:${name}`, { start, end: Math.max(start, end) });
  } catch { /* an old timeline API: no measure */ }
}

/** Record a duration measured elsewhere (e.g. inside the worker), ending now. */
export function perfDuration(name: string, ms: number | undefined): void {
  if (ms === undefined || !Number.isFinite(ms)) return;
  const end = perfNow();
  perfMeasure(name, end - ms, end);
}

/** A time of another thread (performance.timeOrigin + now() there) on this thread's clock. */
export const fromEpoch = (t: number): number => t - (perf?.timeOrigin ?? 0);

/** When the newest edit reached the store and its stage-1 result arrived on this thread (for the
 *  render measures). */
export const arrivals = { edit: 0, stage1: 0 };
