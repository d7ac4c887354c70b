/**
 * Shared types of the Phasewright solver.
 *
 * Two halves meet here:
 *  - the language (`solver/lang/`): text → parse tree → an elaborated, flat `Circuit`;
 *  - the engine (`solver/engine/`): `Circuit` → modified nodal analysis per frequency → `SolveResult`.
 * The result types mirror the JSON contract of NETLIST.md ("Machine-readable result") exactly;
 * the API and the CLI print them unchanged.
 */

/** A place in the netlist text. Lines and columns are 1-based; endColumn is exclusive. */
export interface SourceSpan {
  line: number;
  column: number;
  endColumn: number;
}

/** A netlist error as the user sees it (NETLIST.md "On bad input"). */
export interface NetlistError extends SourceSpan {
  message: string;
  hint?: string;
  /** A known rewrite that resolves this error (an editor offers it as a quick fix). */
  fix?: NetlistFix;
}

/**
 * A machine-readable fix: replace the text of `line` from `column` to `endColumn` (1-based,
 * exclusive, on that one physical line) with `text`. `label` says it in words for a menu.
 */
export interface NetlistFix extends SourceSpan {
  text: string;
  label: string;
}

export interface Warning {
  /** 1-based line the warning is about, or null when it concerns the whole netlist. */
  line: number | null;
  message: string;
}

export type PartKind =
  | "resistor"
  | "capacitor"
  | "inductor"
  | "vsource"
  | "isource"
  | "vcvs"
  | "vccs"
  | "ccvs"
  | "cccs"
  | "opamp"
  | "diode";

/** Ground's name (the only spelling the language accepts). */
export const GROUND = "gnd";

/** One part after blocks are flattened and values evaluated. */
export interface Part {
  /** Full name, block instances joined with dots: "X1.R1". */
  name: string;
  kind: PartKind;
  /** Flattened node names in the order of the kind's terminals (ground is "gnd"). */
  nodes: string[];
  /**
   * The part's value in SI base units: ohms, farads, henries, volts or amperes (AC amplitude),
   * the gain of a vcvs/cccs, siemens of a vccs, ohms of a ccvs. 0 for an opamp.
   */
  value: number;
  /** Tolerance as a fraction (1% → 0.01), when given. */
  tol?: number;
  /** Source phase in degrees (vsource, isource). */
  phaseDeg?: number;
  /** ccvs/cccs: full name of the sensing vsource or inductor. */
  sense?: string;
  /** opamp options; all absent means the ideal nullor. */
  opamp?: {
    gain?: number;
    gbw?: number;
    rout?: number;
    /** Output limit ±V (steady oscillation only). */
    swing?: number;
    /** Second pole, Hz (LANGUAGE-NEXT §6). */
    pole2?: number;
    /** Input noise voltage density at the + input, V/√Hz. */
    en?: number;
    /** Input noise current density into each input, A/√Hz. */
    in?: number;
    /** 1/f corner of en and in, Hz. */
    fc?: number;
  };
  /** diode options: saturation current (A), emission coefficient, and the junction temperature (K). */
  diode?: { is: number; n: number; kelvin: number };
  /** Where the part line is (for block instances: the line inside the block). */
  span: SourceSpan;
}

/** A probe expression evaluated per frequency on complex values. */
export type Probe =
  | { op: "num"; value: number }
  | { op: "v"; node: string; ref?: string }
  | { op: "i"; part: string }
  | { op: "neg"; arg: Probe }
  | { op: "+" | "-" | "*" | "/"; left: Probe; right: Probe };

export type Sweep =
  | { kind: "log"; start: number; stop: number; perDecade: number }
  | { kind: "linear"; start: number; stop: number; points: number }
  | { kind: "list"; points: number[] };

export interface Show {
  name: string;
  probe: Probe;
  /** The probe as written, for display. */
  text: string;
  span: SourceSpan;
}

/** How a loop gain is measured (NETLIST.md "Loop gain"). */
export type LoopMethod = "cut" | "injection";

export interface LoopCut {
  name: string;
  /** The node that is cut (or, with `injection`, where the test sources are inserted). */
  node: string;
  /** Parts whose terminals on `node` move to the new node node′. */
  before: string[];
  /**
   * `cut` (the default when absent): node′ driven by an ideal source, exact only behind an ideal
   * voltage output. `injection`: double injection on the closed loop, exact whatever drives node.
   */
  method?: LoopMethod;
  span: SourceSpan;
}

/** The literal level of `crossing` and `bandwidth`. */
export type Level =
  | { kind: "db"; value: number }
  | { kind: "mag"; value: number }
  | { kind: "deg"; value: number }
  | { kind: "half-power" };

