/**
 * The job queue for large runs, on PostgreSQL with pg-boss (its tables live in the "pgboss"
 * schema). A run whose solver work is above MAX_INLINE_WORK (lib/limits.ts) is saved with status
 * 'queued' and no result; `enqueueRunSolve(runId)` puts it on the "run-solve" queue, and any
 * `npm run worker` process (scripts/worker.ts, lib/job-runner.ts) may pick it up, so more workers
 * on more machines share the load. Progress, cancel requests and errors are kept in the
 * `run_jobs` table (one row per queued run), which `GET /api/runs/:id/job` reads.
 *
 *   enqueueRunSolve(runId)  → the pg-boss job id; the run_jobs row is 'queued', progress 0
 *   getRunJob(runId)        → { state, progress 0..1, error, … } or null when the run never queued
 *   cancelRunJob(runId)     → a queued job is cancelled at once; a running one stops at its next
 *                             progress report (within a fraction of a second)
 */
import type { PgBoss } from "pg-boss";
import { QueryTypes } from "sequelize";
import { sequelize } from "@/lib/db";
import { env } from "@/lib/env";
import { JOB_EXPIRE_SECONDS, MAX_INLINE_WORK, MAX_MC_INLINE_SAMPLES, MAX_QUEUED_SAMPLES } from "@/lib/limits";
import { analyze, compile, SOLVER_VERSION } from "@/solver";
import { sweepLength } from "@/solver/engine/sweep";
import type { Circuit, NetlistError } from "@/solver/types";

export const RUN_SOLVE_QUEUE = "run-solve";
export const PGBOSS_SCHEMA = "pgboss";

export type RunJobState = "queued" | "running" | "ok" | "failed" | "cancelled";

export interface RunJobView {
  runId: string;
  jobId: string | null;
  state: RunJobState;
  /** 0…1 */
  progress: number;
  cancelRequested: boolean;
  error: string | null;
  startedAt: string | null;
  finishedAt: string | null;
}

export interface RunSolveJobData {
  runId: string;
}

/** Solver work in sweep points: points × (1 + Monte Carlo samples + vary values). */
export function solveWork(circuit: Circuit): number {
  const points = sweepLength(circuit.sweep);
  const samples = circuit.monteCarlo?.samples ?? 0;
  const variants = circuit.vary?.values.length ?? 0;
  return (Number.isFinite(points) ? points : 0) * (1 + samples + variants);
}

/** True when a run of this circuit goes to the job queue instead of being solved in the request. */
export function shouldQueue(circuit: Circuit): boolean {
  return solveWork(circuit) > MAX_INLINE_WORK || (circuit.monteCarlo?.samples ?? 0) > MAX_MC_INLINE_SAMPLES;
}

// One pg-boss instance per process (kept across Next dev hot reloads).
const globalBoss = globalThis as unknown as { __phasewrightBoss?: Promise<PgBoss> };

/**
 * The process's started pg-boss on DATABASE_URL (schema created on first start, queue ensured).
 * `worker: false` (the web app) sends and cancels only: no maintenance or scheduling there.
 */
export function getBoss(options: { worker?: boolean } = {}): Promise<PgBoss> {
  if (!globalBoss.__phasewrightBoss) {
    globalBoss.__phasewrightBoss = (async () => {
      const { PgBoss } = await import("pg-boss");
      const boss = new PgBoss({
        connectionString: env.DATABASE_URL,
        schema: PGBOSS_SCHEMA,
        max: 3,
        application_name: options.worker ? "phasewright-worker" : "phasewright-web",
        supervise: options.worker === true,
        schedule: false,
      });
      boss.on("error", (error: unknown) => console.error("[jobs] queue error:", error));
      await boss.start();
      await boss.createQueue(RUN_SOLVE_QUEUE, {
        retryLimit: 0,
        expireInSeconds: JOB_EXPIRE_SECONDS,
      });
      return boss;
    })();
    globalBoss.__phasewrightBoss.catch(() => {
      globalBoss.__phasewrightBoss = undefined;
    });
  }
  return globalBoss.__phasewrightBoss;
}

/** Stop this process's pg-boss (tests, worker shutdown). */
export async function stopBoss(options: { graceful?: boolean; timeout?: number } = {}): Promise<void> {
  const pending = globalBoss.__phasewrightBoss;
  globalBoss.__phasewrightBoss = undefined;
  if (!pending) return;
  const boss = await pending.catch(() => null);
  await boss?.stop({ graceful: options.graceful ?? true, timeout: options.timeout ?? 10_000, close: true });
}

interface RunJobRow {
  run_id: string;
  job_id: string | null;
  state: RunJobState;
  progress: number;
  cancel_requested: boolean;
  error: string | null;
  started_at: Date | null;
  finished_at: Date | null;
}

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

