// The results area fed by the live analysis store: a summary line (gain, bandwidth, unity gain,
// busy mark), then tabs of our own: Poles, Nodes, Loops, Compare, Plots.
import { useMemo, useRef, useState } from 'react';
import type { LiveActions, LiveState } from '../../live/types';
import { PolesList } from './PolesList';
import { NodeTable } from './NodeTable';
import { LoopsList } from './LoopsList';
import { ComparePanel } from './ComparePanel';
import { PlotsPanel } from './PlotsPanel';
import { groupOf, loopGroups } from './loopRows';
import { gainUnit, transferLabel } from './plotInputs';
import { fmtDb, fmtGain, fmtHz, fmtNum, toDb } from './format';
import './results.css';

export type ResultsTab = 'poles' | 'nodes' | 'loops' | 'compare' | 'plots';
const TABS: [ResultsTab, string][] = [['poles', 'Poles'], ['nodes', 'Nodes'], ['loops', 'Loops'], ['compare', 'A/B'], ['plots', 'Plots']];

export interface LiveResultsProps {
  state: LiveState;
  actions: LiveActions;
  initialTab?: ResultsTab;
}

function labelsOf(state: LiveState, ids: string[]): string[] {
  return [...new Set(ids.map((id) => state.loops[id]?.label ?? id))];
}

