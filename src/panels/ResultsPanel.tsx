// Right-hand results area. The live analysis (poles, node impedances, loops) will be shown here;
// for now it reports whether the drawing builds into an engine netlist.
import type { DrawingNetlist } from '../schematic/toNetlist';

export function ResultsPanel({ analysis }: { analysis: DrawingNetlist }) {
  const nl = analysis.netlist;
  return (
    <section className="results" aria-label="Results">
      <h2>Results</h2>
      {nl ? (
        <p data-testid="netlist-status">
          Netlist ready: {nl.parts.length} part{nl.parts.length === 1 ? '' : 's'}, {analysis.nets.length} net{analysis.nets.length === 1 ? '' : 's'}
          {nl.input ? `, input ${nl.input}` : ', no input marked'}
          {nl.output?.kind === 'voltage' ? `, output at ${nl.output.node}` : ', no output marked'}.
          The pole and impedance readout is not connected to this screen yet.
        </p>
      ) : (
        <p data-testid="netlist-status">Fix the errors listed above to build the netlist.</p>
      )}
    </section>
  );
}
