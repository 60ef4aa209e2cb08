// Plain input data of the plots. Shapes match what the engine returns (src/engine/index.ts and
// src/engine/feedback/), so engine results can be passed straight in: a Pole/Zero is a PlotRoot,
// a Sweep is a BodeInput's curve, LoopMargins fits MarginsInput, RootLocus fits LocusInput,
// PoleChange fits PoleMigration, StepResponse fits StepInput. Frequencies in Hz, roots in rad/s.

/** A pole or zero in rad/s (s = re + j·im). */
export interface PlotRoot {
  re: number;
  im: number;
  /** Quality factor of a complex pair, when known. */
  q?: number | null;
  rhp?: boolean;
  /** Zero that cancels a pole (drawn lighter). */
  cancelsPole?: boolean;
}

export interface PlotSize {
  width?: number;
  height?: number;
}

export interface FrequencyCurve {
  hz: number[];
  magDb: (number | null)[];
  phaseDeg: (number | null)[];
}

export interface BodeInput extends FrequencyCurve {
  /** What is plotted, e.g. "V1 → out". */
  label?: string;
  poles?: PlotRoot[];
  zeros?: PlotRoot[];
}

export interface MarginsInput {
  status?: string;
  message?: string;
  unityGainHz: number | null;
  phaseMarginDeg: number | null;
  phaseCrossHz: number | null;
  gainMarginDb: number | null;
}

export interface LoopGainInput extends FrequencyCurve {
  /** Loop name, e.g. "A1 → M2". */
  label?: string;
  margins: MarginsInput | null;
}

export interface ImpedanceInput {
  node: string;
  hz: number[];
  /** |Z| in ohms; null where undefined (e.g. the node is open at that frequency). */
  ohms: (number | null)[];
  /** Frequencies to mark on the axis (e.g. the node's pole), Hz. */
  markHz?: number[];
}

export interface LocusInput {
  k: number[];
  /** branches[b].re[i], .im[i]: pole b at k[i] (rad/s); null where that pole does not exist. */
  branches: { re: (number | null)[]; im: (number | null)[] }[];
  /** Gain factor of the drawn circuit (default 1). */
  drawnK?: number;
  status?: string;
  message?: string;
}

/** One pole's move between two analyses (compare mode): A = before, B = after. */
export interface PoleMigration {
  before: PlotRoot | null;
  after: PlotRoot | null;
}

export interface SplaneInput {
  poles: PlotRoot[];
  zeros: PlotRoot[];
  locus?: LocusInput | null;
  migrations?: PoleMigration[];
  /** Names of the two compared states, default "A" and "B". */
  compareLabels?: [string, string];
}

export interface StepInput {
  status?: string;
  message?: string;
  t: number[];
  y: number[];
  finalValue: number | null;
  settling: { tolerance: number; seconds: number | null }[];
  overshoot?: number | null;
  label?: string;
}