export type MeasureFunction =
  | "zero-phase"
  | "crossing"
  | "peak"
  | "dip"
  | "bandwidth"
  | "q"
  | "unity"
  | "phase-margin"
  | "gain-margin"
  | "mag"
  | "db"
  | "phase"
  | "group-delay"
  | "noise"
  | "input-noise"
  | "frequency"
  | "amplitude"
  | "thd"
  | "startup";

export interface MeasureDef {
  name: string;
  fn: MeasureFunction;
  /** The trace or loop name the function reads (`amplitude`/`thd`: the probe's text). */
  target: string;
  /** `amplitude`/`thd`: the probe read from the steady state. */
  probe?: Probe;
  level?: Level;
  /** `mag/db/phase … at F`: a frequency in Hz or the name of an earlier measure. */
  at?: { hz: number } | { measure: string };
  /** `noise/input-noise … from F1 to F2`: the band integrated over. */
  band?: { from: { hz: number } | { measure: string }; to: { hz: number } | { measure: string } };
  span: SourceSpan;
}

/** `noise NAME = PROBE [input SOURCE]` (NETLIST.md "Noise"). */
export interface NoiseDef {
  name: string;
  /** A voltage probe: volts(NODE) or volts(A, B). */
  probe: Probe;
  text: string;
  /** The independent source the density is referred to, if any. */
  input?: string;
  span: SourceSpan;
}

/** `zeros PROBE`: the transfer's finite zeros from the one independent source to PROBE. */
export interface ZerosDef {
  probe: Probe;
  text: string;
  span: SourceSpan;
}

export interface CheckDef {
  /** The measure the check reads. */
  measure: string;
  op: "<" | "<=" | ">" | ">=" | "between";
  value: number;
  /** Upper bound for `between`. */
  value2?: number;
  /** The check as written after `check`, e.g. "gain >= 1". */
  expression: string;
  span: SourceSpan;
}

export interface VaryDef {
  /** A `let` name or a part name. */
  target: string;
  targetKind: "let" | "part";
  values: number[];
  span: SourceSpan;
}

export interface MonteCarloDef {
  samples: number;
  seed: number;
  dist: "uniform" | "normal";
  span: SourceSpan;
}

/** A netlist after parsing and elaboration: everything the engine needs, nothing textual. */
export interface Circuit {
  title: string | null;
  parts: Part[];
  /** All node names except ground, in first-seen order. */
  nodes: string[];
  sweep: Sweep;
  /** True when the netlist had no sweep statement and the default was used. */
  defaultSweep: boolean;
  /** Where the sweep statement is (absent for the default sweep): errors about the sweep point here. */
  sweepSpan?: SourceSpan;
  shows: Show[];
  loops: LoopCut[];
  measures: MeasureDef[];
  checks: CheckDef[];
  vary: VaryDef | null;
  monteCarlo: MonteCarloDef | null;
  poles: boolean;
  sensitivity: { measure: string; span: SourceSpan }[];
  /** `noise` statements (absent or empty: none). */
  noise?: NoiseDef[];
  /** `zeros` statements (absent or empty: none). */
  zeros?: ZerosDef[];
  /** Temperature in kelvin (`temperature`, default 27 °C = 300.15 K): diodes and noise. */
  temperature: number;
  /** `steady LOOP …`: the steady oscillation of a loop, or null. */
  steady: SteadyDef | null;
}

/** `steady LOOP [harmonics=N] [from=LEVEL]` (NETLIST.md "Steady oscillation"). */
export interface SteadyDef {
  loop: string;
  /** Number of harmonics N (default 15). */
  harmonics: number;
  /** Start level of the envelope at the cut node, volts (default 1 µV). */
  from: number;
  span: SourceSpan;
}

// ---------------------------------------------------------------------------------------------
// Result JSON (NETLIST.md). Field names are the API contract: change them only with the spec.

export interface TraceResult {
  name: string;
  kind: "probe" | "loop";
  re: number[];
  im: number[];
  magnitudeDb: number[];
  phaseDeg: number[];
  /** −d∠X/dω in seconds at each frequency, exact from dX/ds; null where |X| = 0. */
  groupDelay?: (number | null)[];
}

export interface NoiseContribution {
  part: string;
  /** Which noise of the part: a resistor's thermal noise, an op-amp's `en` or `in`. */
  source: "thermal" | "en" | "in";
  /** This source's share of the output density, V/√Hz (shares add in power); null where infinite. */
  density: (number | null)[];
}

export interface NoiseResult {
  name: string;
  probe: string;
  /** Output noise density, V/√Hz, at each frequency of the sweep (null where infinite: 1/f at 0 Hz). */
  density: (number | null)[];
  /** Input-referred density (output ÷ |gain from the input source|), or null without `input`. */
  inputDensity: (number | null)[] | null;
  input: string | null;
  contributions: NoiseContribution[];
  /** Kelvin the resistors' noise was computed at. */
  temperature: number;
}

