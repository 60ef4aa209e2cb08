// Loop list: one entry per loop as broken at its key source, with what it holds in words and
// numbers, DC loop gain T(0), unity-gain frequency, phase and gain margin (Bode 1945), warnings,
// an on/off switch, and the cycles through that key (selecting one draws its path on the sheet).
import type { LoopEntry } from '../../live/types';
import { fmtDb, fmtDeg, fmtHz, fmtNum } from './format';
import type { LoopGroup } from './loopRows';

export interface LoopsListProps {
  groups: LoopGroup[];
  /** Every loop seen for this drawing (also the switched-off ones, absent from `groups`). */
  known: Record<string, LoopEntry>;
  offLoopIds: string[];
  selectedLoopId: string | null;
  /** The feedback stage of the current run is still coming. */
  pending: boolean;
  onSelect: (id: string | null) => void;
  onSetEnabled: (id: string, enabled: boolean) => void;
  /** Pin the present result as A and switch the loop off (B), to see what it does. */
  onCompareOff?: (id: string) => void;
  /** The groups are from the previous run (the new feedback stage is still coming). */
  stale?: boolean;
  /** Notes of the loop search (e.g. the list was cut). */
  notes?: string[];
}

interface OffGroup { key: string; label: string; ids: string[]; nets: string[] }

/** Switched-off loops grouped by their key (they share it, so they come back on together). */
function offGroups(known: Record<string, LoopEntry>, offIds: string[], present: Set<string>): OffGroup[] {
  const m = new Map<string, OffGroup>();
  for (const id of offIds) {
    const e = known[id];
    const key = e?.key ?? id;
    if (present.has(key)) continue;
    const g = m.get(key) ?? { key, label: e?.label ?? id, ids: [], nets: e?.nets ?? [] };
    g.ids.push(id);
    m.set(key, g);
  }
  return [...m.values()];
}

function Switch({ on, label, onChange }: { on: boolean; label: string; onChange: (on: boolean) => void }) {
  return (
    <button type="button" role="switch" aria-checked={on} aria-label={`${label} ${on ? 'on' : 'off'}`} className={`rp-switch${on ? ' on' : ''}`}
      onClick={(e) => { e.stopPropagation(); onChange(!on); }}>
      <span className="rp-knob" />{on ? 'on' : 'off'}
    </button>
  );
}

