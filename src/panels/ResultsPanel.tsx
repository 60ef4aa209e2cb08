// Right-hand results area: the live analysis (poles, node table, loops, A/B compare, plots) from the
// analysis store (src/live). Without a store (no live analysis wired) it reports whether the drawing
// builds into an engine netlist.
import { memo, useDeferredValue } from 'react';
import type { DrawingNetlist } from '../schematic/toNetlist';
import type { LiveStore } from '../live/types';
import { useAnalysis } from '../live/useAnalysis';
import { LiveResults, type ResultsTab } from './results/LiveResults';

export interface ResultsPanelProps {
  /** The live analysis store; when absent, the netlist status of `analysis` is shown. */
  store?: LiveStore;
  analysis?: DrawingNetlist;
  initialTab?: ResultsTab;
}

const MemoResults = memo(LiveResults);

// The panel follows the store at a lower priority than the canvas: React renders a new state here
// after the overlay has taken it (in slices between frames), so the tables of a new result never
// hold back the frame that shows it on the drawing.
function ConnectedResults({ store, initialTab }: { store: LiveStore; initialTab?: ResultsTab }) {
  const { state, actions } = useAnalysis(store);
  const shown = useDeferredValue(state);
  return <MemoResults state={shown} actions={actions} initialTab={initialTab} />;
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
