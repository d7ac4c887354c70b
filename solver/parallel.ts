/**
 * Monte Carlo on worker threads (node:worker_threads) — `solveNetlistParallel(text, options)`.
 * The `vary` variants are solved in this thread, one per turn of the event loop (progress, cancel).
 *
 * The parent compiles and solves the nominal circuit, draws every sample's part values up front
 * (solver/engine/monte-carlo.ts `drawSamples`), then hands chunks of sample indices to a pool of
 * workers that each keep one per-sample kernel (solver/engine/samples.ts). Results are put back
 * in sample order, so the JSON is identical to `solveNetlist` whatever the thread count.
 *
 * The worker entry is `solver/workers/sample-worker.mjs`, which registers tsx's loader and imports
 * the TypeScript task. It is found at `PHASEWRIGHT_SAMPLE_WORKER` or `<cwd>/solver/workers/…`;
 * when it cannot be found or no worker starts, the samples are solved in this thread. The pool
 * itself (retry of a failed chunk on a fresh thread, abort) is solver/sample-pool.ts.
 * Kept out of `solver/index.ts` so a web bundle of the solver never pulls worker_threads in.
 */
import { analyze, internalError, spanError } from "./engine";
import { drawSamples, monteCarloPreflight, summarizeSamples } from "./engine/monte-carlo";
import { type SampleBatch, SampleKernel, solveSampleRange } from "./engine/samples";
import { addStudies, solveVariant, type VaryOutcome } from "./engine/studies";
import type { SolveOptions } from "./index";
import { compile } from "./lang";
import { defaultThreads, solveSamplesOnWorkers, WorkerFault } from "./sample-pool";
import type { Circuit, MonteCarloResult, SolveResult, SolveSuccess, Warning } from "./types";

export {
  defaultThreads,
  sampleWorkerThreads,
  startSampleWorkers,
  stopSampleWorkers,
  workersUnavailableReason,
} from "./sample-pool";

export interface ParallelOptions extends SolveOptions {
  /** Worker threads for the samples: 0 = solve in this thread; default: the cores, at most 4. */
  threads?: number;
  /** Called as variants and samples finish: done of total (vary values + Monte Carlo samples). */
  onProgress?: (done: number, total: number) => void;
  /** Stops handing out variants and samples; the promise then rejects with the signal's reason. */
  signal?: AbortSignal;
}

/** Below this many samples × points the threads' start-up is not worth it. */
export const PARALLEL_MIN_WORK = 20_000;

/**
 * `solveNetlist` with the `vary` variants solved one at a time and the Monte Carlo samples on
 * worker threads (same JSON for the same text and seed). Progress counts variants, then samples:
 * total = vary values + samples, each weighing one sweep as in the queue's work measure
 * (lib/jobs.ts `solveWork`); done grows to total. With neither it reports 1 of 1 when done.
 * Yields to the event loop between variants and between chunks of samples, so `signal` is
 * honoured there. Never rejects on user input; rejects only when `signal` aborts.
 */
export async function solveNetlistParallel(
  text: string,
  options: ParallelOptions = {},
): Promise<SolveResult> {
  const t0 = performance.now();
  const compiled = compile(text);
  if (!compiled.ok) return { ok: false, errors: compiled.errors, warnings: compiled.warnings };
  const result = analyze(compiled.circuit, compiled.warnings, options);
  if (!result.ok) return result;
  const circuit = compiled.circuit;
  const variantCount = circuit.vary?.values.length ?? 0;
  const total = variantCount + (circuit.monteCarlo?.samples ?? 0);
  let vary: VaryOutcome | undefined;
  if (circuit.vary) {
    const onDone = (done: number) => options.onProgress?.(done, total);
    try {
      vary = await parallelVary(text, circuit, result.frequencies, onDone, options);
    } catch (error) {
      if (options.signal?.aborted) throw error;
      // A fault of the engine, as solveNetlist reports one from addStudies.
      return { ok: false, errors: [internalError(error)], warnings: result.warnings };
    }
  }
  let mc: { result: MonteCarloResult | string; warnings: Warning[] } | undefined;
  if (circuit.monteCarlo) {
    const onProgress = options.onProgress;
    try {
      mc = await parallelMonteCarlo(circuit, result, {
        ...options,
        onProgress: onProgress && ((done) => onProgress(variantCount + done, total)),
      });
    } catch (error) {
      if (!(error instanceof WorkerFault)) throw error;
      const fault = spanError(
        circuit.monteCarlo.span,
        "the Monte Carlo samples could not be solved",
        error.message,
      );
      return { ok: false, errors: [fault], warnings: result.warnings };
    }
  }
  options.signal?.throwIfAborted();
  try {
    const full = addStudies(text, circuit, result, {
      ...options,
      ...(vary ? { vary } : {}),
      ...(mc ? { monteCarlo: mc } : {}),
    });
    if (full.ok) full.stats = { ...full.stats, solveMs: Math.round((performance.now() - t0) * 1000) / 1000 };
    if (total === 0) options.onProgress?.(1, 1);
    return full;
  } catch (error) {
    return { ok: false, errors: [internalError(error)], warnings: result.warnings };
  }
}

