/**
 * Phasewright solver — the one public entry (see DEVELOPERS.md).
 *
 * `solveNetlist(text)` compiles netlist text (solver/lang) and analyses it (solver/engine):
 * sweep, traces, loop gains, measures and checks, plus the analyses beyond one sweep (vary,
 * Monte Carlo, poles, sensitivity). It never throws on user input.
 */
import { ENGINE_VERSION } from "./engine";
import { runPipeline, type SolveOptions, solvePipeline } from "./pipeline";
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

export type { SolveOptions } from "./pipeline";

/**
 * Compile and analyse netlist text in this thread (the pipeline of solver/pipeline.ts, run at once);
 * every failure is a `NetlistError` with line and column.
 */
export function solveNetlist(text: string, options: SolveOptions = {}): SolveResult {
  return runPipeline(solvePipeline(text, options));
}
