// @vitest-environment jsdom
import { describe, it, expect, vi } from 'vitest';
import { render, screen, fireEvent } from '@testing-library/react';
import { BodePlot, SplanePlot, StepPlot } from '../../src/plots/Plots';
import { bodeModel } from '../../src/plots/model/bodeModel';
import { complexToCurve } from '../../src/plots/model/freqPanels';
import { toSvg } from '../../src/plots/toSvg';
import { logGrid } from './sceneProbe';

const TWO_PI = 2 * Math.PI;
// single pole at 1 kHz, A0 = 10 (textbook first-order low-pass)
const hz = logGrid(1, 1e6, 40);
const curve = complexToCurve(hz, hz.map((f) => { const x = f / 1e3, d = 1 + x * x; return { re: 10 / d, im: (-10 * x) / d }; }));
const data = { ...curve, label: 'V1 → out', poles: [{ re: -TWO_PI * 1e3, im: 0 }], zeros: [] };

describe('plot components (jsdom)', () => {
  it('renders the same elements as the exported SVG and shows a hover read-out at the nearest sample', () => {
    const { container } = render(<BodePlot data={data} />);
    const svg = container.querySelector('svg')!;
    expect(svg.getAttribute('viewBox')).toBe('0 0 640 440');
    const exported = new DOMParser().parseFromString(toSvg(bodeModel(data)), 'image/svg+xml');
    for (const cls of ['ps-curve-mag', 'ps-curve-phase', 'ps-pole', 'ps-tick-x', 'ps-grid-minor']) {
      expect(svg.querySelectorAll(`.${cls}`).length).toBe(exported.querySelectorAll(`.${cls}`).length);
      expect(svg.querySelectorAll(`.${cls}`).length).toBeGreaterThan(0);
    }
    expect(svg.querySelector('.ps-curve-mag')!.getAttribute('d')).toBe(exported.querySelector('.ps-curve-mag')!.getAttribute('d'));
    // jsdom has no layout: the component falls back to 1:1 pixels, so clientX is the scene x
    const x = Number(Array.from(svg.querySelectorAll('.ps-tick-x')).find((t) => t.textContent === '1 kHz')!.getAttribute('x'));
    fireEvent.mouseMove(svg, { clientX: x, clientY: 300 });
    expect(screen.getByTestId('plot-readout-text').textContent).toBe('f = 1.00 kHz · |H| = 16.99 dB · ∠H = \u221245°');
    const box = screen.getByTestId('plot-readout');
    expect(box.querySelectorAll('.ps-readout')[1].textContent).toBe('|H| = 16.99 dB');
    expect(box.querySelectorAll('.ps-hover-dot')).toHaveLength(2);
    fireEvent.mouseLeave(svg);
    expect(screen.queryByTestId('plot-readout')).toBeNull();
  });

  it('export button hands over standalone SVG text', () => {
    const onExport = vi.fn();
    render(<BodePlot data={data} onExport={onExport} />);
    fireEvent.click(screen.getByRole('button', { name: 'Save as SVG' }));
    expect(onExport).toHaveBeenCalledTimes(1);
    expect(onExport.mock.calls[0][0]).toMatch(/^<\?xml[^]*<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/);
  });

  it('s-plane view toggle switches between log-radius rings and the linear grid', () => {
    const { container } = render(<SplanePlot data={{ poles: [{ re: -TWO_PI * 1e3, im: 0 }, { re: -TWO_PI * 1e8, im: 0 }], zeros: [] }} />);
    expect(container.querySelectorAll('.ps-ring-major').length).toBeGreaterThan(3);
    fireEvent.click(screen.getByRole('button', { name: 'Linear' }));
    expect(container.querySelectorAll('.ps-ring-major')).toHaveLength(0);
    expect(screen.getByRole('button', { name: 'Linear' }).getAttribute('aria-pressed')).toBe('true');
  });

  it('step plot renders settling marks and switches to a log time axis', () => {
    const t = Array.from({ length: 501 }, (_, i) => i * 2e-8);
    const y = t.map((v) => 1 - Math.exp(-v / 1e-6));
    const { container } = render(<StepPlot data={{ t, y, finalValue: 1, settling: [{ tolerance: 0.01, seconds: 1e-6 * Math.log(100) }] }} />);
    expect(container.querySelectorAll('.ps-settling')).toHaveLength(1);
    fireEvent.click(screen.getByRole('button', { name: 'Log time' }));
    expect(Array.from(container.querySelectorAll('.ps-tick-x')).map((e) => e.textContent)).toContain('1 µs');
  });
});
