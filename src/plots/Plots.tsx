// Thin React wrappers: each builds its scene with the DOM-free model and draws it with PlotSvg.
import { useMemo, useState, type ReactElement } from 'react';
import type { BodeInput, ImpedanceInput, LoopGainInput, PlotSize, SplaneInput, StepInput } from './types';
import type { Scene } from './model/scene';
import { bodeModel } from './model/bodeModel';
import { loopGainModel } from './model/loopGainModel';
import { impedanceModel } from './model/impedanceModel';
import { splaneModel } from './model/splaneModel';
import { stepModel } from './model/stepModel';
import type { SplaneViewKind } from './model/splaneView';
import { PlotSvg } from './PlotSvg';

interface Common extends PlotSize {
  className?: string;
  onExport?: (svgText: string, scene: Scene) => void;
}

export function BodePlot({ data, width, height, ...rest }: Common & { data: BodeInput }): ReactElement {
  const scene = useMemo(() => bodeModel(data, { width, height }), [data, width, height]);
  return <PlotSvg scene={scene} {...rest} />;
}

export function LoopGainPlot({ data, width, height, ...rest }: Common & { data: LoopGainInput }): ReactElement {
  const scene = useMemo(() => loopGainModel(data, { width, height }), [data, width, height]);
  return <PlotSvg scene={scene} {...rest} />;
}

export function ImpedancePlot({ data, width, height, ...rest }: Common & { data: ImpedanceInput }): ReactElement {
  const scene = useMemo(() => impedanceModel(data, { width, height }), [data, width, height]);
  return <PlotSvg scene={scene} {...rest} />;
}

function Toggle<T extends string>({ value, options, onChange, label }: { value: T; options: [T, string][]; onChange: (v: T) => void; label: string }) {
  return (
    <div role="group" aria-label={label} className="ps-toggle">
      {options.map(([v, text]) => (
        <button key={v} type="button" aria-pressed={v === value} onClick={() => onChange(v)}>{text}</button>
      ))}
    </div>
  );
}

export function SplanePlot({ data, width, height, view, ...rest }: Common & { data: SplaneInput; view?: SplaneViewKind }): ReactElement {
  const [kind, setKind] = useState<SplaneViewKind>(view ?? 'signed-log');
  const scene = useMemo(() => splaneModel(data, { width, height, view: kind }), [data, width, height, kind]);
  return (
    <div className="ps-splane">
      <Toggle label="s-plane view" value={kind} onChange={setKind} options={[['signed-log', 'Log radius'], ['linear', 'Linear']]} />
      <PlotSvg scene={scene} {...rest} />
    </div>
  );
}

export function StepPlot({ data, width, height, timeAxis, ...rest }: Common & { data: StepInput; timeAxis?: 'linear' | 'log' }): ReactElement {
  const [axis, setAxis] = useState<'linear' | 'log'>(timeAxis ?? 'linear');
  const scene = useMemo(() => stepModel(data, { width, height, timeAxis: axis }), [data, width, height, axis]);
  return (
    <div className="ps-step">
      <Toggle label="time axis" value={axis} onChange={setAxis} options={[['linear', 'Linear time'], ['log', 'Log time']]} />
      <PlotSvg scene={scene} {...rest} />
    </div>
  );
}
