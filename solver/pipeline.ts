/**
 * The one solve pipeline: compile → analyse the nominal sweep (sweep, traces, loops, measures,
 * checks) → vary → Monte Carlo → poles, zeros, sensitivity → result.
 *
 * It is written once, as a generator that pauses between variants, between chunks of samples and
 * where the Monte Carlo step hands its samples to a strategy. `solveNetlist` (solver/index.ts) runs
 * it to the end at once with `runPipeline`; `solveNetlistParallel` (solver/parallel.ts) awaits at
 * every pause (progress, cancel) and plugs in worker threads as the Monte Carlo step. The samples
 * are drawn up front in one stream and summarized in sample order, so every driver and every
 * strategy give the same JSON for the same text and seed.
 */
import { analyze } from "./engine";
import { internalError, spanError } from "./engine/errors";
import { drawSamples, monteCarloPreflight, type SampleDraws, summarizeSamples } from "./engine/monte-carlo";
import { type SampleBatch, SampleKernel, solveSampleRange } from "./engine/samples";
import { addStructureStudies, solveVariant, type VaryOutcome } from "./engine/studies";
import { compile } from "./lang";
import type { Circuit, SolveResult, SolveSuccess } from "./types";

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

/** The Monte Carlo samples handed to a strategy: every sample's part values, drawn up front. */
export interface SampleJob {
  circuit: Circuit;
  freqs: number[];
  draws: SampleDraws;
  /** Samples done of draws.samples. */
  onProgress?: (done: number, total: number) => void;
  signal?: AbortSignal;
}

/**
 * A Monte Carlo step that solves the samples elsewhere (worker threads): batches covering every
 * sample, or null to have them solved in this thread. It rejects with a `SampleFault` when the
 * samples cannot be solved (the run fails with the reason), or with the signal's reason on abort.
 */
export type SampleStrategy = (job: SampleJob) => Promise<SampleBatch[] | null>;

/** Options of the pipeline as the asynchronous driver uses them. */
export interface PipelineOptions extends SolveOptions {
  /** Called as variants and samples finish: done of total (vary values + Monte Carlo samples). */
  onProgress?: (done: number, total: number) => void;
  /** Checked at every pause; the driver then rejects with the signal's reason. */
  signal?: AbortSignal;
  /** Where the Monte Carlo samples are solved; default (or when it answers null): this thread. */
  samples?: SampleStrategy;
}

/** The samples cannot be solved (a worker thread failed the same chunk twice): the run fails. */
export class SampleFault extends Error {}

/** A pause of the pipeline: the asynchronous driver yields to the event loop and checks the signal. */
export const PAUSE: unique symbol = Symbol("pause");

/** What the pipeline yields: a pause, or the promise of a Monte Carlo strategy to wait for. */
type PipelineStep = typeof PAUSE | Promise<SampleBatch[] | null>;

/** The pipeline's steps; its return value is the result. Never throws on user input. */
export type Pipeline = Generator<PipelineStep, SolveResult, unknown>;

/** Samples solved in this thread between two pauses. */
const IN_THREAD_CHUNK = 50;

/** The pipeline for one netlist text (see the file's comment); drive it with a driver. */
export function* solvePipeline(text: string, options: PipelineOptions = {}): Pipeline {
  const t0 = performance.now();
  const compiled = compile(text);
  if (!compiled.ok) return { ok: false, errors: compiled.errors, warnings: compiled.warnings };
  const reason = options.nominalOnly;
  const circuit = reason
    ? { ...compiled.circuit, vary: null, monteCarlo: null, sensitivity: [] }
    : compiled.circuit;
  const nominal = analyze(
    circuit,
    compiled.warnings,
    reason ? { ...options, deferSteady: options.deferSteady ?? reason } : options,
  );
  if (!nominal.ok) return nominal;
  const variantCount = circuit.vary?.values.length ?? 0;
  const total = variantCount + (circuit.monteCarlo?.samples ?? 0);
  let full: SolveResult;
  try {
    full = yield* studies(text, circuit, nominal, options, (done) => options.onProgress?.(done, total));
  } catch (error) {
    if (options.signal?.aborted) throw error;
    return { ok: false, errors: [internalError(error)], warnings: nominal.warnings };
  }
  if (full.ok && reason) full.deferred = reason;
  if (full.ok) full.stats = { ...full.stats, solveMs: Math.round((performance.now() - t0) * 1000) / 1000 };
  if (total === 0) options.onProgress?.(1, 1);
  return full;
}

/** The analyses beyond the nominal sweep, in the result's order; `progress` counts variants, then samples. */
function* studies(
  text: string,
  circuit: Circuit,
  nominal: SolveSuccess,
  options: PipelineOptions,
  progress: (done: number) => void,
): Generator<PipelineStep, SolveResult, unknown> {
  const out: SolveSuccess = { ...nominal };
  const warnings = out.warnings;
  const freqs = nominal.frequencies;
  if (circuit.vary) {
    const vary: VaryOutcome = { variants: [], warnings: [] };
    for (const [i, value] of circuit.vary.values.entries()) {
      yield PAUSE;
      solveVariant(text, circuit, freqs, value, vary);
      progress(i + 1);
    }
    warnings.push(...vary.warnings);
    out.variants = vary.variants;
  }
  if (circuit.monteCarlo) {
    const offset = circuit.vary?.values.length ?? 0;
    const problem = monteCarloPreflight(circuit, warnings, options);
    if (problem) return { ok: false, errors: [{ ...circuit.monteCarlo.span, message: problem }], warnings };
    const draws = drawSamples(circuit, circuit.monteCarlo);
    const job: SampleJob = {
      circuit,
      freqs,
      draws,
      onProgress: (done) => progress(offset + done),
      ...(options.signal ? { signal: options.signal } : {}),
    };
    let batches: SampleBatch[] | null = null;
    try {
      if (options.samples) batches = (yield options.samples(job)) as SampleBatch[] | null;
    } catch (error) {
      if (!(error instanceof SampleFault)) throw error;
      const fault = spanError(
        circuit.monteCarlo.span,
        "the Monte Carlo samples could not be solved",
        error.message,
      );
      return { ok: false, errors: [fault], warnings };
    }
    batches ??= yield* samplesInThread(job);
    out.monteCarlo = summarizeSamples(circuit, nominal, batches, warnings);
  }
  yield PAUSE;
  addStructureStudies(circuit, out);
  return out;
}

/** The in-thread Monte Carlo step: chunks of samples with a pause between them (progress, cancel). */
function* samplesInThread(job: SampleJob): Generator<PipelineStep, SampleBatch[], unknown> {
  const { draws } = job;
  const kernel = new SampleKernel(job.circuit, job.freqs, draws.names);
  const batches: SampleBatch[] = [];
  for (let s = 0; s < draws.samples; s += IN_THREAD_CHUNK) {
    yield PAUSE;
    const to = Math.min(draws.samples, s + IN_THREAD_CHUNK);
    batches.push(solveSampleRange(kernel, draws.values, draws.names.length, s, to));
    job.onProgress?.(to, draws.samples);
  }
  return batches;
}

/** Run the pipeline to its end in this thread (no pauses; the Monte Carlo step must be in-thread). */
export function runPipeline(pipeline: Pipeline): SolveResult {
  let step = pipeline.next();
  while (!step.done) {
    if (step.value !== PAUSE) throw new Error("an asynchronous Monte Carlo step needs solveNetlistParallel");
    step = pipeline.next();
  }
  return step.value;
}
