// Right-hand results area: the live analysis (poles, node table, loops, A/B compare, plots) from the
// analysis store (src/live). Without a store (no live analysis wired) it reports whether the drawing
// builds into an engine netlist.
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

function ConnectedResults({ store, initialTab }: { store: LiveStore; initialTab?: ResultsTab }) {
  const { state, actions } = useAnalysis(store);
  return <LiveResults state={state} actions={actions} initialTab={initialTab} />;
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
