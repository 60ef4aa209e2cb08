export type * from './types';
export { DEFAULT_SETTINGS } from './types';
export { createLiveStore, DEFAULT_THROTTLE_MS, type LiveStoreOptions } from './store';
export { AnalysisProvider, useAnalysis, useAnalysisStore } from './useAnalysis';
export { useLiveSubmit, useLiveOverlay } from './useEditorAnalysis';
export { liveView, type LiveView } from './liveView';
export { liveAnnotations } from './annotateLive';
