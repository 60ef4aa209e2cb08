// Every exact pole (Hz, Q) with the nodes that carry it; hovering a row lights those nets on the
// canvas (through the store), and a hovered net lights the rows it carries. Zeros follow, compact.
import { useState } from 'react';
import type { AnalysisResult, Zero } from '../../engine/index';
import { fmtHz, fmtQ } from './format';
import { poleKindText, poleRows } from './poleRows';

export interface PolesListProps {
  result: AnalysisResult;
  hoveredPoleIndex: number | null;
  hoveredNet: string | null;
  onHoverPole: (index: number | null) => void;
  onPickNet?: (net: string) => void;
}

const pct = (x: number) => `${Math.round(x * 100)} %`;

/** Rows shown before "show all" (the slowest poles matter most to a designer). */
export const POLES_SHOWN = 10;

function zeroQ(z: Zero): number | null {
  if (z.im === 0 || z.re === 0) return null;
  return Math.hypot(z.re, z.im) / (2 * Math.abs(z.re));
}

export function PolesList({ result, hoveredPoleIndex, hoveredNet, onHoverPole, onPickNet }: PolesListProps) {
  const [all, setAll] = useState(false);
  const allRows = poleRows(result.poles, result.participation);
  const rows = all ? allRows : allRows.slice(0, POLES_SHOWN);
  const zeros = result.zeros.filter((z) => z.im >= 0);
  if (!allRows.length) {
    return <p className="rp-empty" data-testid="poles-empty">{result.reasons.poles ?? 'No finite poles: the circuit has no capacitance or inductance that sets a time constant.'}</p>;
  }
  return (
    <div className="rp-poles">
      <table className="rp-table" aria-label="Poles">
        <thead>
          <tr><th scope="col">#</th><th scope="col" className="rp-num">Frequency</th><th scope="col" className="rp-num">Q</th><th scope="col">Carried by</th></tr>
        </thead>
        <tbody>
          {rows.map((r, k) => {
            const lit = (hoveredPoleIndex !== null && r.indices.includes(hoveredPoleIndex)) || (hoveredNet !== null && r.carriers.some((c) => c.node === hoveredNet));
            const cls = [lit ? 'lit' : '', r.pole.rhp ? 'rhp' : '', k === 0 ? 'dominant' : ''].filter(Boolean).join(' ');
            return (
              <tr key={r.id} className={cls} data-testid="pole-row" data-pole-index={r.index}
                onMouseEnter={() => onHoverPole(r.index)} onMouseLeave={() => onHoverPole(null)}
                onFocus={() => onHoverPole(r.index)} onBlur={() => onHoverPole(null)} tabIndex={0}
                title={`${poleKindText(r.pole)}; s = ${r.pole.re.toExponential(3)}${r.pole.im ? ` ± j${Math.abs(r.pole.im).toExponential(3)}` : ''} rad/s`}>
                <td className="rp-idx">{r.indices.length > 1 ? `${k + 1}±` : k + 1}</td>
                <td className="rp-num" data-testid="pole-hz">{fmtHz(r.pole.hz)}{r.pole.rhp ? <span className="rp-flag" title="right half-plane: unstable about this bias point"> RHP</span> : null}</td>
                <td className="rp-num">{r.pole.kind === 'complex' ? fmtQ(r.pole.q) : ''}</td>
                <td className="rp-carriers">
                  {r.carriers.map((c) => (
                    <button key={c.node} type="button" className={`rp-net${c.node === hoveredNet ? ' lit' : ''}`} onClick={() => onPickNet?.(c.node)} title={`${c.node} carries ${pct(c.share)} of this pole`}>
                      {c.node}<span className="rp-share"> {pct(c.share)}</span>
                    </button>
                  ))}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {allRows.length > POLES_SHOWN ? (
        <button type="button" className="rp-btn" onClick={() => setAll((a) => !a)}>
          {all ? `Show the ${POLES_SHOWN} slowest` : `Show all ${allRows.length} poles`}
        </button>
      ) : null}
      {result.poleInfo.originCount > 0 ? <p className="rp-note">{result.poleInfo.originCount} pole{result.poleInfo.originCount > 1 ? 's' : ''} at s = 0 (ideal integrator).</p> : null}
      <p className="rp-zeros" data-testid="zeros">
        <span className="rp-label">Zeros </span>
        {zeros.length === 0
          ? (result.reasons.zeros ?? 'none finite')
          : zeros.map((z, i) => (
            <span key={i} className={`rp-zero${z.rhp ? ' rhp' : ''}${z.cancelsPole ? ' faint' : ''}`}>
              {i > 0 ? ', ' : ''}{fmtHz(z.hz)}{z.im > 0 ? ` (pair, Q ${fmtQ(zeroQ(z))})` : ''}{z.rhp ? ' RHP' : ''}{z.cancelsPole ? ' (cancels a pole)' : ''}
            </span>
          ))}
      </p>
    </div>
  );
}
