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
import { env } from "@/lib/env";
import {
  JOB_EXPIRE_SECONDS,
  MAX_INLINE_WORK,
  MAX_MC_INLINE_SAMPLES,
  MAX_QUEUED_SAMPLES,
  NOISE_BAND_WORK,
  STEADY_BASE_WORK,
  STEADY_CUBE_DIVISOR,
  STEADY_WORK_PER_HARMONIC,
} from "@/lib/limits";
import type { PreviewStudy } from "@/lib/preview-stages";
import {
  attachQueueJob,
  fail,
  getRunJob,
  openJob,
  type RunJobView,
  requestCancel,
} from "@/lib/run-lifecycle";
import { analyze, compile, SOLVER_VERSION, type SolveOptions } from "@/solver";
import { sweepLength } from "@/solver/engine/sweep";
import type { Circuit, NetlistError } from "@/solver/types";

export const RUN_SOLVE_QUEUE = "run-solve";
export const PGBOSS_SCHEMA = "pgboss";

export type { RunJobView } from "@/lib/run-lifecycle";
export { getRunJob } from "@/lib/run-lifecycle";

export interface RunSolveJobData {
  runId: string;
}

/**
 * Solver work in sweep points: points × (1 + Monte Carlo samples + vary values + 2 × sensitivity
 * parts), plus each integrated
 * noise measure's price (NOISE_BAND_WORK per variant and per Monte Carlo sample, which each integrate
 * their own band), plus the steady oscillation's price
 * (steadyWork) once per solve that computes it.
 */
export function solveWork(circuit: Circuit): number {
  const points = sweepLength(circuit.sweep);
  const samples = circuit.monteCarlo?.samples ?? 0;
  const variants = circuit.vary?.values.length ?? 0;
  const bands = circuit.measures.filter((m) => m.band).length;
  // A sensitivity study re-solves the sweep twice per part (central differences; issue 13).
  const sensitivityParts = (circuit.sensitivity?.length ?? 0) > 0 ? circuit.parts.length : 0;
  const sweeps =
    (Number.isFinite(points) ? points : 0) * (1 + samples + variants + 2 * sensitivityParts) +
    bands * NOISE_BAND_WORK * (1 + variants + samples);
  if (!circuit.steady) return sweeps;
  const sampled = circuit.measures.some((m) => STEADY_MEASURES.has(m.fn)) ? samples : 0;
  return sweeps + steadyWork(circuit.steady.harmonics) * (1 + variants + sampled);
}

export interface PreviewPlan {
  /** Solve options of the preview. */
  options: SolveOptions;
  /**
   * The studies these options solve beyond the nominal sweep (none when there are none, or when the
   * preview is the nominal sweep only anyway): what a first, sweep-only answer leaves to follow.
   */
  studies: PreviewStudy[];
}

/**
 * A live preview's solve options and the studies they solve beyond the nominal sweep (what a first,
 * sweep-only answer leaves to follow; lib/live-preview.ts). Within the inline budget: everything. Over
 * it: when the steady oscillation alone is what costs, it is left out with the reason; otherwise the
 * preview solves the nominal sweep only (no vary, Monte Carlo, sensitivity or steady) and says why — saving the run
 * ("Run full analysis") queues the whole analysis.
 */
export function previewPlan(netlist: string, maxPoints: number): PreviewPlan {
  const compiled = compile(netlist);
  if (!compiled.ok) return { options: { maxPoints }, studies: [] };
  const c = compiled.circuit;
  const samples = c.monteCarlo?.samples ?? 0;
  const studies = (steady: boolean): PreviewStudy[] =>
    [
      c.vary ? ("vary" as const) : null,
      c.monteCarlo ? ("monte-carlo" as const) : null,
      c.sensitivity.length > 0 ? ("sensitivity" as const) : null,
      steady && c.steady ? ("steady" as const) : null,
    ].filter((s): s is PreviewStudy => s !== null);
  const full = solveWork(c);
  if (full <= MAX_INLINE_WORK && samples <= MAX_MC_INLINE_SAMPLES) {
    return { options: { maxPoints }, studies: studies(true) };
  }
  const withoutSteady = solveWork({ ...c, steady: null });
  if (c.steady && withoutSteady <= MAX_INLINE_WORK && samples <= MAX_MC_INLINE_SAMPLES) {
    return {
      options: {
        maxPoints,
        deferSteady: `the steady oscillation with ${c.steady.harmonics} harmonics is too large for a preview: save the run to solve it (queued)`,
      },
      studies: studies(false),
    };
  }
  return { options: { maxPoints, nominalOnly: deferredReason(c, full) }, studies: [] };
}

