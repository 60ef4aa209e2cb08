// @vitest-environment jsdom
// The busy marks of the analysis display: a run still without its stage 1 shows "analysing…"
// (after a short delay, so a quick update never flashes it); once stage 1 is drawn only the quiet
// "loops…" mark stays until the feedback stage lands. The worker answers are delivered by hand.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { act, render, screen } from '@testing-library/react';
import { AnalysisHud, BUSY_DELAY_MS } from '../../src/canvas/AnalysisHud';
import { createLiveStore } from '../../src/live/index';
import { useAnalysis } from '../../src/live/useAnalysis';
import type { LiveStore } from '../../src/live/index';
import { runOverlayStage, runStage2 } from '../../src/worker/compute';
import { csStage, GDS, handRunner, par } from '../live/fixtures';

function Hud({ store }: { store: LiveStore }) {
  const { state, actions } = useAnalysis(store);
  return <AnalysisHud state={state} actions={actions} ann={null} />;
}

afterEach(() => { vi.useRealTimers(); });

describe('busy marks', () => {
  it('"analysing…" only while the overlay waits for stage 1, then "loops…" until the feedback', () => {
    vi.useFakeTimers();
    const h = handRunner();
    const store = createLiveStore({ runner: h.runner });
    render(<Hud store={store} />);
    act(() => store.actions.submit(csStage('4.7k')));
    act(() => { vi.advanceTimersByTime(BUSY_DELAY_MS - 20); });
    expect(screen.queryByTestId('analysis-busy')).toBeNull(); // a quick run never flashes it
    act(() => { vi.advanceTimersByTime(40); });
    expect(screen.getByTestId('analysis-busy').textContent).toMatch(/analysing/);

    const req = h.requests[0];
    const staged = runOverlayStage(req);
    act(() => h.deliver({ runId: req.runId, stage: 1, result: staged.first }));
    // the overlay's figure is in: R1 ∥ ro at the drain (Gray & Meyer, R_D ∥ r_o)
    expect(store.getState().result!.nodes.find((n) => n.name === 'out')!.dcOhms).toBeCloseTo(par(4700, 1 / GDS), 6);
    act(() => { vi.advanceTimersByTime(BUSY_DELAY_MS * 2); });
    expect(screen.queryByTestId('analysis-busy')).toBeNull();
    expect(screen.getByText(/loops…/)).toBeTruthy();

    const nodes = store.getState().result!.nodes;
    act(() => h.deliver({ runId: req.runId, stage: 'complete', result: staged.complete() }));
    expect(store.getState().result!.nodes).toBe(nodes); // same table kept: the overlay is not redrawn
    expect(store.getState().result!.impedanceSweep).not.toBeNull();
    const { feedback, blackman } = runStage2(req);
    act(() => h.deliver({ runId: req.runId, stage: 2, feedback, blackman }));
    expect(screen.queryByText(/loops…/)).toBeNull();
    expect(store.getState().status).toBe('idle');
  });
});
