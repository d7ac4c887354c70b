/**
 * The analysis statements of a netlist after elaboration: measures and their levels, checks,
 * noise, zeros, vary, Monte Carlo and steady oscillation.
 */
import type { Probe } from "./circuit";
import type { SourceSpan } from "./diagnostics";

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

/** `steady LOOP [harmonics=N] [from=LEVEL]` (NETLIST.md "Steady oscillation"). */
export interface SteadyDef {
  loop: string;
  /** Number of harmonics N (default 15). */
  harmonics: number;
  /** Start level of the envelope at the cut node, volts (default 1 µV). */
  from: number;
  span: SourceSpan;
}