/** "the full analysis (monte-carlo 2000 samples) is 302 151 sweep points of work, over the preview's 200 000 …" */
function deferredReason(c: Circuit, work: number): string {
  const parts = [
    c.monteCarlo ? `monte-carlo ${c.monteCarlo.samples} samples` : null,
    c.vary ? `vary over ${c.vary.values.length} values` : null,
    c.sensitivity.length > 0
      ? `sensitivity of ${c.sensitivity.length} measure${c.sensitivity.length === 1 ? "" : "s"}`
      : null,
    c.steady ? `steady with ${c.steady.harmonics} harmonics` : null,
  ].filter((p): p is string => p !== null);
  const n = (x: number) => x.toLocaleString("en").replace(/,/g, " ");
  return (
    `the full analysis (${parts.join(", ")}) is ${n(work)} sweep points of work, over the preview's ` +
    `${n(MAX_INLINE_WORK)}: this preview shows the nominal sweep only. Run the full analysis to solve it all (queued).`
  );
}

const STEADY_MEASURES = new Set(["frequency", "amplitude", "thd", "startup"]);

/** One steady-oscillation solve of N harmonics, in sweep points (lib/limits.ts). */
export function steadyWork(harmonics: number): number {
  return (
    STEADY_BASE_WORK +
    STEADY_WORK_PER_HARMONIC * harmonics +
    Math.round((2 * harmonics + 1) ** 3 / STEADY_CUBE_DIVISOR)
  );
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
      await boss.createQueue(RUN_SOLVE_QUEUE, RUN_SOLVE_SEND_OPTIONS);
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

/** How every run-solve job is sent: no pg-boss retries (recovery is ours), expiry from lib/limits. */
export const RUN_SOLVE_SEND_OPTIONS = { retryLimit: 0, expireInSeconds: JOB_EXPIRE_SECONDS } as const;

/** Send a 'queued' run to the queue and keep the pg-boss job id; throws when the queue refuses. */
export async function sendRunSolve(runId: string, options: { worker?: boolean } = {}): Promise<string> {
  const boss = await getBoss(options);
  const data: RunSolveJobData = { runId };
  const jobId = await boss.send(RUN_SOLVE_QUEUE, data, RUN_SOLVE_SEND_OPTIONS);
  if (!jobId) throw new Error(`the queue refused the job of run ${runId}`);
  await attachQueueJob(runId, jobId);
  return jobId;
}

/**
 * Put a saved 'queued' run on the queue. Returns the pg-boss job id; when the queue cannot take
 * it, the run is failed (lib/run-lifecycle.ts) and the error rethrown.
 */
export async function enqueueRunSolve(runId: string): Promise<string> {
  await openJob(runId);
  try {
    return await sendRunSolve(runId);
  } catch (error) {
    await fail(runId, "the job queue is not reachable");
    throw error;
  }
}

/**
 * Cancel a run's job. A job still waiting in the queue is cancelled at once (and taken off the
 * queue); a running job is asked to stop (the worker checks at every progress report and then
 * moves the run). Finished jobs are left alone. Returns the job's view.
 */
export async function cancelRunJob(runId: string): Promise<RunJobView | null> {
  const outcome = await requestCancel(runId);
  const job = await getRunJob(runId);
  if (outcome === "cancelled" && job?.jobId) {
    const boss = await getBoss();
    await boss.cancel(RUN_SOLVE_QUEUE, job.jobId).catch(() => undefined);
  }
  return job;
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
