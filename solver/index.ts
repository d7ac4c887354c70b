/**
 * Phasewright solver — the one public entry (see DEVELOPERS.md).
 *
 * `solveNetlist(text)` compiles netlist text (solver/lang) and analyses it (solver/engine):
 * sweep, traces, loop gains, measures and checks, plus the analyses beyond one sweep (vary,
 * Monte Carlo, poles, sensitivity). It never throws on user input.
 */
import { analyze, ENGINE_VERSION, internalError } from "./engine";
import { addStudies } from "./engine/studies";
import { compile } from "./lang";
import type { SolveResult } from "./types";

export { type AnalyzeOptions, analyze } from "./engine";
export { SparseComplexLU } from "./engine/sparse-lu";
export {
  type CompileOverrides,
  type CompileResult,
  compile,
  parse,
  rewriteLegacyNetlist,
  snap,
} from "./lang";
export { compactResult, expandResult, type StoredResult } from "./stored";
export * from "./types";

/** Version of the solver, reported in every result. */
export const SOLVER_VERSION = ENGINE_VERSION;

export interface SolveOptions {
  /** Refuse sweeps with more points than this (the service's per-request limit). */
  maxPoints?: number;
  /** Most Monte Carlo samples to run (the service's per-request limit). */
  maxSamples?: number;
  /** Leave the steady oscillation out, with this reason (a preview over the service's budget). */
  deferSteady?: string;
  /**
   * Solve the nominal sweep only — no vary, Monte Carlo, sensitivity or steady oscillation — and say
   * why in `result.deferred` (a live preview whose full analysis is over the inline budget).
   */
  nominalOnly?: string;
}

/** Compile and analyse netlist text; every failure is a `NetlistError` with line and column. */
export function solveNetlist(text: string, options: SolveOptions = {}): SolveResult {
  const t0 = performance.now();
  const compiled = compile(text);
  if (!compiled.ok) return { ok: false, errors: compiled.errors, warnings: compiled.warnings };
  const reason = options.nominalOnly;
  const circuit = reason
    ? { ...compiled.circuit, vary: null, monteCarlo: null, sensitivity: [] }
    : compiled.circuit;
  const result = analyze(
    circuit,
    compiled.warnings,
    reason ? { ...options, deferSteady: options.deferSteady ?? reason } : options,
  );
  if (!result.ok) return result;
  try {
    const full = addStudies(text, circuit, result, options);
    if (full.ok && reason) full.deferred = reason;
    if (full.ok) full.stats = { ...full.stats, solveMs: Math.round((performance.now() - t0) * 1000) / 1000 };
    return full;
  } catch (error) {
    return { ok: false, errors: [internalError(error)], warnings: result.warnings };
  }
}
