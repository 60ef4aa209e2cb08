// React access to the live analysis store: <AnalysisProvider store={…}> near the top of the app,
// useAnalysis() anywhere below it ({ state, actions }).
import { createContext, createElement, useContext, useSyncExternalStore, type ReactNode } from 'react';
import type { LiveActions, LiveState, LiveStore } from './types';

const AnalysisContext = createContext<LiveStore | null>(null);

export function AnalysisProvider({ store, children }: { store: LiveStore; children?: ReactNode }) {
  return createElement(AnalysisContext.Provider, { value: store }, children);
}

/** The store given by the nearest AnalysisProvider (or the one passed in). */
export function useAnalysisStore(store?: LiveStore): LiveStore {
  const ctx = useContext(AnalysisContext);
  const s = store ?? ctx;
  if (!s) throw new Error('useAnalysis: no analysis store; wrap the tree in <AnalysisProvider store={createLiveStore()}>');
  return s;
}

/** Current live state (re-renders on every change) and the store's actions. */
export function useAnalysis(store?: LiveStore): { state: LiveState; actions: LiveActions } {
  const s = useAnalysisStore(store);
  const state = useSyncExternalStore(s.subscribe, s.getState, s.getState);
  return { state, actions: s.actions };
}
