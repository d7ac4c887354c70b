/**
 * The worker side of the job queue (lib/jobs.ts): solve one queued run and save its result.
 * Used by `npm run worker` (scripts/worker.ts) and the integration tests; never imported by the
 * web app (it pulls in worker threads through solver/parallel.ts).
 */
import { hostname } from "node:os";
import type { PgBoss } from "pg-boss";
import { Run } from "@/lib/db";
import { getBoss, RUN_SOLVE_QUEUE, type RunSolveJobData, sendRunSolve } from "@/lib/jobs";
import { MAX_QUEUED_SAMPLES, MAX_SAVED_POINTS } from "@/lib/limits";
import { derivedRunColumns } from "@/lib/run-columns";
import {
  beat,
  claim,
  complete,
  fail,
  finishCancelled,
  getRunJob,
  HEARTBEAT_SECONDS,
  markAbandoned,
  recoverStale,
} from "@/lib/run-lifecycle";
import type { RunStatus } from "@/models/run";
import { solveNetlistParallel } from "@/solver/parallel";

/** Least time between two progress writes of one job, in ms. */
const PROGRESS_EVERY_MS = 250;

export interface SolveJobOptions {
  /** Worker threads for Monte Carlo samples (default: the cores, at most 4). */
  threads?: number;
  /** Aborts the solve (the queue stopping or expiring the job). */
  signal?: AbortSignal;
}

class Cancelled extends Error {}

/**
 * Solve a queued run: claim it (queued → running), solve with progress and a heartbeat, then move
 * it to ok (with the result), failed (errors kept on the job) or cancelled when a cancel was asked
 * for — every move through lib/run-lifecycle.ts. Returns the final state; a run that is no longer
 * queued is left alone.
 */
export async function solveQueuedRun(runId: string, options: SolveJobOptions = {}): Promise<RunStatus> {
  if (!(await claim(runId, `${hostname()}:${process.pid}`)))
    return (await getRunJob(runId))?.state ?? "failed";
  const run = await Run.findByPk(runId, { attributes: ["id", "netlist"] });
  if (!run) {
    await fail(runId, "the run no longer exists");
    return "failed";
  }

  const controller = new AbortController();
  const onOuterAbort = () => controller.abort(new Error("the queue stopped the job"));
  options.signal?.addEventListener("abort", onOuterAbort, { once: true });
  let lastWrite = 0;
  let writing: Promise<void> = Promise.resolve();
  const report = (progress?: number) => {
    writing = writing.then(async () => {
      const seen = await beat(runId, progress);
      if (seen?.cancelRequested) controller.abort(new Cancelled("cancelled"));
    });
  };
  const onProgress = (done: number, total: number) => {
    const now = Date.now();
    if (now - lastWrite < PROGRESS_EVERY_MS && done < total) return;
    lastWrite = now;
    report(total > 0 ? Math.min(0.99, done / total) : 0);
  };
  // The heartbeat tells other workers this one is alive even when progress is slow.
  const heartbeat = setInterval(() => report(), HEARTBEAT_SECONDS * 1000);
  heartbeat.unref();

  const started = performance.now();
  try {
    const result = await solveNetlistParallel(run.netlist, {
      maxPoints: MAX_SAVED_POINTS,
      maxSamples: MAX_QUEUED_SAMPLES,
      threads: options.threads,
      onProgress,
      signal: controller.signal,
    });
    clearInterval(heartbeat);
    await writing;
    if (controller.signal.aborted) throw controller.signal.reason;
    if (!result.ok) {
      const message = result.errors
        .slice(0, 5)
        .map((e) => `line ${e.line}, column ${e.column}: ${e.message}${e.hint ? ` (${e.hint})` : ""}`)
        .join("\n");
      await fail(runId, message);
      return "failed";
    }
    const solveMs = Math.round((performance.now() - started) * 1000) / 1000;
    const moved = await complete(runId, {
      ...derivedRunColumns(result),
      timings: { solveMs, engineMs: result.stats.solveMs, queued: 1 },
    });
    return moved ? "ok" : ((await getRunJob(runId))?.state ?? "failed");
  } catch (error) {
    clearInterval(heartbeat);
    await writing.catch(() => undefined);
    if (!(error instanceof Cancelled) && options.signal?.aborted) {
      // The queue stopped this worker (shutdown or expiry): recoverStaleJobs puts it back at once.
      await markAbandoned(runId);
      return "running";
    }
    if (error instanceof Cancelled) {
      await finishCancelled(runId);
      return "cancelled";
    }
    await fail(runId, error instanceof Error ? error.message : String(error));
    return "failed";
  } finally {
    options.signal?.removeEventListener("abort", onOuterAbort);
  }
}

export { HEARTBEAT_SECONDS, MAX_JOB_ATTEMPTS, STALE_JOB_SECONDS } from "@/lib/run-lifecycle";

/**
 * Put back on the queue the runs whose worker disappeared (no heartbeat for STALE_JOB_SECONDS, or
 * stopped by the queue); after MAX_JOB_ATTEMPTS they fail (lib/run-lifecycle.ts `recoverStale`).
 * Every worker calls this at start and every RECOVER_EVERY_SECONDS. Returns the run ids queued again.
 */
export async function recoverStaleJobs(staleSeconds?: number): Promise<string[]> {
  const requeued = await recoverStale(staleSeconds);
  for (const runId of requeued) await sendRunSolve(runId, { worker: true });
  return requeued;
}

/** How often each worker looks for jobs whose worker died (with STALE_JOB_SECONDS: within 60 s). */
export const RECOVER_EVERY_SECONDS = 15;

/**
 * Start working the "run-solve" queue in this process: one job at a time (each job already
 * uses every core through its worker threads). Returns the pg-boss instance and worker id.
 */
export async function startRunSolveWorker(
  options: { threads?: number; pollingIntervalSeconds?: number } = {},
): Promise<{ boss: PgBoss; workerId: string }> {
  const boss = await getBoss({ worker: true });
  const workerId = await boss.work<RunSolveJobData>(
    RUN_SOLVE_QUEUE,
    { batchSize: 1, localConcurrency: 1, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 1 },
    async (jobs) => {
      for (const job of jobs) {
        const state = await solveQueuedRun(job.data.runId, { threads: options.threads, signal: job.signal });
        console.log(`[worker] run ${job.data.runId}: ${state}`);
      }
    },
  );
  const recover = () =>
    recoverStaleJobs().then(
      (ids) => ids.length > 0 && console.log(`[worker] queued again: ${ids.join(", ")}`),
      (error) => console.error("[worker] recovering stale jobs failed:", error),
    );
  await recover();
  const timer = setInterval(() => void recover(), RECOVER_EVERY_SECONDS * 1000);
  timer.unref();
  boss.once("stopped", () => clearInterval(timer));
  return { boss, workerId };
}
