// Plots: DOM-free scene models, an SVG string serialiser for export/CLI, and React components.
export type * from './types';
export type { Scene, SceneItem, Style, HoverTrack, HoverPoint, MarkerShape } from './model/scene';
export type { Scale, Tick } from './model/scales';
export type { HoverHit } from './model/hover';
export type { SplaneViewKind } from './model/splaneView';
export { linearScale, logScale, linearTicks, logTicks, niceStep, formatSi, SI_PREFIXES } from './model/scales';
export { bodeModel } from './model/bodeModel';
export { loopGainModel } from './model/loopGainModel';
export { impedanceModel } from './model/impedanceModel';
export { splaneModel, type SplaneOptions } from './model/splaneModel';
export { stepModel, type StepOptions } from './model/stepModel';
export { complexToCurve } from './model/freqPanels';
export { hoverAt, readoutItems } from './model/hover';
export { PALETTE, LINES, MARKS } from './model/palette';
export { toSvg } from './toSvg';
export { sceneToNodes } from './svgNodes';
export { PlotSvg, type PlotSvgProps } from './PlotSvg';
export { BodePlot, LoopGainPlot, ImpedancePlot, SplanePlot, StepPlot } from './Plots';
