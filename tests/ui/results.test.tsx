// @vitest-environment jsdom
// The results panels on the live store (same-thread runner in jsdom): a changed value changes the
// displayed pole, switching a loop off changes the held node's impedance read-out, compare mode
// shows A and B, and a structural error shows its message instead of numbers.
import { describe, it, expect } from 'vitest';
import { act, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { ResultsPanel } from '../../src/panels/ResultsPanel';
import { createLiveStore } from '../../src/live/index';
import { analyze } from '../../src/engine/index';
import type { AnalysisRunner, RunMessage } from '../../src/worker/protocol';
import type { LiveStore } from '../../src/live/index';
import { EXAMPLE_DRAWINGS } from '../../src/examples/index';
import { documentToNetlist } from '../../src/schematic/toNetlist';
import { expandNetlist } from '../../src/engine/mna';
import type { DrawingDocument } from '../../src/schematic/document';
import { drawing, part, pt } from '../schematic/build';

/** Parse the panel's SI text ("15.9 MHz", "3.75 GΩ", "10.0 ns") back to a number. */
function si(text: string): number {
  const m = /(-|−)?([0-9.]+)\s*([yzafpnµumkMGTPE]?)/.exec(text.trim());
  if (!m) throw new Error(`not an SI figure: "${text}"`);
  const exp: Record<string, number> = { y: -24, z: -21, a: -18, f: -15, p: -12, n: -9, µ: -6, u: -6, m: -3, '': 0, k: 3, M: 6, G: 9, T: 12, P: 15, E: 18 };
  return (m[1] ? -1 : 1) * Number(m[2]) * 10 ** exp[m[3]];
}

// Input source → R1 → out, C1 from out to ground: a single RC low-pass.
function rcDrawing(c: string): DrawingDocument {
  return drawing([
    part('input', 'IN1', 40, 100),
    part('resistor', 'R1', 110, 130, { params: { value: '10k' } }),
    part('capacitor', 'C1', 110, 190, { params: { value: c } }),
    part('ground', 'GND1', 110, 220),
    part('output', 'OUT1', 150, 160),
    part('netLabel', 'NL1', 110, 160, { params: { net: 'out' } }),
  ], [['i', pt(60, 100), pt(110, 100)], ['o', pt(110, 160), pt(130, 160)]]);
}

/** A same-thread runner that answers each request with the given messages, in order. */
function scriptedRunner(answer: (req: Parameters<AnalysisRunner['run']>[0]) => RunMessage[]): AnalysisRunner {
  const listeners: ((m: RunMessage) => void)[] = [];
  return {
    kind: 'same-thread',
    run(req) {
      setTimeout(() => { for (const m of answer(req)) listeners.forEach((fn) => fn(m)); }, 0);
    },
    onMessage: (fn) => { listeners.push(fn); },
    dispose() {},
  };
}

/** The regulated cascode example, analysed to the end (feedback included). */
async function mountRegulatedCascode(): Promise<LiveStore> {
  const store = mount();
  act(() => store.actions.submit(regulatedCascode()));
  await settled(store);
  return store;
}

/** The loop list entry of the error amplifier's loop (key source A1.A0). */
const regulatedCascode = () => EXAMPLE_DRAWINGS.find((e) => e.id === 'readout-cascode-regulated')!.load();

const a1Loop = () => screen.getAllByTestId('loop-item').find((e) => e.getAttribute('data-key') === 'A1.A0')!;

function mount(): LiveStore {
  const store = createLiveStore({ throttleMs: 0 });
  render(<ResultsPanel store={store} />);
  return store;
}

const tab = (name: RegExp) => fireEvent.click(screen.getByRole('tab', { name }));
// the store has the run's last stage and the panel (which follows the store at a lower priority
// than the canvas) shows that run and stage
const settled = (store: LiveStore) => waitFor(() => {
  const s = store.getState();
  expect(s.stage).toBe(2);
  const panel = screen.getByRole('region', { name: 'Results' });
  expect([panel.getAttribute('data-run'), panel.getAttribute('data-stage')]).toEqual([String(s.runId), '2']);
}, { timeout: 20000 });
const firstPoleHz = () => si(screen.getAllByTestId('pole-hz')[0].textContent!);
const nodeCell = (node: string, id: string) => {
  const row = screen.getAllByTestId('node-row').find((r) => r.getAttribute('data-node') === node)!;
  return within(row).getByTestId(id).textContent!;
};

describe('results panels on the live store', () => {
  it('a changed capacitor value changes the displayed pole and the node time constant', async () => {
    const store = mount();
    act(() => store.actions.submit(rcDrawing('1p')));
    await settled(store);
    // Single-pole RC low-pass: p = 1/(2πRC) (textbook closed form): 10 kΩ · 1 pF → 15.9 MHz.
    expect(firstPoleHz()).toBeCloseTo(1 / (2 * Math.PI * 10e3 * 1e-12), -5);
    act(() => store.actions.submit(rcDrawing('2p')));
    await settled(store);
    await waitFor(() => expect(firstPoleHz()).toBeCloseTo(1 / (2 * Math.PI * 10e3 * 2e-12), -4));
    tab(/Nodes/);
    // τ = R·C at node out (the source is a short to ground at DC): 10 kΩ · 2 pF = 20 ns.
    expect(si(nodeCell('out', 'node-tau'))).toBeCloseTo(20e-9, 10);
    expect(si(nodeCell('out', 'node-z'))).toBeCloseTo(10e3, -1);
  });

  it('switching the regulation loop off lowers the output impedance by the regulated-cascode factor', async () => {
    const store = await mountRegulatedCascode();
    tab(/Nodes/);
    const zOn = si(nodeCell('out', 'node-z'));
    tab(/Loops/);
    const item = a1Loop();
    expect(within(item).getByTestId('loop-holds').textContent).toMatch(/holds the current into out/);
    // the output is driven by a test current source, so the loop is open at DC (T = 0) while the
    // DC impedance factor comes from the shorted-port return ratio (Blackman 1943)
    expect(within(item).getByTestId('loop-open-at-dc').textContent).toMatch(/port shorted/);
    fireEvent.click(within(item).getByRole('switch'));
    await waitFor(() => expect(store.getState().settings.offLoopIds.length).toBe(1));
    await settled(store);
    const offItem = a1Loop();
    expect(within(offItem).getByRole('switch').getAttribute('aria-checked')).toBe('false');
    tab(/Nodes/);
    const zOff = si(nodeCell('out', 'node-z'));
    // Regulated cascode at DC, body effect included (Razavi, Design of Analog CMOS ICs, ch. 9 form):
    // Rout = ro1 + ro2 + ro1·ro2·(gm2·(1 + A) + gmb2); with the booster off (A = 0) the plain cascode.
    const x = expandNetlist(documentToNetlist(regulatedCascode()).netlist!);
    const val = (part: string, role: string) => {
      const e = x.elements.find((el) => el.part === part && el.role === role)!;
      return e.type === 'vccs' ? e.gm : e.type === 'conductance' ? e.g : NaN;
    };
    const ro1 = 1 / val('M1', 'gds'), ro2 = 1 / val('M2', 'gds'), gm2 = val('M2', 'gm'), gmb2 = val('M2', 'gmb');
    const A = 100; // the drawing's A0
    const rout = (a: number) => ro1 + ro2 + ro1 * ro2 * (gm2 * (1 + a) + gmb2);
    expect(zOn / rout(A)).toBeCloseTo(1, 2); // three displayed digits
    expect(zOff / rout(0)).toBeCloseTo(1, 2);
    expect(zOn / zOff).toBeGreaterThan(50);
    // switching it back on restores the read-out
    tab(/Loops/);
    const again = a1Loop();
    fireEvent.click(within(again).getByRole('switch'));
    await waitFor(() => expect(store.getState().settings.offLoopIds.length).toBe(0));
    await settled(store);
    tab(/Nodes/);
    expect(si(nodeCell('out', 'node-z'))).toBeCloseTo(zOn, -7);
  });

  it('compare mode shows A and B beside each other with the pole movement', async () => {
    const store = mount();
    act(() => store.actions.submit(rcDrawing('1p')));
    await settled(store);
    tab(/A\/B/);
    fireEvent.click(screen.getByRole('button', { name: 'Pin as A' }));
    act(() => store.actions.submit(rcDrawing('4p')));
    await settled(store);
    const row = screen.getAllByTestId('cmp-pole')[0];
    const cells = within(row).getAllByRole('cell').map((c) => c.textContent!);
    // 1/(2πRC): 15.9 MHz with 1 pF (A), 3.98 MHz with 4 pF (B): the pole moves down by 4.
    expect(si(cells[0])).toBeCloseTo(15.9e6, -5);
    expect(si(cells[1])).toBeCloseTo(3.98e6, -4);
    expect(cells[2]).toBe('÷ 4.00');
    const node = screen.getAllByTestId('cmp-node').find((r) => r.getAttribute('data-node') === 'out')!;
    expect(node.textContent).toMatch(/τ 10\.0 ns40\.0 ns× 4\.00/); // τ = RC
    // DC gain of an RC low-pass is 1 in both (common practice): 0 dB change.
    expect(screen.getByTestId('cmp-Gain-a').textContent).toBe(screen.getByTestId('cmp-Gain-b').textContent);
    fireEvent.click(screen.getByRole('button', { name: 'End compare' }));
    expect(store.getState().pinnedA).toBeNull();
  });

  it('a structural error replaces the numbers with its message', async () => {
    const store = mount();
    // R2 and R3 in a ring of their own: that net has no path to ground (a floating node).
    const doc = drawing([
      part('input', 'IN1', 40, 100),
      part('resistor', 'R1', 110, 130, { params: { value: '10k' } }),
      part('capacitor', 'C1', 110, 190, { params: { value: '1p' } }),
      part('ground', 'GND1', 110, 220),
      part('output', 'OUT1', 150, 160),
      part('resistor', 'R2', 300, 130, { params: { value: '10k' } }),
      part('resistor', 'R3', 300, 190, { params: { value: '10k' } }),
    ], [['i', pt(60, 100), pt(110, 100)], ['o', pt(110, 160), pt(130, 160)], ['f', pt(300, 100), pt(300, 70), pt(360, 70), pt(360, 220), pt(300, 220)]]);
    act(() => store.actions.submit(doc));
    await waitFor(() => expect(store.getState().status).toBe('error'), { timeout: 20000 });
    const alert = await screen.findByTestId('results-errors');
    expect(alert.textContent).toMatch(/no path to ground/);
    expect(screen.queryAllByTestId('pole-row')).toHaveLength(0);
  });

  it('hovering a pole row tells the store; a hovered net lights the poles it carries', async () => {
    const store = mount();
    act(() => store.actions.submit(rcDrawing('1p')));
    await settled(store);
    const row = screen.getAllByTestId('pole-row')[0];
    fireEvent.mouseEnter(row);
    expect(store.getState().settings.hoveredPoleIndex).toBe(Number(row.getAttribute('data-pole-index')));
    fireEvent.mouseLeave(row);
    expect(store.getState().settings.hoveredPoleIndex).toBeNull();
    // The RC pole lives at node out alone (the other node is held by the source): out lights it.
    act(() => store.actions.hoverNet('out'));
    expect(screen.getAllByTestId('pole-row')[0].className).toMatch(/\blit\b/);
    act(() => store.actions.hoverNet('nowhere'));
    expect(screen.getAllByTestId('pole-row')[0].className).not.toMatch(/\blit\b/);
  });

  it('the selected loop is plotted: T(jω) with its phase margin, and the s-plane with its locus', async () => {
    const store = await mountRegulatedCascode();
    tab(/Loops/);
    const item = a1Loop();
    fireEvent.click(within(item).getByRole('button', { name: /A1 → M2/ }));
    expect(store.getState().settings.selectedLoopId).toMatch(/^A1\.A0>/);
    const pm = within(item).getByText('PM').nextElementSibling!.textContent!;
    tab(/Plots/);
    fireEvent.click(screen.getByRole('tab', { name: 'Loop T' }));
    const plot = await screen.findByLabelText(/Loop gain T: A1 → M2/, {}, { timeout: 20000 });
    // The plot marks the same phase margin as the list (one source: the engine's margins).
    expect(plot.textContent).toContain(`PM ${pm}`);
    fireEvent.click(screen.getByRole('tab', { name: 's-plane' }));
    const sp = await screen.findByLabelText(/s-plane/, { selector: 'svg' }, { timeout: 20000 });
    await waitFor(() => expect(sp.textContent).toMatch(/Root locus/), { timeout: 20000 });
  });

  it('the impedance plot follows the node chosen in the plot or the node table', async () => {
    const store = mount();
    act(() => store.actions.submit(rcDrawing('1p')));
    await settled(store);
    tab(/Plots/);
    fireEvent.click(screen.getByRole('tab', { name: '|Z(f)|' }));
    // default: the slowest node (out, the only one with a capacitor)
    expect(screen.getByLabelText(/Node impedance \|Z\|: out/, { selector: 'svg' })).toBeTruthy();
    const pick = screen.getByRole('combobox') as HTMLSelectElement;
    const other = [...pick.options].map((o) => o.value).find((v) => v !== 'out')!;
    fireEvent.change(pick, { target: { value: other } });
    expect(store.getState().settings.selectedNet).toBe(other);
    expect(screen.getByLabelText(new RegExp(`Node impedance \\|Z\\|: ${other}`), { selector: 'svg' })).toBeTruthy();
  });

  it('"compare with it off" pins A, breaks the loop and shows the held node before and after', async () => {
    const store = await mountRegulatedCascode();
    tab(/Loops/);
    const item = a1Loop();
    fireEvent.click(within(item).getByRole('button', { name: /Compare with it off/ }));
    expect(store.getState().pinnedA).not.toBeNull();
    await waitFor(() => expect(store.getState().settings.offLoopIds).toHaveLength(1));
    await settled(store);
    const out = await screen.findAllByTestId('cmp-node').then((rows) => rows.find((r) => r.getAttribute('data-node') === 'out')!);
    const cells = within(out).getAllByRole('cell').map((c) => c.textContent!);
    // A (loop on) over B (loop off) for the regulated cascode, from the formula in the switching
    // test with ro·gm ≫ 1: Rout(A)/Rout(0) ≈ (gm·(1 + A) + gmb)/(gm + gmb), about 80 for A = 100.
    expect(si(cells[0]) / si(cells[1])).toBeGreaterThan(50);
    expect(cells[2]).toMatch(/^÷ /);
  });

  it('a failed feedback stage is named while the figures of the first stage stay shown', async () => {
    const runner = scriptedRunner((req) => [
      { runId: req.runId, stage: 1, result: analyze(req.netlist, { frequencyHz: req.frequencyHz, off: req.offSources, impedanceSweep: true }) },
      { runId: req.runId, stage: 'failed', message: 'feedback analysis: test failure' },
    ]);
    const store = createLiveStore({ runner });
    render(<ResultsPanel store={store} />);
    act(() => store.actions.submit(rcDrawing('1p')));
    const msg = await screen.findByTestId('results-failure');
    expect(msg.textContent).toMatch(/feedback analysis: test failure/);
    // 1/(2πRC) still shown (textbook RC pole)
    expect(firstPoleHz()).toBeCloseTo(1 / (2 * Math.PI * 10e3 * 1e-12), -5);
  });

  it("the engine's warnings about the figures are listed under the summary (here: a frequency it cannot use)", async () => {
    // −5 Hz is not a frequency: the engine warns and uses its default (engine contract).
    const runner = scriptedRunner((req) => [{ runId: req.runId, stage: 1, result: analyze(req.netlist, { frequencyHz: -5, off: req.offSources }) }]);
    const store = createLiveStore({ runner });
    render(<ResultsPanel store={store} />);
    act(() => store.actions.submit(rcDrawing('1p')));
    const list = await screen.findByTestId('results-warnings');
    expect(list.textContent).toMatch(/frequencyHz: -5 is not a frequency/);
    // the figures are still there: 1/(2πRC) (textbook RC pole)
    expect(firstPoleHz()).toBeCloseTo(1 / (2 * Math.PI * 10e3 * 1e-12), -5);
  });
});
