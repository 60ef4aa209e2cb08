// The live analysis store (types.ts): submit drawings, get results of the newest run only.
// Committed edits run at once; drags are throttled (leading + trailing edge, `throttleMs`).
// Results of a stale run (run id below the newest) are dropped.
import { documentToNetlist } from '../schematic/toNetlist';
import type { DrawingDocument } from '../schematic/document';
import { createAnalysisRunner } from '../worker/runner';
import { computeLoopDetail } from '../worker/loopDetail';
import type { AnalysisRunner, LoopDetailRequest, WorkerMessage } from '../worker/protocol';
import { drawingIssues, engineIssues } from './issues';
import { arrivals, fromEpoch, perfDuration, perfMeasure, perfNow } from './perfMarks';
import { DEFAULT_SETTINGS, type LiveSettings, type LiveState, type LiveStore, type LoopEntry } from './types';

export interface LiveStoreOptions {
  runner?: AnalysisRunner;
  /** Minimum spacing of drag-time runs (ms); default 60. */
  throttleMs?: number;
  settings?: Partial<LiveSettings>;
}

export const DEFAULT_THROTTLE_MS = 60;

export function createLiveStore(opts: LiveStoreOptions = {}): LiveStore {
  const runner = opts.runner ?? createAnalysisRunner();
  const throttleMs = opts.throttleMs ?? DEFAULT_THROTTLE_MS;
  let state: LiveState = {
    runId: 0, status: 'idle', stage: 0, feedbackPending: false, result: null, feedback: null, blackman: {}, loopDetail: null,
    issues: [], doc: null, drawing: null, netlist: null,
    settings: { ...DEFAULT_SETTINGS, ...opts.settings }, loops: {}, pinnedA: null, failure: null, runner: runner.kind,
  };
  const listeners = new Set<() => void>();
  const set = (patch: Partial<LiveState>) => {
    state = { ...state, ...patch };
    for (const fn of [...listeners]) fn();
  };
  const setSettings = (patch: Partial<LiveSettings>) => set({ settings: { ...state.settings, ...patch } });

  let lastNetlistKey = '';
  let lastRunAt = -Infinity;
  let trailing: ReturnType<typeof setTimeout> | null = null;
  let queuedDoc: DrawingDocument | null = null;
  let disposed = false;
  let submittedAt = 0;
  let detailSeq = 0;
  const detailTimers = new Set<ReturnType<typeof setTimeout>>();

  const start = (doc: DrawingDocument, force: boolean) => {
    lastRunAt = Date.now();
    const t0 = perfNow();
    const drawing = documentToNetlist(doc);
    perfMeasure('netlist', t0);
    const issues = drawingIssues(drawing);
    if (!drawing.netlist) {
      lastNetlistKey = '';
      set({ runId: state.runId + 1, status: 'error', stage: 0, feedbackPending: false, result: null, feedback: null, blackman: {}, issues, doc, drawing, netlist: null });
      return;
    }
    const settingsKey = JSON.stringify([state.settings.frequencyHz, state.settings.offLoopIds]);
    const key = JSON.stringify(drawing.netlist) + settingsKey;
    // Same circuit (e.g. a part moved without changing connections): keep the result, new anchors.
    if (!force && key === lastNetlistKey && state.result) {
      set({ doc, drawing, issues: [...issues, ...state.issues.filter((i) => i.source === 'engine')] });
      return;
    }
    lastNetlistKey = key;
    const runId = state.runId + 1;
    const offLoops = state.settings.offLoopIds;
    const offSources = offLoops.map((id) => state.loops[id]?.key).filter((k): k is string => !!k);
    // the run goes out before the listeners hear of it (they may render the page); its id is in the
    // state first, since a same-thread runner answers inside run()
    const frequencyHz = state.settings.frequencyHz;
    state = { ...state, runId, status: 'busy', stage: 0, feedbackPending: true, issues, doc, drawing, netlist: drawing.netlist, failure: null };
    submittedAt = perfNow();
    runner.run({ runId, netlist: drawing.netlist, frequencyHz, offSources, offLoops });
    set({});
  };

  const onMessage = (m: WorkerMessage) => {
    if (disposed) return;
    if (m.stage === 'loopDetail') {
      if (m.detail.id === detailSeq) set({ loopDetail: m.detail });
      return;
    }
    if (m.runId !== state.runId) return; // stale run: dropped
    if (runner.kind !== state.runner) state = { ...state, runner: runner.kind };
    if (m.stage === 'dropped') return;
    if (m.stage === 'failed') {
      set({ status: 'error', feedbackPending: false, failure: m.message });
      return;
    }
    const doc = state.doc!, drawing = state.drawing!;
    if (m.stage === 1) {
      const t0 = perfNow();
      arrivals.stage1 = t0;
      perfDuration('engine-stage1', m.ms);
      perfMeasure('wait-stage1', submittedAt, t0);
      if (m.at) {
        // request in flight to the worker / result in flight back (incl. a busy page thread)
        perfMeasure('to-worker', submittedAt, fromEpoch(m.at.received));
        perfMeasure('from-worker', fromEpoch(m.at.posted), t0);
      }
      const placed = engineIssues(m.result.issues, doc, drawing);
      set({
        stage: 1, result: m.result, feedback: null, blackman: {},
        status: m.result.ok ? 'busy' : 'error', feedbackPending: m.result.ok,
        issues: [...drawingIssues(drawing), ...placed],
      });
      perfMeasure('apply-stage1', t0);
      return;
    }
    if (m.stage === 'complete') {
      perfDuration('engine-complete', m.ms);
      const prev = state.result;
      if (!prev || state.stage !== 1) return;
      // At the asked frequency the node table is the one stage 1 gave: keep it (and so the
      // overlay, keyed by it, is not drawn again).
      const same = m.result.conditions.frequencyHz === prev.conditions.frequencyHz && m.result.nodes.length === prev.nodes.length;
      const result = same ? { ...m.result, nodes: prev.nodes } : m.result;
      const patch: Partial<LiveState> = { result, status: result.ok ? state.status : 'error' };
      if (m.result.issues.length !== prev.issues.length) patch.issues = [...drawingIssues(drawing), ...engineIssues(m.result.issues, doc, drawing)];
      set(patch);
      return;
    }
    perfDuration('engine-stage2', m.ms);
    const loops: Record<string, LoopEntry> = {};
    for (const id of state.settings.offLoopIds) if (state.loops[id]) loops[id] = state.loops[id];
    for (const r of m.feedback.loops) loops[r.loop.id] = { id: r.loop.id, label: r.loop.label, key: r.loop.key, nets: r.loop.nets, parts: [...new Set(r.loop.members.map((m) => m.part))] };
    const sel = state.settings.selectedLoopId;
    const fbIssues = engineIssues(m.feedback.issues.filter((i) => i.severity === 'error'), doc, drawing);
    set({
      stage: 2, feedback: m.feedback, blackman: m.blackman, loops, feedbackPending: false,
      status: state.result?.ok ? 'idle' : 'error',
      issues: [...state.issues, ...fbIssues.filter((i) => !state.issues.some((j) => j.message === i.message))],
      settings: sel && !loops[sel] ? { ...state.settings, selectedLoopId: null } : state.settings,
    });
  };
  runner.onMessage(onMessage);

  const clearTrailing = () => {
    if (trailing !== null) clearTimeout(trailing);
    trailing = null;
    queuedDoc = null;
  };

  const rerun = () => { if (state.doc) start(state.doc, true); };

  return {
    getState: () => state,
    subscribe(fn) {
      listeners.add(fn);
      return () => { listeners.delete(fn); };
    },
    actions: {
      submit(doc, o = {}) {
        if (disposed) return;
        if (!o.drag) { clearTrailing(); start(doc, false); return; }
        const wait = lastRunAt + throttleMs - Date.now();
        if (wait <= 0 && trailing === null) { start(doc, false); return; }
        queuedDoc = doc;
        if (trailing === null) {
          trailing = setTimeout(() => {
            const d = queuedDoc;
            trailing = null;
            queuedDoc = null;
            if (d && !disposed) start(d, false);
          }, Math.max(0, wait));
        }
      },
      setFrequency(hz) {
        const f = Number.isFinite(hz) && hz >= 0 ? hz : 0;
        if (f === state.settings.frequencyHz) return;
        setSettings({ frequencyHz: f });
        rerun();
      },
      setColorMode: (colorMode) => setSettings({ colorMode }),
      selectLoop: (selectedLoopId) => setSettings({ selectedLoopId }),
      setLoopEnabled(id, enabled) {
        const off = state.settings.offLoopIds.filter((x) => x !== id);
        if (!enabled) off.push(id);
        if (off.length === state.settings.offLoopIds.length && off.every((x, i) => x === state.settings.offLoopIds[i])) return;
        setSettings({ offLoopIds: off });
        rerun();
      },
      toggleLoop(id) {
        this.setLoopEnabled(id, state.settings.offLoopIds.includes(id));
      },
      hoverPole: (hoveredPoleIndex) => { if (hoveredPoleIndex !== state.settings.hoveredPoleIndex) setSettings({ hoveredPoleIndex }); },
      hoverNet: (hoveredNet) => { if (hoveredNet !== state.settings.hoveredNet) setSettings({ hoveredNet }); },
      selectNet: (selectedNet) => setSettings({ selectedNet }),
      pinA() {
        if (!state.result) return;
        set({ pinnedA: { result: state.result, feedback: state.feedback, settings: state.settings, doc: state.doc, runId: state.runId } });
      },
      clearPin: () => set({ pinnedA: null }),
      rerun,
      askLoopDetail(ask) {
        detailSeq += 1;
        const req: LoopDetailRequest = { kind: 'loopDetail', id: detailSeq, ...ask };
        if (runner.loopDetail) runner.loopDetail(req);
        else {
          // a runner without loop details (test doubles): compute it on this thread, deferred
          const t = setTimeout(() => { detailTimers.delete(t); onMessage({ stage: 'loopDetail', detail: computeLoopDetail(req) }); }, 0);
          detailTimers.add(t);
        }
        return detailSeq;
      },
      dispose() {
        disposed = true;
        detailTimers.forEach(clearTimeout);
        clearTrailing();
        runner.dispose();
        listeners.clear();
      },
    },
  };
}
