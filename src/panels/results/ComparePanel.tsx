// Compare mode: pin the current result as A; after any change (a loop switched, a value edited) the
// live result is B. Shows the change of gain and bandwidth, per node |Z| and τ before/after, and the
// poles paired by continuation (minimum total log-distance) with their movement.
import type { AnalysisResult } from '../../engine/index';
import type { PinnedResult } from '../../live/types';
import { compareResults, type FigureChange } from './compareModel';
import { fmtDb, fmtGain, fmtHz, fmtNum, fmtOhms, fmtQ, fmtRatio, fmtSeconds, NONE, toDb } from './format';

export interface ComparePanelProps {
  pinned: PinnedResult | null;
  current: AnalysisResult | null;
  /** Loop labels switched off now (B) — A's are in pinned.settings. */
  offNow: string[];
  offPinned: string[];
  busy: boolean;
  /** Unit of the transfer (V/V, Ω, …); dimensionless gains also get a dB change. */
  gainUnit?: { unit: string; dimensionless: boolean };
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

function poleText(p: { hz: number; q: number | null; kind: string; rhp: boolean } | null) {
  if (!p) return NONE;
  return (
    <>
      {fmtHz(p.hz)}{p.rhp ? <span className="rp-flag"> RHP</span> : null}
      {p.kind === 'complex' ? <span className="rp-q">Q {fmtQ(p.q)}</span> : null}
    </>
  );
}

export function ComparePanel({ pinned, current, offNow, offPinned, busy, gainUnit = { unit: 'V/V', dimensionless: true }, onPin, onClear }: ComparePanelProps) {
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
  const nodes = c ? c.nodes.filter((n) => !n.node.includes('#')) : [];
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
            <thead><tr><th /><th scope="col" className="rp-num">A</th><th scope="col" className="rp-num">B</th><th scope="col" className="rp-num">change</th></tr></thead>
            <tbody>
              <Figure name="Gain" c={c.dcGain} fmt={(v) => (gainUnit.dimensionless ? fmtNum(v) : fmtGain(v, gainUnit.unit))} delta={gainUnit.dimensionless ? gainDb(c.dcGain) : fmtRatio(c.dcGain.ratio)} />
              <Figure name="Bandwidth" c={c.bandwidthHz} fmt={fmtHz} delta={moveText(c.bandwidthHz)} />
              {gainUnit.dimensionless ? <Figure name="Unity gain" c={c.unityGainHz} fmt={fmtHz} delta={moveText(c.unityGainHz)} /> : null}
            </tbody>
          </table>
          <h4 className="rp-sub">Node |Z|{c.frequencyHz.a ? ` at ${fmtHz(c.frequencyHz.a)}` : ' at DC'} and τ</h4>
          <table className="rp-table" aria-label="Node impedance and time constant A and B">
            <thead><tr><th scope="col">Node</th><th scope="col" className="rp-num">A</th><th scope="col" className="rp-num">B</th><th scope="col" className="rp-num">change</th></tr></thead>
            {nodes.map((n) => {
              const z = c.frequencyHz.a ? n.zOhms : n.dcOhms;
              return (
                <tbody key={n.node} className="rp-pair" data-testid="cmp-node" data-node={n.node}>
                  <tr>
                    <th scope="row" rowSpan={2}>{n.node}</th>
                    <td className="rp-num">{fmtOhms(z.a)}</td><td className="rp-num">{fmtOhms(z.b)}</td><td className="rp-num rp-delta">{fmtRatio(z.ratio)}</td>
                  </tr>
                  <tr className="rp-sec">
                    <td className="rp-num">τ {fmtSeconds(n.tau.a)}</td><td className="rp-num">{fmtSeconds(n.tau.b)}</td><td className="rp-num rp-delta">{fmtRatio(n.tau.ratio)}</td>
                  </tr>
                </tbody>
              );
            })}
          </table>
          <h4 className="rp-sub">Poles (paired by nearest path)</h4>
          <table className="rp-table" aria-label="Poles A and B">
            <thead><tr><th scope="col" className="rp-num">A</th><th scope="col" className="rp-num">B</th><th scope="col" className="rp-num">moved</th></tr></thead>
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
