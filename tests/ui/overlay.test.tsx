// @vitest-environment jsdom
// The analysis overlay on the whole app (same-thread runner in jsdom): a changed value changes the
// badge, a structural error shows its message at the fault instead of the marks, the wire read-out,
// and switching a loop off changes the impedance badge of the node it held.
import { describe, it, expect } from 'vitest';
import { act, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { App } from '../../src/App';
import { createEditor } from '../../src/editor/editor';
import { createLiveStore } from '../../src/live/index';
import type { LiveStore } from '../../src/live/index';
import type { DrawingDocument, PartId } from '../../src/schematic/document';
import { EXAMPLE_DRAWINGS } from '../../src/examples/index';
import { csStage, GDS, par } from '../live/fixtures';

function si(text: string): number {
  const m = /(-|−)?([0-9.]+)\s*([yzafpnµumkMGTPE]?)/.exec(text.trim());
  if (!m) throw new Error(`not an SI figure: "${text}"`);
  const exp: Record<string, number> = { f: -15, p: -12, n: -9, µ: -6, u: -6, m: -3, '': 0, k: 3, M: 6, G: 9, T: 12 };
  return (m[1] ? -1 : 1) * Number(m[2]) * 10 ** exp[m[3]];
}

function mount(doc: DrawingDocument) {
  const editor = createEditor(doc);
  const store = createLiveStore({ throttleMs: 0 });
  render(<App editor={editor} storage={null} analysisStore={store} />);
  return { editor, store };
}

const settled = (store: LiveStore) => waitFor(() => expect(store.getState().stage).toBe(2), { timeout: 30000 });
const zText = (net: string) => /\|Z\| (.*)$/.exec(screen.getByTestId(`badge-${net}`).textContent!.split(/(?=C \d|τ |f \d)/)[0])![1];

describe('analysis overlay', () => {
  it('a changed resistor value changes the impedance and τ on the badge', async () => {
    const { editor, store } = mount(csStage('4.7k'));
    await settled(store);
    const badge = await screen.findByTestId('badge-out');
    // Gray & Meyer, common-source output resistance R_D ∥ r_o (r_o = 1/gds): 4.296 kΩ
    expect(si(zText('out'))).toBeCloseTo(par(4700, 1 / GDS), -1);
    // node time constant R_out·C_out with C_out = cdb + cgd = 60 fF (Razavi, CS output pole)
    expect(badge.textContent).toMatch(/τ 258 ps/);
    act(() => editor.select(['part:r1' as PartId]));
    const field = within(screen.getByTestId('part-inspector')).getByLabelText(/Resistance/) as HTMLInputElement;
    fireEvent.change(field, { target: { value: '10k' } });
    fireEvent.keyDown(field, { key: 'Enter' });
    await waitFor(() => expect(si(zText('out'))).toBeCloseTo(par(10000, 1 / GDS), -1), { timeout: 30000 });
    // τ = (10k ∥ 50k)·60 fF = 500 ps
    expect(screen.getByTestId('badge-out').textContent).toMatch(/τ 500 ps/);
    // the slowest node is marked on its badge
    expect(screen.getByTestId('badge-out').textContent).toMatch(/slowest node/);
  });

  it('a structural error replaces the marks with its message at the fault', async () => {
    const doc = csStage();
    delete doc.parts['part:gnd1' as PartId]; // M1's source pin left open
    const { store } = mount(doc);
    await waitFor(() => expect(store.getState().status).toBe('error'));
    const faults = await screen.findByTestId('analysis-faults');
    expect(faults.textContent).toMatch(/Analysis paused/);
    const first = store.getState().issues.find((i) => i.severity === 'error' && i.x !== null)!;
    expect(faults.textContent).toContain(first.message);
    expect(screen.queryByTestId('badge-out')).toBeNull();
    expect(screen.queryByTestId('analysis-overlay')).toBeNull();
  });

  it('hovering a wire shows the full read-out of its net', async () => {
    const { editor, store } = mount(csStage('4.7k'));
    await settled(store);
    // wire "o" runs from the drain (110,70) to the output marker (130,70)
    act(() => { editor.dispatch({ type: 'pointerMove', x: 120, y: 70, sx: 240, sy: 140, shift: false, ctrl: false, alt: false, meta: false }); });
    const readout = await screen.findByTestId('wire-readout');
    expect(readout.textContent).toMatch(/net out/);
    expect(readout.textContent).toMatch(/\|Z\| at DC4\.30 kΩ/); // Gray & Meyer R_D ∥ r_o
    expect(readout.textContent).toMatch(/select a loop/);
  });

  it('the frequency control re-runs at that frequency and the legend follows', async () => {
    const { store } = mount(csStage('4.7k'));
    await settled(store);
    expect(screen.getByTestId('analysis-legend').textContent).toMatch(/at DC/);
    const input = screen.getByLabelText('Frequency of the node impedances') as HTMLInputElement;
    fireEvent.change(input, { target: { value: '617.4M' } });
    fireEvent.keyDown(input, { key: 'Enter' });
    await waitFor(() => expect(store.getState().result?.conditions.frequencyHz).toBeCloseTo(617.4e6, -3), { timeout: 30000 });
    await settled(store);
    // at the single pole |Z| = R_out/√2 (one-pole RC, common practice)
    expect(si(zText('out'))).toBeCloseTo(par(4700, 1 / GDS) / Math.SQRT2, -1);
    fireEvent.click(screen.getByRole('radio', { name: 'τ' }));
    expect(screen.getByTestId('analysis-legend').textContent).toMatch(/time constant/);
    fireEvent.change(input, { target: { value: 'fast' } });
    fireEvent.keyDown(input, { key: 'Enter' });
    expect(input.getAttribute('aria-invalid')).toBe('true');
  });

  it('switching a loop off changes the impedance badge of the node it held', async () => {
    const ex = EXAMPLE_DRAWINGS.find((e) => e.id === 'readout-cascode-regulated')!;
    const { store } = mount(ex.load());
    await settled(store);
    const fb = store.getState().feedback!;
    const held = fb.loops.find((l) => l.regulation.holdsCurrent || l.regulation.holdsVoltage)!;
    const q = held.regulation.holdsCurrent ?? held.regulation.holdsVoltage!;
    const before = si(zText(q.node));
    act(() => store.actions.selectLoop(held.loop.id));
    const b = store.getState().blackman[held.loop.key].nodes.find((n) => n.node === q.node)!;
    act(() => store.actions.setLoopEnabled(held.loop.id, false));
    await waitFor(() => expect(store.getState().settings.offLoopIds).toContain(held.loop.id));
    await settled(store);
    const after = si(zText(q.node));
    // Blackman 1943: with the key source removed the node impedance is Z⁰ = Z·(1+T_oc)/(1+T_sc)
    expect(after / Math.hypot(b.z0.re, b.z0.im)).toBeCloseTo(1, 2);
    // the badges carry 3 significant digits: the ratio matches the loop's factor to within 1 %
    expect(Math.abs(before / after / q.factor - 1)).toBeLessThan(0.01);
  });
});
