/**
 * The worker side of the job queue (lib/jobs.ts): solve one queued run and save its result.
 * Used by `npm run worker` (scripts/worker.ts) and the integration tests; never imported by the
 * web app (it pulls in worker threads through solver/parallel.ts).
 */
import { hostname } from "node:os";
import type { PgBoss } from "pg-boss";
import { QueryTypes } from "sequelize";
import { Run, sequelize } from "@/lib/db";
import { getBoss, RUN_SOLVE_QUEUE, type RunJobState, type RunSolveJobData } from "@/lib/jobs";
import { JOB_EXPIRE_SECONDS, MAX_QUEUED_SAMPLES, MAX_SAVED_POINTS } from "@/lib/limits";
import { compactResult } from "@/solver";
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
 * Solve a queued run: claim it ('queued' → 'running'), solve with progress, then save the result
 * with status 'ok', or 'failed' (the errors kept in run_jobs.error), or 'cancelled' when a cancel
 * was requested. Returns the final state; a run that is no longer queued is left alone.
 */
export async function solveQueuedRun(runId: string, options: SolveJobOptions = {}): Promise<RunJobState> {
  const claimed = await sequelize.query<{ run_id: string }>(
    `UPDATE run_jobs SET state = 'running', started_at = now(), worker = :worker, updated_at = now(),
       attempts = attempts + 1
     WHERE run_id = :runId AND state = 'queued' AND NOT cancel_requested RETURNING run_id`,
    { replacements: { runId, worker: `${hostname()}:${process.pid}` }, type: QueryTypes.SELECT },
  );
  if (claimed.length === 0) {
    const rows = await sequelize.query<{ state: RunJobState }>(
      "SELECT state FROM run_jobs WHERE run_id = :runId",
      {
        replacements: { runId },
        type: QueryTypes.SELECT,
      },
    );
    return rows[0]?.state ?? "failed";
  }
  const run = await Run.findByPk(runId);
  if (!run) return finish(runId, "failed", "the run no longer exists");
  await Run.update({ status: "running" }, { where: { id: runId } });

  const controller = new AbortController();
  const onOuterAbort = () => controller.abort(new Error("the queue stopped the job"));
  options.signal?.addEventListener("abort", onOuterAbort, { once: true });
  let lastWrite = 0;
  let writing: Promise<void> = Promise.resolve();
  const onProgress = (done: number, total: number) => {
    const now = Date.now();
    if (now - lastWrite < PROGRESS_EVERY_MS && done < total) return;
    lastWrite = now;
    const progress = total > 0 ? Math.min(0.99, done / total) : 0;
    writing = writing.then(async () => {
      const rows = await sequelize.query<{ cancel_requested: boolean }>(
        `UPDATE run_jobs SET progress = :progress, updated_at = now() WHERE run_id = :runId
         RETURNING cancel_requested`,
        { replacements: { runId, progress }, type: QueryTypes.SELECT },
      );
      if (rows[0]?.cancel_requested) controller.abort(new Cancelled("cancelled"));
    });
  };

  const started = performance.now();
  try {
    const result = await solveNetlistParallel(run.netlist, {
      maxPoints: MAX_SAVED_POINTS,
      maxSamples: MAX_QUEUED_SAMPLES,
      threads: options.threads,
      onProgress,
      signal: controller.signal,
    });
    await writing;
    if (controller.signal.aborted) throw controller.signal.reason;
    const solveMs = Math.round((performance.now() - started) * 1000) / 1000;
    if (!result.ok) {
      const message = result.errors
        .slice(0, 5)
        .map((e) => `line ${e.line}, column ${e.column}: ${e.message}`)
        .join("\n");
      await Run.update({ status: "failed", result: null }, { where: { id: runId } });
      return finish(runId, "failed", message);
    }
    await Run.update(
      {
        status: "ok",
        solverVersion: result.solverVersion,
        result: compactResult(result),
        measures: result.measures,
        checks: result.checks,
        checksPassed: result.checks.filter((c) => c.pass).length,
        checksTotal: result.checks.length,
        timings: { solveMs, engineMs: result.stats.solveMs, queued: 1 },
      },
      { where: { id: runId } },
    );
    return finish(runId, "ok", null);
  } catch (error) {
    await writing.catch(() => undefined);
    if (!(error instanceof Cancelled) && options.signal?.aborted) {
      // The queue stopped this worker (shutdown or expiry): leave the job to recoverStaleJobs,
      // which puts it back on the queue at once (updated_at in the past).
      await sequelize.query(
        "UPDATE run_jobs SET updated_at = 'epoch' WHERE run_id = :runId AND state = 'running'",
        { replacements: { runId } },
      );
      return "running";
    }
    const cancelled = error instanceof Cancelled;
    await Run.update({ status: cancelled ? "cancelled" : "failed" }, { where: { id: runId } });
    const message = error instanceof Error ? error.message : String(error);
    return finish(runId, cancelled ? "cancelled" : "failed", cancelled ? null : message);
  } finally {
    options.signal?.removeEventListener("abort", onOuterAbort);
  }
}

