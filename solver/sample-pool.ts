/**
 * The pool of Monte Carlo worker threads (node:worker_threads) behind `solveNetlistParallel`.
 *
 * Invariants:
 *  - a job's promise always settles: every chunk of samples ends as a result, a failure or an abort;
 *  - a thread that fails (an `error` reply, an uncaught error, or an exit) fails its chunk; the chunk
 *    is retried once on a fresh thread, and a second failure rejects the job with a `SampleFault`
 *    naming the samples and the reason;
 *  - an abort rejects the job at once and terminates the threads still busy with its chunks, so
 *    nothing keeps running for a job nobody waits for; the pool starts fresh threads when needed.
 *
 * The scheduling of one job's chunks is solver/sample-job.ts. The worker entry is
 * `solver/workers/sample-worker.mjs`, found at `PHASEWRIGHT_SAMPLE_WORKER` or `<cwd>/solver/workers/…`.
 * When it cannot be found or no thread starts, `solveSamplesOnWorkers` answers null and the caller
 * solves in its own thread.
 */
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import type { SampleBatch } from "./engine/samples";
import type { SampleJob } from "./pipeline";
import { PoolJob } from "./sample-job";

export type WorkerReply =
  | { type: "ready" }
  | { type: "done"; jobId: number; batch: SampleBatch }
  | { type: "error"; jobId: number; message: string };

export interface PoolWorker {
  worker: Worker;
  ready: Promise<void>;
  /** Set while the thread works a chunk: called once when the thread fails or exits. */
  onFail?: (reason: string) => void;
  dead: boolean;
}

/** A worker thread failed the same chunk twice: the job fails with this reason. */
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
  const pw: PoolWorker = { worker, ready: Promise.resolve(), dead: false };
  const die = (reason: string) => {
    if (pw.dead) return;
    pw.dead = true;
    pool = pool.filter((p) => p !== pw);
    const onFail = pw.onFail;
    pw.onFail = undefined;
    onFail?.(reason);
  };
  pw.ready = new Promise<void>((resolve, reject) => {
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
    worker.once("exit", (code) => {
      clearTimeout(timer);
      reject(new Error(`the worker exited with code ${code} before it was ready`));
    });
  });
  pw.ready.then(
    () => {
      worker.on("message", (m: WorkerReply) => {
        if (m.type !== "ready") handlers.get(m.jobId)?.(pw, m);
      });
    },
    () => {},
  );
  worker.on("error", (e) => die(`the worker thread failed: ${e.message}`));
  worker.on("exit", (code) => die(`the worker thread exited (code ${code})`));
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
  const started = await Promise.allSettled(mine.map((w) => w.ready));
  const ok = mine.filter((_, i) => started[i]?.status === "fulfilled" && !mine[i]?.dead);
  if (ok.length > 0) return ok;
  const first = started.find((s) => s.status === "rejected");
  unavailable =
    first?.status === "rejected" ? String(first.reason?.message ?? first.reason) : "no worker started";
  await stopSampleWorkers();
  return null;
}

/** A fresh thread (not from the pool's free list) for a retried chunk; null when it cannot start. */
async function freshWorker(): Promise<PoolWorker | null> {
  const entry = workerEntry();
  if (!entry) return null;
  const pw = startWorker(entry);
  pool.push(pw);
  try {
    await pw.ready;
    return pw.dead ? null : pw;
  } catch {
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
  unavailable = null;
  for (const w of all) w.onFail = undefined;
  await Promise.all(all.map((w) => w.worker.terminate().catch(() => 0)));
}

/** The default thread count: the cores this process may use, at most 4. */
export function defaultThreads(): number {
  return Math.max(1, Math.min(4, availableParallelism()));
}

/** The pool's live threads (tests use it to kill one mid-job). */
export function sampleWorkerThreads(): Worker[] {
  return pool.filter((w) => !w.dead).map((w) => w.worker);
}

/**
 * Solve every sample of `job` on up to `threads` workers (chunks handed out as workers become
 * free). Null when no thread can start (the caller then solves in its own thread). Rejects with a
 * `SampleFault` when a chunk fails twice, or with the signal's reason on abort.
 */
export async function solveSamplesOnWorkers(job: SampleJob, threads: number): Promise<SampleBatch[] | null> {
  const workers = await getPool(threads);
  if (!workers) return null;
  const run = new PoolJob(nextJobId++, job, workers, freshWorker);
  handlers.set(run.id, (w, reply) => run.reply(w, reply));
  const onAbort = () => run.abort();
  job.signal?.addEventListener("abort", onAbort, { once: true });
  try {
    return await run.start();
  } finally {
    job.signal?.removeEventListener("abort", onAbort);
    handlers.delete(run.id);
    run.release();
  }
}
