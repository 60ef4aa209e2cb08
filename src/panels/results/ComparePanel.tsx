// Compare mode: pin the current result as A; after any change (a loop switched, a value edited) the
// live result is B. Shows the change of gain and bandwidth, per node |Z| and τ before/after, and the
// poles paired by continuation (minimum total log-distance) with their movement.
import type { AnalysisResult } from '../../engine/index';
import type { PinnedResult } from '../../live/types';
import { compareResults, type FigureChange } from './compareModel';
import { fmtDb, fmtGain, fmtHz, fmtOhms, fmtQ, fmtRatio, fmtSeconds, NONE, toDb } from './format';

export interface ComparePanelProps {
  pinned: PinnedResult | null;
  current: AnalysisResult | null;
  /** Loop labels switched off now (B) — A's are in pinned.settings. */
  offNow: string[];
  offPinned: string[];
  busy: boolean;
  onPin: () => void;
  onClear: () => void;
}

function moveText(c: FigureChange): string {
  return fmtRatio(c.ratio);
}

function gainDb(c: FigureChange): string {
  const a = toDb(c.a), b = toDb(c.b);
  return a !== null && b !== null ? `${b - a >= 0 ? '+' : '−'}${fmtDb(Math.abs(b - a))}` : NONE;
}

function Figure({ name, c, fmt, delta }: { name: string; c: FigureChange; fmt: (v: number | null) => string; delta: string }) {
  return (
    <tr>
      <th scope="row">{name}</th>
      <td className="rp-num" data-testid={`cmp-${name}-a`}>{fmt(c.a)}</td>
      <td className="rp-num" data-testid={`cmp-${name}-b`}>{fmt(c.b)}</td>
      <td className="rp-num rp-delta">{delta}</td>
    </tr>
  );
}

const poleText = (p: { hz: number; q: number | null; kind: string; rhp: boolean } | null) =>
  p ? `${fmtHz(p.hz)}${p.kind === 'complex' ? ` Q ${fmtQ(p.q)}` : ''}${p.rhp ? ' RHP' : ''}` : NONE;

export function ComparePanel({ pinned, current, offNow, offPinned, busy, onPin, onClear }: ComparePanelProps) {
  if (!pinned) {
    return (
      <div className="rp-compare" data-testid="compare">
        <p className="rp-note">Pin the present result as A, then change a value or switch a loop: the new result is shown as B beside it.</p>
        <button type="button" className="rp-btn" onClick={onPin} disabled={!current?.ok}>Pin as A</button>
      </div>
    );
  }
  const a = pinned.result;
  const same = current !== null && pinned.result === current;
  const c = current && current.ok && a.ok ? compareResults(a, current) : null;
  const dcUnit = '';
  return (
    <div className="rp-compare" data-testid="compare">
      <div className="rp-row">
        <span className="rp-ab"><b>A</b> pinned{offPinned.length ? ` (off: ${offPinned.join(', ')})` : ''}</span>
        <span className="rp-ab"><b>B</b> now{offNow.length ? ` (off: ${offNow.join(', ')})` : ''}{busy ? ' — updating…' : ''}</span>
        <button type="button" className="rp-btn" onClick={onPin} title="Pin the present result as the new A">Re-pin</button>
        <button type="button" className="rp-btn" onClick={onClear}>End compare</button>
      </div>
      {!c ? (
        <p className="rp-empty">{current && !current.ok ? 'B has errors (see the drawing checks); nothing to compare.' : 'Waiting for the result B…'}</p>
      ) : (
        <>
          {same ? <p className="rp-note">B is still the pinned result: change a value or switch a loop.</p> : null}
          <table className="rp-table" aria-label="Gain and bandwidth A and B">
            <thead><tr><th /><th scope="col">A</th><th scope="col">B</th><th scope="col">change</th></tr></thead>
            <tbody>
              <Figure name="Gain" c={c.dcGain} fmt={(v) => fmtGain(v, dcUnit)} delta={gainDb(c.dcGain)} />
              <Figure name="Bandwidth" c={c.bandwidthHz} fmt={fmtHz} delta={moveText(c.bandwidthHz)} />
              <Figure name="Unity gain" c={c.unityGainHz} fmt={fmtHz} delta={moveText(c.unityGainHz)} />
            </tbody>
          </table>
          <h4 className="rp-sub">Nodes{c.frequencyHz.a ? ` (|Z| at ${fmtHz(c.frequencyHz.a)})` : ' (|Z| at DC)'}</h4>
          <table className="rp-table" aria-label="Node impedance and time constant A and B">
            <thead><tr><th scope="col">Node</th><th scope="col">|Z| A</th><th scope="col">|Z| B</th><th scope="col">τ A → B</th></tr></thead>
            <tbody>
              {c.nodes.filter((n) => !n.node.includes('#')).map((n) => {
                const z = c.frequencyHz.a ? n.zOhms : n.dcOhms;
                return (
                  <tr key={n.node} data-testid="cmp-node" data-node={n.node}>
                    <th scope="row">{n.node}</th>
                    <td className="rp-num">{fmtOhms(z.a)}</td>
                    <td className="rp-num" title={fmtRatio(z.ratio)}>{fmtOhms(z.b)} <span className="rp-delta">{fmtRatio(z.ratio)}</span></td>
                    <td className="rp-num">{fmtSeconds(n.tau.a)} → {fmtSeconds(n.tau.b)}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          <h4 className="rp-sub">Poles (paired by nearest path)</h4>
          <table className="rp-table" aria-label="Poles A and B">
            <thead><tr><th scope="col">A</th><th scope="col">B</th><th scope="col">moved</th></tr></thead>
            <tbody>
              {c.poles.map((p, i) => (
                <tr key={i} data-testid="cmp-pole">
                  <td className="rp-num">{poleText(p.a)}</td>
                  <td className="rp-num">{poleText(p.b)}</td>
                  <td className="rp-num rp-delta">{p.a && p.b ? fmtRatio(p.ratio) : p.a ? 'gone' : 'new'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </div>
  );
}
