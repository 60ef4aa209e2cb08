// Plots of the live result, one at a time in the side panel (drawn at the panel's size so the
// text stays readable) with a larger view on demand: Bode of the chosen input → output, the
// selected loop's T(jω) with margins, |Z| of a node against frequency, the s-plane with the
// selected loop's root locus and A/B arrows, and the step response with its settling marks.
import { useMemo, useState } from 'react';
import type { AnalysisResult, Netlist } from '../../engine/index';
import type { FeedbackResult } from '../../engine/feedback/index';
import { BodePlot, ImpedancePlot, LoopGainPlot, SplanePlot, StepPlot } from '../../plots/index';
import { downloadText } from '../../export/browserExport';
import { useLoopDetail, type LoopDetailAsk } from './useLoopDetail';
import type { LoopDetail } from '../../worker/loopDetail';
import { bodeInput, impedanceInput, impedanceNode, loopGainInput, splaneInput, stepInput } from './plotInputs';

export type PlotKind = 'bode' | 'loop' | 'impedance' | 'splane' | 'step';

const KINDS: [PlotKind, string][] = [['bode', 'Bode'], ['loop', 'Loop T'], ['impedance', '|Z(f)|'], ['splane', 's-plane'], ['step', 'Step']];

export interface PlotsPanelProps {
  result: AnalysisResult;
  feedback: FeedbackResult | null;
  netlist: Netlist | null;
  /** Key source and label of the selected loop, when one is selected. */
  loop: { key: string; label: string } | null;
  /** Source ids switched off for this result. */
  offSources: string[];
  /** Node chosen in the node table (else the slowest node is shown). */
  node: string | null;
  /** Choose the node of the impedance plot (the same choice as in the node table). */
  onSelectNet?: (net: string | null) => void;
  pinned: AnalysisResult | null;
  feedbackPending: boolean;
  width?: number;
  initial?: PlotKind;
  /** The live store's newest loop-detail answer and its way to ask for one. */
  loopDetail: LoopDetail | null;
  askLoopDetail: (ask: LoopDetailAsk) => number;
}

function Missing({ text }: { text: string }) {
  return <p className="rp-empty" data-testid="plot-missing">{text}</p>;
}

export function PlotsPanel({ result, feedback, netlist, loop, offSources, node, onSelectNet, pinned, feedbackPending, width = 276, initial = 'bode', loopDetail, askLoopDetail }: PlotsPanelProps) {
  const [kind, setKind] = useState<PlotKind>(initial);
  const [large, setLarge] = useState(false);
  const range = result.conditions.sweep;
  const needsLoop = kind === 'loop' || kind === 'splane';
  const ask: LoopDetailAsk | null = useMemo(() => (needsLoop && loop && netlist && range
    ? { netlist, key: loop.key, offSources, fMin: range.fMin, fMax: range.fMax, perDecade: Math.min(range.perDecade, 20), part: kind === 'loop' ? 'gain' as const : 'locus' as const }
    : null), [needsLoop, loop, netlist, range, offSources, kind]);
  const { detail, pending } = useLoopDetail(ask, loopDetail, askLoopDetail);

  const view = (w: number, h: number) => {
    const onExport = (svg: string) => downloadText(`${kind}.svg`, 'image/svg+xml', svg);
    const common = { width: w, height: h, onExport };
    switch (kind) {
      case 'bode': {
        const d = bodeInput(result);
        return d ? <BodePlot data={d} {...common} /> : <Missing text={`No transfer to plot: ${result.reasons.sweep ?? 'mark an input and an output'}.`} />;
      }
      case 'loop': {
        if (!loop) return <Missing text="Select a loop in the Loops list to plot its loop gain T(jω)." />;
        const d = loopGainInput(detail, feedback, loop.label);
        if (!d) return <Missing text={detail?.message ?? (pending ? `Computing T(jω) of ${loop.label}…` : `No loop gain for ${loop.label}.`)} />;
        return <LoopGainPlot data={d} {...common} />;
      }
      case 'impedance': {
        const n = impedanceNode(result, node);
        const d = impedanceInput(result, n);
        return d ? <ImpedancePlot data={d} {...common} /> : <Missing text="No node impedance sweep in this result." />;
      }
      case 'splane':
        return (
          <>
            <SplanePlot data={splaneInput(result, loop ? detail : null, pinned)} {...common} />
            {loop && pending ? <p className="rp-note">Computing the root locus of {loop.label}…</p> : null}
            {loop && detail?.locus && detail.locus.status !== 'ok' ? <p className="rp-note">{detail.locus.message}</p> : null}
            {!loop ? <p className="rp-note">Select a loop to see its root locus (gain factor 0 … 10 on its key source).</p> : null}
          </>
        );
      case 'step': {
        const d = stepInput(feedback, result);
        return d ? <StepPlot data={d} {...common} /> : <Missing text={feedbackPending ? 'Computing the step response…' : 'No step response: mark an input and an output.'} />;
      }
    }
  };

  return (
    <div className="rp-plots" data-testid="plots">
      <div className="rp-seg" role="tablist" aria-label="Plot">
        {KINDS.map(([k, text]) => (
          <button key={k} type="button" role="tab" aria-selected={k === kind} onClick={() => setKind(k)}>{text}</button>
        ))}
      </div>
      {kind === 'impedance' && result.impedanceSweep ? (
        <label className="rp-pick">Node{' '}
          <select value={impedanceNode(result, node) ?? ''} onChange={(e) => onSelectNet?.(e.target.value || null)}>
            {result.nodes.filter((n) => !n.internal).map((n) => <option key={n.name} value={n.name}>{n.name}{n.slowest ? ' (slowest)' : ''}</option>)}
          </select>
        </label>
      ) : null}
      <div className="rp-plot">{view(width, Math.round(width * 0.8))}</div>
      <button type="button" className="rp-btn" onClick={() => setLarge(true)}>Larger view</button>
      {large ? (
        <div className="rp-modal" role="dialog" aria-label="Plot, larger view" onClick={() => setLarge(false)}
          onKeyDown={(e) => { if (e.key === 'Escape') { e.stopPropagation(); setLarge(false); } }}>
          <div className="rp-modal-box" onClick={(e) => e.stopPropagation()}>
            <button type="button" className="rp-close" aria-label="Close" autoFocus onClick={() => setLarge(false)}>×</button>
            {view(760, 500)}
          </div>
        </div>
      ) : null}
    </div>
  );
}
