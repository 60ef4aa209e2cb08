// Node table: |Z| to ground at the chosen frequency, node capacitance, τ = R·C and the node's pole
// frequency 1/(2πτ) (the open-circuit time-constant view, Gray & Searle 1969); the slowest node is
// marked. The selected node shows Blackman's factors of the selected loop (Blackman 1943).
import type { AnalysisResult } from '../../engine/index';
import type { BlackmanResult } from '../../engine/feedback/index';
import { fmtFarads, fmtHz, fmtNum, fmtOhms, fmtSeconds, magOf } from './format';

export interface NodeTableProps {
  result: AnalysisResult;
  hoveredNet: string | null;
  selectedNet: string | null;
  onHoverNet: (net: string | null) => void;
  onSelectNet: (net: string | null) => void;
  /** Blackman factors of the selected loop's key (for the selected node's detail line). */
  blackman?: BlackmanResult | null;
  /** Label of the selected loop (detail line). */
  loopLabel?: string | null;
  /** Show macro-internal nodes ("A1#1"). */
  showInternal?: boolean;
}

function BlackmanLine({ b, node, label }: { b: BlackmanResult; node: string; label: string | null }) {
  const row = b.nodes.find((n) => n.node === node);
  if (!row) return null;
  if (row.status !== 'ok') return <div className="rp-detail">{label ?? b.key}: not computable at this node.</div>;
  const at = b.fHz > 0 ? ` at ${fmtHz(b.fHz)}` : ' at DC';
  return (
    <div className="rp-detail" data-testid="blackman-line">
      Loop {label ?? b.key}{at}: Z⁰ {fmtOhms(magOf(row.z0))}, T<sub>sc</sub> {fmtNum(magOf(row.tSc))}, T<sub>oc</sub> {fmtNum(magOf(row.tOc))},
      {' '}factor (1+T<sub>sc</sub>)/(1+T<sub>oc</sub>) = {fmtNum(magOf(row.factor))} → |Z| {fmtOhms(magOf(row.z))}
    </div>
  );
}



export function NodeTable({ result, hoveredNet, selectedNet, onHoverNet, onSelectNet, blackman, loopLabel, showInternal = false }: NodeTableProps) {
  const f = result.conditions.frequencyHz;
  const rows = result.nodes.filter((n) => showInternal || !n.internal);
  const hidden = result.nodes.length - rows.length;
  return (
    <div className="rp-nodes">
      <table className="rp-table" aria-label="Nodes">
        <thead>
          <tr>
            <th scope="col">Node</th>
            <th scope="col" className="rp-num" title="impedance magnitude to ground">|Z| {f ? `@ ${fmtHz(f)}` : '@ DC'}</th>
            <th scope="col" className="rp-num">C</th><th scope="col" className="rp-num">τ</th><th scope="col" className="rp-num" title="1/(2πτ)">f<sub>p</sub></th>
          </tr>
        </thead>
        <tbody>
          {rows.map((n) => {
            const z = f ? n.z?.mag ?? null : n.dcOhms;
            const cls = [n.slowest ? 'slowest' : '', n.name === hoveredNet ? 'lit' : '', n.name === selectedNet ? 'picked' : ''].filter(Boolean).join(' ');
            return [
              <tr key={n.name} className={cls} data-testid="node-row" data-node={n.name} tabIndex={0}
                onMouseEnter={() => onHoverNet(n.name)} onMouseLeave={() => onHoverNet(null)}
                onClick={() => onSelectNet(n.name === selectedNet ? null : n.name)}
                onKeyDown={(e) => { if (e.key === 'Enter') onSelectNet(n.name === selectedNet ? null : n.name); }}
                title={n.note ?? (n.openAtDc ? 'open at DC (no resistive path to ground)' : undefined)}>
                <th scope="row">{n.slowest ? <span className="rp-slow" title="slowest node">◆ </span> : null}{n.name}</th>
                <td className="rp-num" data-testid="node-z">{z === null && n.openAtDc && !f ? 'open' : fmtOhms(z)}</td>
                <td className="rp-num">{fmtFarads(n.farads)}</td>
                <td className="rp-num" data-testid="node-tau">{fmtSeconds(n.tau)}</td>
                <td className="rp-num">{fmtHz(n.poleHz)}</td>
              </tr>,
              n.name === selectedNet && blackman ? (
                <tr key={`${n.name}-detail`} className="rp-detail-row"><td colSpan={5}><BlackmanLine b={blackman} node={n.name} label={loopLabel ?? null} /></td></tr>
              ) : null,
            ];
          })}
        </tbody>
      </table>
      {hidden > 0 ? <p className="rp-note">{hidden} node{hidden > 1 ? 's' : ''} inside amplifier models not listed.</p> : null}
    </div>
  );
}