/**
 * The `vary` variants in value order, one per turn of the event loop (progress, cancel): a
 * variant is one full sweep with traces, solved in this thread.
 */
async function parallelVary(
  text: string,
  circuit: Circuit,
  freqs: number[],
  onDone: (done: number) => void,
  options: ParallelOptions,
): Promise<VaryOutcome> {
  const out: VaryOutcome = { variants: [], warnings: [] };
  const values = circuit.vary?.values ?? [];
  for (let i = 0; i < values.length; i++) {
    options.signal?.throwIfAborted();
    solveVariant(text, circuit, freqs, values[i]!, out);
    onDone(i + 1);
    await new Promise<void>((r) => setImmediate(r));
  }
  return out;
}

async function parallelMonteCarlo(
  circuit: Circuit,
  nominal: SolveSuccess,
  options: ParallelOptions,
): Promise<{ result: MonteCarloResult | string; warnings: Warning[] }> {
  const warnings: Warning[] = [];
  const problem = monteCarloPreflight(circuit, warnings, options);
  if (problem) return { result: problem, warnings };
  const draws = drawSamples(circuit, circuit.monteCarlo!);
  const freqs = nominal.frequencies;
  const threads = options.threads ?? defaultThreads();
  let batches: SampleBatch[] | null = null;
  if (threads > 0 && draws.samples * freqs.length >= PARALLEL_MIN_WORK) {
    try {
      batches = await solveSamplesOnWorkers(
        circuit,
        freqs,
        draws,
        threads,
        options.onProgress,
        options.signal,
      );
    } catch (error) {
      // An abort, or a chunk that failed twice on fresh threads: the run fails with the reason
      // (solving it again in this thread could take the whole process down the same way).
      if (options.signal?.aborted || error instanceof WorkerFault) throw error;
      batches = null;
    }
  }
  if (!batches) {
    const kernel = new SampleKernel(circuit, freqs, draws.names);
    const batch = await solveInThread(kernel, draws, options);
    batches = [batch];
  }
  return { result: summarizeSamples(circuit, nominal, batches, warnings), warnings };
}

/** In-thread samples in chunks, yielding to the event loop between them (progress, cancel). */
async function solveInThread(
  kernel: SampleKernel,
  draws: { names: string[]; samples: number; values: Float64Array },
  options: ParallelOptions,
): Promise<SampleBatch> {
  const m = kernel.measureCount;
  const total = draws.samples;
  const all: SampleBatch = {
    from: 0,
    to: total,
    values: new Float64Array(total * m),
    passed: new Uint8Array(total),
    failed: new Uint8Array(total),
  };
  const step = 50;
  for (let s = 0; s < total; s += step) {
    options.signal?.throwIfAborted();
    const b = solveSampleRange(kernel, draws.values, draws.names.length, s, Math.min(total, s + step));
    all.values.set(b.values, s * m);
    all.passed.set(b.passed, s);
    all.failed.set(b.failed, s);
    options.onProgress?.(b.to, total);
    await new Promise<void>((r) => setImmediate(r));
  }
  return all;
}
