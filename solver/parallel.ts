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
 * when it cannot be found or a worker fails to start, the samples are solved in this thread.
 * Kept out of `solver/index.ts` so a web bundle of the solver never pulls worker_threads in.
 */
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import { analyze, internalError } from "./engine";
import { drawSamples, monteCarloPreflight, summarizeSamples } from "./engine/monte-carlo";
import { type SampleBatch, SampleKernel, solveSampleRange } from "./engine/samples";
import { addStudies, solveVariant, type VaryOutcome } from "./engine/studies";
import type { SolveOptions } from "./index";
import { compile } from "./lang";
import type { Circuit, MonteCarloResult, SolveResult, SolveSuccess, Warning } from "./types";

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

type WorkerReply =
  | { type: "ready" }
  | { type: "done"; jobId: number; batch: SampleBatch }
  | { type: "error"; jobId: number; message: string };

interface PoolWorker {
  worker: Worker;
  ready: Promise<void>;
}

let pool: PoolWorker[] = [];
let unavailable: string | null = null;
let nextJobId = 1;
const handlers = new Map<number, (w: PoolWorker, reply: WorkerReply) => void>();

function workerEntry(): string | null {
  const candidates = [
    process.env.PHASEWRIGHT_SAMPLE_WORKER,
    path.join(process.cwd(), "solver", "workers", "sample-worker.mjs"),
  ];
  return candidates.find((c): c is string => !!c && existsSync(c)) ?? null;
}

function startWorker(entry: string): PoolWorker {
  const worker = new Worker(entry);
  worker.unref();
  const pw: PoolWorker = {
    worker,
    ready: new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error("the worker did not start within 30 s")), 30_000);
      timer.unref();
      worker.once("message", (m: WorkerReply) => {
        clearTimeout(timer);
        if (m.type === "ready") resolve();
        else reject(new Error("the worker did not report ready"));
      });
      worker.once("error", (e) => {
        clearTimeout(timer);
        reject(e);
      });
    }),
  };
  pw.ready.then(
    () => {
      worker.on("message", (m: WorkerReply) => {
        if (m.type !== "ready") handlers.get(m.jobId)?.(pw, m);
      });
    },
    () => {},
  );
  worker.on("error", () => {
    pool = pool.filter((p) => p !== pw);
  });
  worker.on("exit", () => {
    pool = pool.filter((p) => p !== pw);
  });
  return pw;
}

/** Up to `threads` started workers, or null (with the reason kept) when they cannot start. */
async function getPool(threads: number): Promise<PoolWorker[] | null> {
  if (unavailable) return null;
  const entry = workerEntry();
  if (!entry) {
    unavailable = "the worker entry solver/workers/sample-worker.mjs was not found";
    return null;
  }
  while (pool.length < threads) pool.push(startWorker(entry));
  const mine = pool.slice(0, threads);
  try {
    await Promise.all(mine.map((w) => w.ready));
    return mine;
  } catch (error) {
    unavailable = error instanceof Error ? error.message : String(error);
    await stopSampleWorkers();
    return null;
  }
}

/** Start the pool ahead of the first Monte Carlo run (a long-lived worker process). */
export async function startSampleWorkers(threads = defaultThreads()): Promise<boolean> {
  return (await getPool(threads)) !== null;
}

/** Why worker threads are not used in this process, or null. */
export function workersUnavailableReason(): string | null {
  return unavailable;
}

/** Terminate the pool (tests, clean shutdown). A later run starts new workers. */
export async function stopSampleWorkers(): Promise<void> {
  const all = pool;
  pool = [];
  await Promise.all(all.map((w) => w.worker.terminate().catch(() => 0)));
}

function abortError(signal: AbortSignal): unknown {
  return signal.reason ?? new Error("cancelled");
}

/**
 * Solve every sample on `threads` workers (chunks handed out as workers become free). Null when
 * the workers cannot start (the caller then solves in its own thread).
 */
export async function solveSamplesOnWorkers(
  circuit: Circuit,
  freqs: number[],
  draws: { names: string[]; samples: number; values: Float64Array },
  threads: number,
  onProgress?: (done: number, total: number) => void,
  signal?: AbortSignal,
): Promise<SampleBatch[] | null> {
  const workers = await getPool(threads);
  if (!workers) return null;
  const total = draws.samples;
  const size = Math.max(10, Math.ceil(total / (workers.length * 8)));
  const chunks: [number, number][] = [];
  for (let s = 0; s < total; s += size) chunks.push([s, Math.min(total, s + size)]);
  const jobId = nextJobId++;
  const batches: SampleBatch[] = [];
  let done = 0;
  try {
    return await new Promise<SampleBatch[]>((resolve, reject) => {
      let inFlight = 0;
      let settled = false;
      const finish = (error?: unknown) => {
        if (settled) return;
        settled = true;
        if (error !== undefined) reject(error);
        else resolve(batches);
      };
      const dispatch = (w: PoolWorker) => {
        if (settled) return;
        if (signal?.aborted) {
          if (inFlight === 0) finish(abortError(signal));
          return;
        }
        const next = chunks.shift();
        if (!next) {
          if (inFlight === 0) finish();
          return;
        }
        inFlight++;
        w.worker.postMessage({ type: "task", jobId, from: next[0], to: next[1] });
      };
      handlers.set(jobId, (w, reply) => {
        if (reply.type === "error") {
          inFlight--;
          finish(new Error(reply.message));
          return;
        }
        if (reply.type !== "done") return;
        inFlight--;
        batches.push(reply.batch);
        done += reply.batch.to - reply.batch.from;
        onProgress?.(done, total);
        dispatch(w);
      });
      for (const w of workers) {
        w.worker.postMessage({
          type: "setup",
          jobId,
          circuit,
          freqs,
          names: draws.names,
          values: draws.values,
        });
      }
      for (const w of workers) dispatch(w);
      if (chunks.length === 0 && inFlight === 0) finish();
    });
  } finally {
    handlers.delete(jobId);
    for (const w of workers) w.worker.postMessage({ type: "release", jobId });
  }
}

/** The default thread count: the cores this process may use, at most 4. */
export function defaultThreads(): number {
  return Math.max(1, Math.min(4, availableParallelism()));
}

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
    mc = await parallelMonteCarlo(circuit, result, {
      ...options,
      onProgress: onProgress && ((done) => onProgress(variantCount + done, total)),
    });
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
      if (options.signal?.aborted) throw error;
      batches = null; // a worker fault: solve in this thread below
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
