/**
 * Result JSON of a solve (NETLIST.md "Machine-readable result"): traces, measures, checks, variants,
 * Monte Carlo and the success/failure envelope. Field names are the API contract: change them only
 * with the spec.
 */
import type { NetlistError, Warning } from "./diagnostics";
import type { CheckDef } from "./statements";
import type { NoiseResult, PoleResult, SensitivityResult, SteadyResult, ZeroResult } from "./studies";

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
