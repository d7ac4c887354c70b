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
 * The worker entry is `solver/workers/sample-worker.mjs`, found at `PHASEWRIGHT_SAMPLE_WORKER` or
 * `<cwd>/solver/workers/…`. When it cannot be found or no thread starts, `solveSamplesOnWorkers`
 * answers null and the caller solves in its own thread.
 */
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import type { SampleBatch } from "./engine/samples";
import { SampleFault } from "./pipeline";
import type { Circuit } from "./types";

type WorkerReply =
  | { type: "ready" }
  | { type: "done"; jobId: number; batch: SampleBatch }
  | { type: "error"; jobId: number; message: string };

interface PoolWorker {
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

interface Draws {
  names: string[];
  samples: number;
  values: Float64Array;
}

type Chunk = { from: number; to: number; tries: number };

/**
 * Solve every sample on up to `threads` workers (chunks handed out as workers become free).
 * Null when no thread can start (the caller then solves in its own thread). Rejects with a
 * `SampleFault` when a chunk fails twice, or with the signal's reason on abort.
 */
export async function solveSamplesOnWorkers(
  circuit: Circuit,
  freqs: number[],
  draws: Draws,
  threads: number,
  onProgress?: (done: number, total: number) => void,
  signal?: AbortSignal,
): Promise<SampleBatch[] | null> {
  const workers = await getPool(threads);
  if (!workers) return null;
  const total = draws.samples;
  const size = Math.max(10, Math.ceil(total / (workers.length * 8)));
  const chunks: Chunk[] = [];
  for (let s = 0; s < total; s += size) chunks.push({ from: s, to: Math.min(total, s + size), tries: 0 });
  const jobId = nextJobId++;
  const setup = { type: "setup", jobId, circuit, freqs, names: draws.names, values: draws.values };
  const batches: SampleBatch[] = [];
  const busy = new Map<PoolWorker, Chunk>();
  const used = new Set<PoolWorker>(workers);
  let done = 0;
  let retrying = 0;
  let onAbort: (() => void) | undefined;
  try {
    return await new Promise<SampleBatch[]>((resolve, reject) => {
      let settled = false;
      const finish = (error?: unknown) => {
        if (settled) return;
        settled = true;
        for (const w of busy.keys()) w.onFail = undefined;
        if (error !== undefined) reject(error);
        else resolve(batches);
      };
      const dispatch = (w: PoolWorker, chunk = chunks.shift()) => {
        if (settled) return;
        if (!chunk) {
          if (busy.size === 0 && retrying === 0) finish();
          return;
        }
        busy.set(w, chunk);
        w.onFail = (reason) => failed(w, reason);
        w.worker.postMessage({ type: "task", jobId, from: chunk.from, to: chunk.to });
      };
      // A failed chunk gets one more try on a fresh thread; a second failure fails the job.
      const failed = (w: PoolWorker, reason: string) => {
        const chunk = busy.get(w);
        busy.delete(w);
        w.onFail = undefined;
        if (settled || !chunk) return;
        if (chunk.tries >= 1) {
          finish(new SampleFault(`samples ${chunk.from + 1}–${chunk.to} failed twice: ${reason}`));
          return;
        }
        chunk.tries++;
        retrying++;
        if (!w.dead) void w.worker.terminate();
        void freshWorker().then((fresh) => {
          retrying--;
          if (settled) {
            if (fresh) void fresh.worker.terminate();
            return;
          }
          if (!fresh) {
            finish(
              new SampleFault(
                `samples ${chunk.from + 1}–${chunk.to} failed and no fresh thread started: ${reason}`,
              ),
            );
            return;
          }
          used.add(fresh);
          fresh.worker.postMessage(setup);
          dispatch(fresh, chunk);
        });
      };
      handlers.set(jobId, (w, reply) => {
        if (reply.type === "error") return failed(w, reply.message);
        if (reply.type !== "done" || !busy.has(w)) return;
        busy.delete(w);
        w.onFail = undefined;
        batches.push(reply.batch);
        done += reply.batch.to - reply.batch.from;
        onProgress?.(done, total);
        dispatch(w);
      });
      if (signal) {
        onAbort = () => {
          // Threads still busy with this job's chunks are ended: nobody will read their answer.
          for (const w of busy.keys()) {
            w.onFail = undefined;
            void w.worker.terminate();
          }
          busy.clear();
          finish(signal.reason ?? new Error("cancelled"));
        };
        if (signal.aborted) return onAbort();
        signal.addEventListener("abort", onAbort, { once: true });
      }
      for (const w of workers) w.worker.postMessage(setup);
      for (const w of workers) dispatch(w);
    });
  } finally {
    if (onAbort) signal?.removeEventListener("abort", onAbort);
    handlers.delete(jobId);
    for (const w of used) if (!w.dead) w.worker.postMessage({ type: "release", jobId });
  }
}
