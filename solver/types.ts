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
  | "opamp";

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
  opamp?: { gain?: number; gbw?: number; rout?: number };
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
  | "phase";

export interface MeasureDef {
  name: string;
  fn: MeasureFunction;
  /** The trace or loop name the function reads. */
  target: string;
  level?: Level;
  /** `mag/db/phase … at F`: a frequency in Hz or the name of an earlier measure. */
  at?: { hz: number } | { measure: string };
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
}

export interface SolveFailure {
  ok: false;
  errors: NetlistError[];
  warnings?: Warning[];
}

export type SolveResult = SolveSuccess | SolveFailure;