async function finish(runId: string, state: RunJobState, error: string | null): Promise<RunJobState> {
  await sequelize.query(
    `UPDATE run_jobs SET state = :state, error = :error, finished_at = now(), updated_at = now(),
       progress = CASE WHEN :state = 'ok' THEN 1 ELSE progress END
     WHERE run_id = :runId`,
    { replacements: { runId, state, error } },
  );
  return state;
}

/** A running job with no progress write for this long is taken to have lost its worker. */
export const STALE_JOB_SECONDS = 5 * 60;
/** Attempts after which an interrupted solve is failed instead of queued again. */
export const MAX_JOB_ATTEMPTS = 3;

/**
 * Put back on the queue the runs whose worker disappeared (a 'running' job with no progress
 * write for STALE_JOB_SECONDS, or one stopped by the queue); after MAX_JOB_ATTEMPTS they fail.
 * Every worker calls this at start and every 30 s. Returns the run ids queued again.
 */
export async function recoverStaleJobs(staleSeconds = STALE_JOB_SECONDS): Promise<string[]> {
  const failed = await sequelize.query<{ run_id: string }>(
    `UPDATE run_jobs SET state = 'failed', finished_at = now(), updated_at = now(),
       error = 'the solve was interrupted ' || attempts || ' times; save the run again to retry'
     WHERE state = 'running' AND updated_at < now() - make_interval(secs => :stale)
       AND attempts >= :max RETURNING run_id`,
    { replacements: { stale: staleSeconds, max: MAX_JOB_ATTEMPTS }, type: QueryTypes.SELECT },
  );
  for (const r of failed)
    await Run.update({ status: "failed" }, { where: { id: r.run_id, status: "running" } });
  const stale = await sequelize.query<{ run_id: string }>(
    `UPDATE run_jobs SET state = 'queued', progress = 0, started_at = NULL, worker = NULL, updated_at = now()
     WHERE state = 'running' AND updated_at < now() - make_interval(secs => :stale)
       AND attempts < :max AND NOT cancel_requested RETURNING run_id`,
    { replacements: { stale: staleSeconds, max: MAX_JOB_ATTEMPTS }, type: QueryTypes.SELECT },
  );
  const requeued: string[] = [];
  for (const r of stale) {
    await Run.update({ status: "queued" }, { where: { id: r.run_id } });
    const boss = await getBoss({ worker: true });
    const jobId = await boss.send(RUN_SOLVE_QUEUE, { runId: r.run_id } satisfies RunSolveJobData, {
      retryLimit: 0,
      expireInSeconds: JOB_EXPIRE_SECONDS,
    });
    await sequelize.query("UPDATE run_jobs SET job_id = :jobId WHERE run_id = :runId", {
      replacements: { jobId, runId: r.run_id },
    });
    requeued.push(r.run_id);
  }
  // A cancel requested while the worker was gone: finish it as cancelled.
  const cancelled = await sequelize.query<{ run_id: string }>(
    `UPDATE run_jobs SET state = 'cancelled', finished_at = now(), updated_at = now()
     WHERE state = 'running' AND cancel_requested AND updated_at < now() - make_interval(secs => :stale)
     RETURNING run_id`,
    { replacements: { stale: staleSeconds }, type: QueryTypes.SELECT },
  );
  for (const r of cancelled) await Run.update({ status: "cancelled" }, { where: { id: r.run_id } });
  return requeued;
}

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
  const timer = setInterval(() => void recover(), 30_000);
  timer.unref();
  boss.once("stopped", () => clearInterval(timer));
  return { boss, workerId };
}
