export type * from './types';
export { DEFAULT_SETTINGS } from './types';
export { createLiveStore, DEFAULT_THROTTLE_MS, type LiveStoreOptions } from './store';
export { AnalysisProvider, useAnalysis, useAnalysisStore } from './useAnalysis';
export { useEditorAnalysis } from './useEditorAnalysis';
export { liveAnnotations } from './annotateLive';