export interface ZeroResult {
  probe: string;
  re: number;
  im: number;
  frequencyHz: number;
  q: number | null;
}

export interface MeasureResult {
  name: string;
  value: number | null;
  unit: string;
  reason: string | null;
}

export interface CheckResult {
  name: string;
  expression: string;
  pass: boolean;
  reason: string | null;
}

export interface VariantResult {
  name: string;
  value: number;
  traces: TraceResult[];
  measures: MeasureResult[];
  checks: CheckResult[];
}

export interface MeasureStats {
  name: string;
  mean: number | null;
  std: number | null;
  min: number | null;
  max: number | null;
  percentiles: {
    p1: number | null;
    p5: number | null;
    p50: number | null;
    p95: number | null;
    p99: number | null;
  };
  histogram: { edges: number[]; counts: number[] };
}

export interface MonteCarloCheck {
  /** The measure the check reads. */
  name: string;
  expression: string;
  op: CheckDef["op"];
  value: number;
  value2?: number;
  yield: number;
}

export interface MonteCarloResult {
  samples: number;
  seed: number;
  yield: number;
  measures: MeasureStats[];
  /** Each check's share of passing samples (a failed sample fails every check), with its limits. */
  checks?: MonteCarloCheck[];
}

export interface PoleResult {
  re: number;
  im: number;
  frequencyHz: number;
  q: number | null;
  growthPerCycle: number | null;
}

export interface SensitivityResult {
  measure: string;
  part: string;
  value: number | null;
}

/** One probe of the steady oscillation (NETLIST.md "Steady oscillation"). */
export interface SteadyProbe {
  probe: string;
  /** Peak amplitude of harmonics 1…N (one-sided: a sine of peak A has amplitudes[0] = A). */
  amplitudes: number[];
  /** Phase of harmonics 1…N in degrees, cosine reference, the cut node's fundamental at 0°. */
  phasesDeg: number[];
  /** The mean (harmonic 0). */
  dc: number;
  thdPercent: number;
  /** One period, uniformly sampled (t from 0 to T exclusive). */
  waveform: { t: number[]; value: number[] };
}

/** The steady oscillation of a loop; null figures come with their reason. */
export interface SteadyResult {
  loop: string;
  /** null when there is no steady oscillation (reason says why). */
  frequencyHz: number | null;
  harmonics: number;
  startup: { sigma: number; seconds: number | null; cycles: number | null; from: number } | null;
  probes: SteadyProbe[];
  /** Newton's final residual (largest harmonic mismatch relative to the largest harmonic), and steps. */
  residual: number | null;
  iterations: number;
  /** Why there is no result (it does not start, nothing limits it, Newton did not converge), else null. */
  reason: string | null;
  /** The verdict in one sentence. */
  summary: string;
  /** The describing-function estimate the solve started from (fundamental only), when found. */
  estimate: { frequencyHz: number; amplitude: number; node: string } | null;
  /** Envelope growth at the cut node: time (s) and peak level (V), from the start level to the steady amplitude. */
  envelope: { t: number[]; level: number[] } | null;
  notes: string[];
}

/** A loop's gain where its phase crosses 0°, refined on the circuit (null with a reason when it does not cross). */
export interface ZeroPhaseLoop {
  loop: string;
  frequencyHz: number | null;
  /** |T| there. */
  gain: number | null;
  reason: string | null;
  /** The checks (as written) that read a measure of this loop: the verdict names their Monte Carlo yield. */
  checks: string[];
}

export interface SolveStats {
  nodes: number;
  unknowns: number;
  points: number;
  solveMs: number;
}

export interface SolveSuccess {
  ok: true;
  title: string | null;
  solverVersion: string;
  frequencies: number[];
  traces: TraceResult[];
  measures: MeasureResult[];
  checks: CheckResult[];
  warnings: Warning[];
  stats: SolveStats;
  variants?: VariantResult[];
  monteCarlo?: MonteCarloResult;
  poles?: PoleResult[];
  /** Each loop's refined gain at zero phase (the oscillator verdict reads these). */
  zeroPhase?: ZeroPhaseLoop[];
  sensitivity?: SensitivityResult[];
  noise?: NoiseResult[];
  zeros?: ZeroResult[];
  steady?: SteadyResult;
  /** Set when only the nominal sweep was solved (a preview over the inline budget): why, in words. */
  deferred?: string;
}

export interface SolveFailure {
  ok: false;
  errors: NetlistError[];
  warnings?: Warning[];
}

export type SolveResult = SolveSuccess | SolveFailure;
