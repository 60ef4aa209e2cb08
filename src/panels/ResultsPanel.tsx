// Right-hand results area: the live analysis (poles, node table, loops, A/B compare, plots) from the
// analysis store (src/live). Without a store (no live analysis wired) it reports whether the drawing
// builds into an engine netlist.
import { memo, startTransition, useEffect, useRef, useState } from 'react';
import { BUSY_DELAY_MS } from '../canvas/AnalysisHud';
import type { DrawingNetlist } from '../schematic/toNetlist';
import type { LiveState, LiveStore } from '../live/types';
import { useAnalysis } from '../live/useAnalysis';
import { LiveResults, type ResultsTab } from './results/LiveResults';

export interface ResultsPanelProps {
  /** The live analysis store; when absent, the netlist status of `analysis` is shown. */
  store?: LiveStore;
  analysis?: DrawingNetlist;
  initialTab?: ResultsTab;
}

const MemoResults = memo(LiveResults);

// The panel follows the store one frame behind the canvas: a new state is rendered here after the
// next frame (as a transition, in slices), so the tables of a new result never hold back the
// frame that shows it on the drawing. A run still waiting for its stage 1 is shown
// only once it has lasted BUSY_DELAY_MS (as the canvas's busy mark): a quick run goes from the
// last result straight to the new one, without a render of the panel at the edit itself.
function ConnectedResults({ store, initialTab }: { store: LiveStore; initialTab?: ResultsTab }) {
  const { state, actions } = useAnalysis(store);
  const waiting = state.status === 'busy' && state.stage === 0;
  const lastSettled = useRef(state);
  if (!waiting) lastSettled.current = state;
  const [slowRun, setSlowRun] = useState<number | null>(null);
  useEffect(() => {
    if (!waiting) return;
    const t = setTimeout(() => setSlowRun(state.runId), BUSY_DELAY_MS);
    return () => clearTimeout(t);
  }, [waiting, state.runId]);
  const shown = useAfterNextFrame(waiting && slowRun !== state.runId ? lastSettled.current : state);
  return <MemoResults state={shown} actions={actions} initialTab={initialTab} />;
}

/** The state to show: a new result (or status) as of one frame ago — taken after the next frame
 *  has been drawn (at once where there are no frames); a newer one before then replaces it. A
 *  change of the settings alone (hover, selection, tab-driven asks) is shown at once. */
function useAfterNextFrame(state: LiveState): LiveState {
  const [lagged, setLagged] = useState(state);
  const sameFigures = state.result === lagged.result && state.feedback === lagged.feedback && state.status === lagged.status
    && state.stage === lagged.stage && state.loopDetail === lagged.loopDetail && state.pinnedA === lagged.pinnedA;
  useEffect(() => {
    if (sameFigures || Object.is(state, lagged)) return;
    const take = () => startTransition(() => setLagged(state));
    if (typeof requestAnimationFrame !== 'function') { take(); return; }
    let timer: ReturnType<typeof setTimeout> | null = null;
    const frame = requestAnimationFrame(() => { timer = setTimeout(take, 0); });
    return () => { cancelAnimationFrame(frame); if (timer !== null) clearTimeout(timer); };
  }, [state, lagged, sameFigures]);
  return sameFigures ? state : lagged;
}

export function ResultsPanel({ store, analysis, initialTab }: ResultsPanelProps) {
  if (store) return <ConnectedResults store={store} initialTab={initialTab} />;
  const nl = analysis?.netlist;
  return (
    <section className="results" aria-label="Results">
      <h2>Results</h2>
      {nl && analysis ? (
        <p data-testid="netlist-status">
          Netlist ready: {nl.parts.length} part{nl.parts.length === 1 ? '' : 's'}, {analysis.nets.length} net{analysis.nets.length === 1 ? '' : 's'}
          {nl.input ? `, input ${nl.input}` : ', no input marked'}
          {nl.output?.kind === 'voltage' ? `, output at ${nl.output.node}` : ', no output marked'}.
        </p>
      ) : (
        <p data-testid="netlist-status">Fix the errors listed above to build the netlist.</p>
      )}
    </section>
  );
}