export function LoopsList({ groups, known, offLoopIds, selectedLoopId, pending, onSelect, onSetEnabled, onCompareOff, stale = false, notes = [] }: LoopsListProps) {
  const present = new Set(groups.map((g) => g.key));
  const off = offGroups(known, offLoopIds, present);
  if (!groups.length && !off.length) {
    return <p className="rp-empty" data-testid="loops-empty">{pending ? 'Looking for feedback loops…' : 'No feedback loop with a loop gain above 1 % was found.'}</p>;
  }
  return (
    <div className={`rp-loops${stale ? ' stale' : ''}`} aria-busy={pending}>
      {groups.map((g) => {
        const selected = g.cycles.some((c) => c.id === selectedLoopId);
        return (
          <section key={g.key} className={`rp-loop${selected ? ' picked' : ''}${g.warnings.length ? ' warn' : ''}`} data-testid="loop-item" data-key={g.key}>
            <header className="rp-loop-head">
              <button type="button" className="rp-loop-name" aria-pressed={selected}
                onClick={() => onSelect(selected ? null : g.primaryId)} title="Draw this loop on the schematic">
                {g.label}
              </button>
              <span className="rp-key" title="where the loop is broken (its key source)">at {g.key}</span>
              <Switch on label={`Loop ${g.label}`} onChange={(on) => onSetEnabled(g.primaryId, on)} />
            </header>
            <p className="rp-holds" data-testid="loop-holds">
              {g.holds.length ? g.holds.join('; ') : 'changes no node impedance by more than ×/÷ 1.5'}
              {g.holdsAtHz > 0 ? ` (at ${fmtHz(g.holdsAtHz)})` : ' (at DC)'}
            </p>
            <dl className="rp-figs">
              <div><dt>T(0)</dt><dd>{fmtNum(g.dcLoopGain)}</dd></div>
              <div><dt>f<sub>u</sub></dt><dd>{fmtHz(g.unityGainHz)}</dd></div>
              <div className={g.phaseMarginDeg !== null && g.phaseMarginDeg < 45 ? 'bad' : ''}><dt>PM</dt><dd>{fmtDeg(g.phaseMarginDeg)}</dd></div>
              <div className={g.gainMarginDb !== null && g.gainMarginDb < 6 ? 'bad' : ''}><dt>GM</dt><dd>{g.gainMarginDb === null && g.phaseMarginDeg !== null ? '∞' : fmtDb(g.gainMarginDb)}</dd></div>
            </dl>
            {g.marginNote ? <p className="rp-note">{g.marginNote}</p> : null}
            {g.warnings.map((w, i) => <p key={i} className="rp-warn" role="note">⚠ {w}</p>)}
            {g.dcLoopGain === 0 && g.band ? (
              <p className="rp-note" data-testid="loop-open-at-dc">
                No loop gain at DC; active from {fmtHz(g.band.fromHz)}{g.band.toHz !== null ? ` to ${fmtHz(g.band.toHz)}` : ' upward'}.
                {g.holds.length && g.holdsAtHz === 0
                  ? ' The DC impedance factor still holds: with the port shorted the loop closes (Blackman: Z = Z⁰·(1 + T_sc)/(1 + T_oc), T_oc = 0 here).'
                  : null}
              </p>
            ) : null}
            {g.booster && g.booster.ok ? (
              <p className="rp-note" title={g.booster.verdict}>
                Booster placement fits: f<sub>u</sub> {fmtHz(g.booster.boosterUnityGainHz)} lies between the closed-loop bandwidth {fmtHz(g.booster.mainBandwidthHz)} and the non-dominant pole {fmtHz(g.booster.mainNonDominantHz)}.
              </p>
            ) : null}
            {onCompareOff ? (
              <button type="button" className="rp-btn rp-what" onClick={() => onCompareOff(g.primaryId)}
                title="Pin the present result as A, switch this loop off and compare">What does it do? Compare with it off</button>
            ) : null}
            {g.cycles.length > 1 ? (
              <ul className="rp-cycles" aria-label={`Paths through ${g.key}`}>
                {g.cycles.map((c) => (
                  <li key={c.id}>
                    <button type="button" aria-pressed={c.id === selectedLoopId} className="rp-cycle" onClick={() => onSelect(c.id === selectedLoopId ? null : c.id)}
                      title={`${c.kind} loop through ${c.nets.join(' → ') || 'internal nodes'}`}>
                      {c.members.join(' → ')}
                    </button>
                  </li>
                ))}
              </ul>
            ) : <p className="rp-members">{g.cycles[0].members.join(' → ')}</p>}
          </section>
        );
      })}
      {off.map((g) => (
        <section key={g.key} className="rp-loop off" data-testid="loop-item" data-key={g.key}>
          <header className="rp-loop-head">
            <span className="rp-loop-name">{g.label}</span>
            <span className="rp-key">at {g.key}</span>
            <Switch on={false} label={`Loop ${g.label}`} onChange={() => g.ids.forEach((id) => onSetEnabled(id, true))} />
          </header>
          <p className="rp-note">Switched off: {g.key} is set to zero, so the loop is broken{g.nets.length ? ` (through ${g.nets.join(', ')})` : ''}.</p>
        </section>
      ))}
      {pending ? <p className="rp-note">Updating loops…</p> : null}
      {notes.map((n, i) => <p key={i} className="rp-note">{n}</p>)}
    </div>
  );
}
