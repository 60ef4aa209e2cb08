// The live analysis store: its state, settings and actions. The canvas overlay and the panels read
// it through useAnalysis(); edits of the drawing are submitted to it, it re-runs the analysis off
// the main thread (src/worker) and drops results of stale runs. All figures it holds are linear
// small-signal estimates about the entered bias point.
import type { AnalysisResult, Netlist } from '../engine/index';
import type { BlackmanResult, FeedbackResult } from '../engine/feedback/index';
import type { DrawingDocument } from '../schematic/document';
import type { DrawingNetlist } from '../schematic/toNetlist';
import type { LoopDetail, LoopDetailRequest } from '../worker/loopDetail';

/** idle: the shown result belongs to the current drawing; busy: a run is under way (the previous
 *  result stays shown); error: the drawing or the engine reported an error (see `issues`). */
export type AnalysisStatus = 'idle' | 'busy' | 'error';

/** What colours the wires: node |Z| at the chosen frequency, or the node time constant. */
export type ColorMode = 'impedance' | 'timeConstant';

export interface LiveSettings {
  /** Frequency of the node impedances (Hz); 0 = DC (the default). */
  frequencyHz: number;
  colorMode: ColorMode;
  /** Loop id (Loop.id of the feedback result) drawn on the schematic; null = none. */
  selectedLoopId: string | null;
  /** Loop ids switched off (the analysis is re-run with each broken at its key source). */
  offLoopIds: string[];
  /** Index into result.poles being hovered in the poles list; null = none. */
  hoveredPoleIndex: number | null;
  hoveredNet: string | null;
  selectedNet: string | null;
}

/** A problem to show at its place on the canvas (drawing checks and engine errors alike). */
export interface LiveIssue {
  severity: 'error' | 'warning';
  code: string;
  message: string;
  /** World position of the fault; null when it concerns the whole drawing. */
  x: number | null;
  y: number | null;
  part?: string;
  node?: string;
  field?: string;
  /** Where it came from: the drawing checks or the engine. */
  source: 'drawing' | 'engine';
}

/** What is remembered of a loop, also while it is switched off (and so absent from the result). */
export interface LoopEntry {
  id: string;
  label: string;
  /** Controlled-source id where the loop is broken. */
  key: string;
  nets: string[];
  /** Member part names (refs), from the key source on. */
  parts: string[];
}

/** A result pinned as "A" for compare mode; the live result is "B". */
export interface PinnedResult {
  result: AnalysisResult;
  feedback: FeedbackResult | null;
  settings: LiveSettings;
  /** Drawing at pin time (for net anchors of A/B marks). */
  doc: DrawingDocument | null;
  runId: number;
}

export interface LiveState {
  /** Id of the latest submitted run (results of older runs are dropped). */
  runId: number;
  status: AnalysisStatus;
  /** Which stages of run `runId` have arrived: 0 none, 1 analyze(), 2 also the feedback analysis. */
  stage: 0 | 1 | 2;
  /** True while stage 2 (feedback) of the current run is still coming. */
  feedbackPending: boolean;
  result: AnalysisResult | null;
  feedback: FeedbackResult | null;
  /** Blackman factors per loop key at settings.frequencyHz (for the wire read-out). */
  blackman: Record<string, BlackmanResult>;
  /** Answer to the newest askLoopDetail() (its id says which ask), null before the first. */
  loopDetail: LoopDetail | null;
  /** Drawing checks + engine errors of the current drawing, placed where possible. */
  issues: LiveIssue[];
  /** The drawing and its netlist the shown result belongs to. */
  doc: DrawingDocument | null;
  drawing: DrawingNetlist | null;
  netlist: Netlist | null;
  settings: LiveSettings;
  /** Loops seen for this drawing (present ones and switched-off ones), by id. */
  loops: Record<string, LoopEntry>;
  pinnedA: PinnedResult | null;
  /** A failure of the worker itself (not of the circuit), else null. */
  failure: string | null;
  /** Where runs execute: 'worker', or 'same-thread' (no Worker, or it could not start). */
  runner: 'worker' | 'same-thread';
}

/** A loop-detail request without its kind and id (the store numbers them). */
export type LoopDetailAsk = Omit<LoopDetailRequest, 'kind' | 'id'>;

export interface SubmitOptions {
  /** An ongoing drag: re-runs are throttled (leading + trailing) instead of run on every move. */
  drag?: boolean;
}

export interface LiveActions {
  /** A new drawing state (every committed edit, and drag previews). */
  submit(doc: DrawingDocument, opts?: SubmitOptions): void;
  setFrequency(hz: number): void;
  setColorMode(mode: ColorMode): void;
  selectLoop(id: string | null): void;
  /** Switch a loop on (true) or off (false); re-runs the analysis. */
  setLoopEnabled(id: string, enabled: boolean): void;
  toggleLoop(id: string): void;
  hoverPole(index: number | null): void;
  hoverNet(net: string | null): void;
  selectNet(net: string | null): void;
  /** Pin the current result as A (compare mode on). */
  pinA(): void;
  /** Leave compare mode. */
  clearPin(): void;
  /** Re-run the current drawing (e.g. after a settings change). */
  rerun(): void;
  /** Ask the worker for a loop's T(jω) or root locus; returns the ask's id (the answer lands in
   *  state.loopDetail with that id; answers to older asks are dropped). */
  askLoopDetail(ask: LoopDetailAsk): number;
  dispose(): void;
}

export interface LiveStore {
  getState(): LiveState;
  subscribe(listener: () => void): () => void;
  actions: LiveActions;
}

export const DEFAULT_SETTINGS: LiveSettings = {
  frequencyHz: 0, colorMode: 'impedance', selectedLoopId: null, offLoopIds: [],
  hoveredPoleIndex: null, hoveredNet: null, selectedNet: null,
};