function toView(r: RunJobRow): RunJobView {
  return {
    runId: r.run_id,
    jobId: r.job_id,
    state: r.state,
    progress: Math.max(0, Math.min(1, Number(r.progress))),
    cancelRequested: r.cancel_requested,
    error: r.error,
    startedAt: iso(r.started_at),
    finishedAt: iso(r.finished_at),
  };
}

/** Put a saved 'queued' run on the queue. Returns the pg-boss job id. */
export async function enqueueRunSolve(runId: string): Promise<string> {
  await sequelize.query(
    `INSERT INTO run_jobs (run_id, state, progress) VALUES (:runId, 'queued', 0)
     ON CONFLICT (run_id) DO UPDATE SET state = 'queued', progress = 0, cancel_requested = false,
       error = NULL, started_at = NULL, finished_at = NULL, updated_at = now()`,
    { replacements: { runId } },
  );
  let jobId: string | null = null;
  try {
    const boss = await getBoss();
    const data: RunSolveJobData = { runId };
    jobId = await boss.send(RUN_SOLVE_QUEUE, data, { retryLimit: 0, expireInSeconds: JOB_EXPIRE_SECONDS });
    if (!jobId) throw new Error(`the queue refused the job of run ${runId}`);
  } catch (error) {
    await sequelize.query(
      `UPDATE run_jobs SET state = 'failed', error = 'the job queue is not reachable', finished_at = now(),
         updated_at = now() WHERE run_id = :runId`,
      { replacements: { runId } },
    );
    throw error;
  }
  await sequelize.query("UPDATE run_jobs SET job_id = :jobId, updated_at = now() WHERE run_id = :runId", {
    replacements: { runId, jobId },
  });
  return jobId;
}

/** The job of a run, or null when the run was solved in its request (never queued). */
export async function getRunJob(runId: string): Promise<RunJobView | null> {
  const rows = await sequelize.query<RunJobRow>("SELECT * FROM run_jobs WHERE run_id = :runId", {
    replacements: { runId },
    type: QueryTypes.SELECT,
  });
  return rows[0] ? toView(rows[0]) : null;
}

/**
 * Cancel a run's job. A job still waiting in the queue is cancelled there and the run marked
 * 'cancelled' at once; a running job is asked to stop (the worker checks at every progress
 * report and then marks the run). Finished jobs are left alone. Returns the job's view.
 */
export async function cancelRunJob(runId: string): Promise<RunJobView | null> {
  const job = await getRunJob(runId);
  if (!job || job.state === "ok" || job.state === "failed" || job.state === "cancelled") return job;
  await sequelize.query(
    "UPDATE run_jobs SET cancel_requested = true, updated_at = now() WHERE run_id = :runId",
    { replacements: { runId } },
  );
  if (job.state === "queued") {
    // Claim the cancellation only if no worker has started it meanwhile.
    const claimed = await sequelize.query<{ run_id: string }>(
      `UPDATE run_jobs SET state = 'cancelled', finished_at = now(), updated_at = now()
       WHERE run_id = :runId AND state = 'queued' RETURNING run_id`,
      { replacements: { runId }, type: QueryTypes.SELECT },
    );
    if (claimed.length > 0) {
      await sequelize.query("UPDATE runs SET status = 'cancelled' WHERE id = :runId AND status = 'queued'", {
        replacements: { runId },
      });
      if (job.jobId) {
        const boss = await getBoss();
        await boss.cancel(RUN_SOLVE_QUEUE, job.jobId).catch(() => undefined);
      }
    }
  }
  return getRunJob(runId);
}

export type RunSolvePlan =
  | { mode: "inline" }
  | { mode: "queue"; solverVersion: string }
  | { mode: "invalid"; errors: NetlistError[] };

/**
 * How `createRun` (lib/runs.ts) handles a netlist: solved in the request ("inline"), or saved as
 * 'queued' for the worker ("queue") — then the netlist is compiled and its nominal sweep solved
 * here (one sweep, no studies), so a netlist with errors still answers 422 at once ("invalid").
 */
export function planRunSolve(netlist: string, maxPoints: number): RunSolvePlan {
  const compiled = compile(netlist);
  if (!compiled.ok || !shouldQueue(compiled.circuit)) return { mode: "inline" };
  const mc = compiled.circuit.monteCarlo;
  if (mc && mc.samples > MAX_QUEUED_SAMPLES) {
    return {
      mode: "invalid",
      errors: [
        {
          ...mc.span,
          message: `monte-carlo asks for ${mc.samples} samples; a saved run may have at most ${MAX_QUEUED_SAMPLES}`,
        },
      ],
    };
  }
  const nominal = analyze(compiled.circuit, compiled.warnings, { maxPoints });
  if (!nominal.ok) return { mode: "invalid", errors: nominal.errors };
  return { mode: "queue", solverVersion: SOLVER_VERSION };
}
