// The analysis controls on the sheet's edge: colour legend (log scale, ohms or seconds), the
// colour-mode switch, the frequency of the node impedances, and the busy indicator.
import { useEffect, useState } from 'react';
import type { SchematicAnnotations } from '../export/annotations';
import type { LiveActions, LiveState } from '../live/types';
import { formatFrequency, parseFrequency } from './overlayModel';

/** A run must last this long before the busy indicator shows (a normal update never flashes it). */
export const BUSY_DELAY_MS = 150;

export function AnalysisHud({ state, actions, ann }: { state: LiveState; actions: LiveActions; ann: SchematicAnnotations | null }) {
  // The overlay is behind the drawing only until stage 1 lands; the feedback stage after it has
  // its own quieter mark.
  const busy = useDelayedFlag(state.status === 'busy' && state.stage === 0, BUSY_DELAY_MS);
  const legend = ann?.legend ?? null;
  return (
    <div className="ao-hud" aria-label="Analysis display">
      <div className="ao-hud-row">
        <span className="ao-hud-label">colour by</span>
        <div role="radiogroup" aria-label="Colour wires by" className="ao-seg">
          <button type="button" role="radio" aria-checked={state.settings.colorMode === 'impedance'} onClick={() => actions.setColorMode('impedance')}>|Z|</button>
          <button type="button" role="radio" aria-checked={state.settings.colorMode === 'timeConstant'} onClick={() => actions.setColorMode('timeConstant')}>τ</button>
        </div>
        <FrequencyField hz={state.settings.frequencyHz} onChange={actions.setFrequency} />
      </div>
      {legend && (
        <div className="ao-legend" data-testid="analysis-legend">
          <div className="ao-legend-title">{legend.title}</div>
          <div className="ao-legend-bar" style={{ background: `linear-gradient(to right, ${legend.stops.map((s) => `${s.color} ${(s.t * 100).toFixed(1)}%`).join(', ')})` }} />
          <div className="ao-legend-ticks">
            {legend.stops.filter((_, i, all) => all.length <= 4 || i % 2 === (all.length - 1) % 2).map((s) => <span key={s.label} style={{ left: `${s.t * 100}%`, transform: s.t < 0.05 ? 'none' : s.t > 0.95 ? 'translateX(-100%)' : undefined }}>{s.label}</span>)}
          </div>
          <div className="ao-legend-none"><i style={{ background: legend.noValueColor }} /> {legend.noValueLabel}</div>
        </div>
      )}
      {busy && <div className="ao-busy" aria-live="polite" data-testid="analysis-busy"><span className="ao-spin" /> analysing…</div>}
      {!busy && state.feedbackPending && state.stage === 1 && <div className="ao-busy soft">loops…</div>}
    </div>
  );
}

function FrequencyField({ hz, onChange }: { hz: number; onChange: (hz: number) => void }) {
  const [text, setText] = useState(formatFrequency(hz));
  const [bad, setBad] = useState(false);
  useEffect(() => { setText(formatFrequency(hz)); setBad(false); }, [hz]);
  const commit = () => {
    const f = parseFrequency(text);
    if (f === null) { setBad(true); return; }
    setBad(false);
    onChange(f);
  };
  return (
    <label className="ao-freq">
      <span className="ao-hud-label">at</span>
      <input
        aria-label="Frequency of the node impedances" value={text} aria-invalid={bad}
        title={bad ? 'Give a frequency ≥ 0 such as DC, 100k or 2.5 MHz' : 'Frequency of the node impedances (DC, 100k, 2.5 MHz …)'}
        onChange={(e) => setText(e.target.value)} onBlur={commit}
        onKeyDown={(e) => { if (e.key === 'Enter') commit(); if (e.key === 'Escape') setText(formatFrequency(hz)); e.stopPropagation(); }}
      />
      <button type="button" className="ao-dc" onClick={() => onChange(0)} disabled={hz === 0}>DC</button>
      {bad && <span className="ao-freq-bad" aria-live="assertive">not a frequency</span>}
    </label>
  );
}

function useDelayedFlag(on: boolean, ms: number): boolean {
  const [shown, setShown] = useState(false);
  useEffect(() => {
    if (!on) { setShown(false); return; }
    const t = setTimeout(() => setShown(true), ms);
    return () => clearTimeout(t);
  }, [on, ms]);
  return shown;
}
