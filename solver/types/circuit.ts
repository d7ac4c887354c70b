/**
 * The elaborated, flat circuit the language hands to the engine: parts, probes, sweep, shows and
 * loops, and the `Circuit` that gathers them with the statements of statements.ts.
 */
import type { SourceSpan } from "./diagnostics";
import type {
  CheckDef,
  MeasureDef,
  MonteCarloDef,
  NoiseDef,
  SteadyDef,
  VaryDef,
  ZerosDef,
} from "./statements";

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
