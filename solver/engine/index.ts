/**
 * The engine's entry: `analyze` an elaborated circuit (the nominal sweep, traces, loop gains,
 * measures and checks; NETLIST.md). The steps beyond one sweep are in solver/pipeline.ts.
 */
import type { Circuit, SolveResult, Warning } from "../types";
import { sweepCircuit } from "./circuit-sweep";
import { internalError, spanError } from "./errors";
import { loopsAtZeroPhase } from "./oscillation";
import { sweepFrequencies } from "./sweep";

export const ENGINE_VERSION = "1.0.0";

/** Options of one analysis run. */
export interface AnalyzeOptions {
  /** Refuse sweeps with more points than this (the service's per-request limit). */
  maxPoints?: number;
  /** Leave the steady oscillation out, with this reason (a preview over the service's budget). */
  deferSteady?: string;
}

/**
 * Analyse an elaborated circuit: sweep, traces, loop gains, measures and checks (NETLIST.md).
 * `warnings` (from the language) are carried into the result; engine warnings are appended.
 * Never throws on user input: failures come back as `{ok: false, errors}`.
 */
export function analyze(
  circuit: Circuit,
  warnings: Warning[] = [],
  options: AnalyzeOptions = {},
): SolveResult {
  try {
    return analyzeUnguarded(circuit, warnings, options);
  } catch (error) {
    return { ok: false, errors: [internalError(error)], warnings };
  }
}

function analyzeUnguarded(circuit: Circuit, warnings: Warning[], options: AnalyzeOptions): SolveResult {
  const t0 = performance.now();
  const warn = [...warnings];
  if (circuit.defaultSweep) {
    warn.push({ line: null, message: "no sweep statement: used 10 Hz to 10 MHz, 100 points per decade" });
  }
  const freqs = sweepFrequencies(circuit.sweep);
  if (typeof freqs === "string")
    return { ok: false, errors: [spanError(circuit.sweepSpan, freqs)], warnings: warn };
  if (options.maxPoints !== undefined && freqs.length > options.maxPoints) {
    return {
      ok: false,
      errors: [
        spanError(
          circuit.sweepSpan,
          `the sweep has ${freqs.length} points; this service allows at most ${options.maxPoints}`,
          "use fewer points per decade or a narrower range",
        ),
      ],
      warnings: warn,
    };
  }
  const run = sweepCircuit(circuit, freqs, warn, options.deferSteady, true);
  if (!run.ok) return { ok: false, errors: run.errors, warnings: warn };
  const { outcome } = run;
  return {
    ok: true,
    title: circuit.title,
    solverVersion: ENGINE_VERSION,
    frequencies: freqs,
    traces: outcome.traces,
    measures: outcome.measures,
    checks: outcome.checks,
    ...(circuit.loops.length > 0 ? { zeroPhase: loopsAtZeroPhase(circuit, outcome.samplers) } : {}),
    warnings: warn,
    ...(outcome.noise.length > 0 ? { noise: outcome.noise } : {}),
    ...(outcome.steady ? { steady: outcome.steady } : {}),
    stats: {
      nodes: circuit.nodes.length,
      unknowns: outcome.system.n,
      points: freqs.length,
      solveMs: Math.round((performance.now() - t0) * 1000) / 1000,
    },
  };
}