export function LiveResults({ state, actions, initialTab = 'poles' }: LiveResultsProps) {
  const [tab, setTab] = useState<ResultsTab>(initialTab);
  const { result, settings } = state;
  const offSources = settings.offLoopIds.map((id) => state.loops[id]?.key).filter((k): k is string => !!k);
  // While the feedback stage of a new run is coming, the last loops stay listed (dimmed) so the
  // list does not flicker; loops just switched off are left out of that stale list.
  const lastFeedback = useRef(state.feedback);
  if (state.feedback) lastFeedback.current = state.feedback;
  if (!state.feedbackPending && !state.feedback) lastFeedback.current = null;
  const stale = !state.feedback && state.feedbackPending && lastFeedback.current !== null;
  const feedback = state.feedback ?? (stale ? lastFeedback.current : null);
  const allGroups = useMemo(() => loopGroups(feedback), [feedback]);
  const groups = stale ? allGroups.filter((g) => !offSources.includes(g.key)) : allGroups;
  const selGroup = groupOf(groups, settings.selectedLoopId);
  const selEntry = settings.selectedLoopId ? state.loops[settings.selectedLoopId] : undefined;
  const errors = state.issues.filter((i) => i.severity === 'error');
  // Engine warnings about the figures themselves (e.g. poles double precision cannot place).
  const warnings = result?.issues.filter((i) => i.severity === 'warning') ?? [];
  const busy = state.status === 'busy';

  let body: React.ReactNode;
  // A failure of one stage (e.g. the feedback analysis) leaves the other stage's figures valid.
  const failure = state.failure ? <p className="rp-error" aria-live="assertive" data-testid="results-failure">Part of the analysis could not run: {state.failure}</p> : null;
  if (state.failure && (!result || !result.ok)) {
    body = failure;
  } else if (!result || !result.ok) {
    body = errors.length ? (
      <div aria-live="assertive" className="rp-error" data-testid="results-errors">
        <p>No results until the drawing is fixed:</p>
        <ul>{errors.slice(0, 6).map((i, k) => <li key={k}>{i.message}</li>)}</ul>
        {errors.length > 6 ? <p>… and {errors.length - 6} more (see Drawing checks).</p> : null}
      </div>
    ) : <p className="rp-empty" data-testid="results-waiting">{busy ? 'Analysing…' : 'Draw a circuit, mark its input source and output to see its poles and node impedances.'}</p>;
  } else {
    const gu = gainUnit(state.netlist, result);
    const g = result.dcGain;
    const gainText = g === null ? '—' : gu.dimensionless ? `${fmtNum(g)} ${gu.unit} (${fmtDb(toDb(g))})` : fmtGain(g, gu.unit);
    body = (
      <>
        {failure}
        <dl className="rp-summary" data-testid="results-summary">
          <dt title="the chosen input and output">{transferLabel(result)}</dt><dd data-testid="dc-gain">{gainText}</dd>
          <dt>−3 dB bandwidth</dt><dd>{fmtHz(result.bandwidthHz)}</dd>
          {gu.dimensionless ? <><dt>unity-gain frequency</dt><dd>{fmtHz(result.unityGainHz)}</dd></> : null}
        </dl>
        {warnings.length ? (
          <ul className="rp-warnings" data-testid="results-warnings" aria-label="Notes on these results">
            {warnings.slice(0, 4).map((w, k) => <li key={k} title={w.message}>⚠ {w.message}</li>)}
          </ul>
        ) : null}
        <div className="rp-tabs" role="tablist" aria-label="Results">
          {TABS.map(([k, text]) => (
            <button key={k} type="button" role="tab" aria-selected={k === tab} onClick={() => setTab(k)}>
              {text}
              {k === 'loops' && groups.length ? <span className="rp-count"> {groups.length}</span> : null}
              {k === 'loops' && groups.some((x) => x.warnings.length) ? <span className="rp-flag" title="a loop has a warning"> ⚠</span> : null}
              {k === 'compare' && state.pinnedA ? <span className="rp-count"> on</span> : null}
            </button>
          ))}
        </div>
        <div className="rp-tab" role="tabpanel">
          {tab === 'poles' && (
            <PolesList result={result} hoveredPoleIndex={settings.hoveredPoleIndex} hoveredNet={settings.hoveredNet}
              onHoverPole={actions.hoverPole} onPickNet={(n) => actions.selectNet(n)} />
          )}
          {tab === 'nodes' && (
            <NodeTable result={result} hoveredNet={settings.hoveredNet} selectedNet={settings.selectedNet}
              onHoverNet={actions.hoverNet} onSelectNet={actions.selectNet}
              blackman={selGroup ? state.blackman[selGroup.key] ?? null : null} loopLabel={selGroup?.label ?? null} />
          )}
          {tab === 'loops' && (
            <LoopsList stale={stale} groups={groups} known={state.loops} offLoopIds={settings.offLoopIds} selectedLoopId={settings.selectedLoopId}
              pending={state.feedbackPending} onSelect={actions.selectLoop} onSetEnabled={actions.setLoopEnabled} notes={feedback?.notes}
              onCompareOff={(id) => { actions.pinA(); actions.setLoopEnabled(id, false); setTab('compare'); }} />
          )}
          {tab === 'compare' && (
            <ComparePanel pinned={state.pinnedA} current={result} busy={busy} gainUnit={gu} onPin={actions.pinA} onClear={actions.clearPin}
              offNow={labelsOf(state, settings.offLoopIds)} offPinned={labelsOf(state, state.pinnedA?.settings.offLoopIds ?? [])} />
          )}
          {tab === 'plots' && (
            <PlotsPanel result={result} feedback={state.feedback} netlist={state.netlist} offSources={offSources}
              loop={selGroup ? { key: selGroup.key, label: selGroup.label } : selEntry ? { key: selEntry.key, label: selEntry.label } : null}
              node={settings.selectedNet} onSelectNet={actions.selectNet} pinned={state.pinnedA?.result ?? null} feedbackPending={state.feedbackPending}
              loopDetail={state.loopDetail} askLoopDetail={actions.askLoopDetail} />
          )}
        </div>
      </>
    );
  }
  return (
    <section className="results rp" aria-label="Results" aria-busy={busy} data-run={state.runId} data-stage={state.stage}>
      <h2>Results {busy ? <span className="rp-busy" aria-live="polite" aria-label="analysing">analysing…</span> : null}</h2>
      {body}
    </section>
  );
}
