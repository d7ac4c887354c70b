/**
 * The pipeline (solver/pipeline.ts) driven asynchronously, with the Monte Carlo samples on worker
 * threads (node:worker_threads) — `solveNetlistParallel(text, options)`, used by the job runner.
 * The `vary` variants and in-thread samples are solved in this thread, one pause of the pipeline per
 * turn of the event loop (progress, cancel).
 *
 * The pipeline draws every sample's part values up front (solver/engine/monte-carlo.ts
 * `drawSamples`); the worker step here hands chunks of sample indices to a pool of workers that
 * each keep one per-sample kernel (solver/engine/samples.ts). Results are put back in sample order,
 * so the JSON is identical to `solveNetlist` whatever the thread count.
 *
 * The worker entry is `solver/workers/sample-worker.mjs`, which registers tsx's loader and imports
 * the TypeScript task. It is found at `PHASEWRIGHT_SAMPLE_WORKER` or `<cwd>/solver/workers/…`;
 * when it cannot be found or no worker starts, the samples are solved in this thread. The pool
 * itself (retry of a failed chunk on a fresh thread, abort) is solver/sample-pool.ts.
 * Kept out of `solver/index.ts` so a web bundle of the solver never pulls worker_threads in.
 */
import {
  PAUSE,
  type Pipeline,
  type PipelineOptions,
  SampleFault,
  type SampleStrategy,
  type SolveOptions,
  solvePipeline,
} from "./pipeline";
import { defaultThreads, solveSamplesOnWorkers } from "./sample-pool";
import type { SolveResult } from "./types";

export {
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
const PARALLEL_MIN_WORK = 20_000;

/**
 * `solveNetlist` with the `vary` variants solved one at a time and the Monte Carlo samples on
 * worker threads (same JSON for the same text and seed). Progress counts variants, then samples:
 * total = vary values + samples, each weighing one sweep as in the queue's work measure
 * (lib/jobs.ts `solveWork`); done grows to total. With neither it reports 1 of 1 when done.
 * Yields to the event loop between variants and between chunks of samples, so `signal` is
 * honoured there. Never rejects on user input; rejects only when `signal` aborts.
 */
export function solveNetlistParallel(text: string, options: ParallelOptions = {}): Promise<SolveResult> {
  const { threads = defaultThreads(), ...rest } = options;
  const samples = threads > 0 ? onWorkers(threads) : undefined;
  return runPipelineAsync(solvePipeline(text, { ...rest, ...(samples ? { samples } : {}) }), rest);
}

/**
 * The worker-thread Monte Carlo step: null (solve in this thread) below PARALLEL_MIN_WORK or when
 * no thread starts. An abort, or a chunk that failed twice on fresh threads, rejects: the run fails
 * with the reason (solving it again in this thread could take the whole process down the same way).
 */
function onWorkers(threads: number): SampleStrategy {
  return async (job) => {
    if (job.draws.samples * job.freqs.length < PARALLEL_MIN_WORK) return null;
    try {
      return await solveSamplesOnWorkers(job, threads);
    } catch (error) {
      if (job.signal?.aborted || error instanceof SampleFault) throw error;
      return null;
    }
  };
}

/**
 * Drive the pipeline: at each pause yield to the event loop and check the signal; wait for a
 * Monte Carlo strategy's promise and hand its answer (or its rejection) back to the pipeline.
 */
export async function runPipelineAsync(pipeline: Pipeline, options: PipelineOptions): Promise<SolveResult> {
  let step = pipeline.next();
  while (!step.done) {
    let answer: unknown;
    try {
      if (step.value === PAUSE) {
        options.signal?.throwIfAborted();
        await new Promise<void>((resolve) => setImmediate(resolve));
        options.signal?.throwIfAborted();
      } else answer = await step.value;
    } catch (error) {
      step = pipeline.throw(error);
      continue;
    }
    step = pipeline.next(answer);
  }
  return step.value;
}
