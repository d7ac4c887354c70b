/**
 * The one state machine of a run's solve. A run solved in its request is born `ok` (or `failed`)
 * and never moves; a queued run moves through
 *
 *   queued ──claim──▶ running ──complete──▶ ok
 *     │                 │ ├──fail────────▶ failed
 *     │                 │ ├──cancelled───▶ cancelled   (a cancel requested while it ran)
 *     │                 │ └──requeue─────▶ queued      (its worker stopped: heartbeat lost)
 *     ├──cancel────────────────────────────▶ cancelled
 *     └──fail──────────────────────────────▶ failed     (the queue did not take it)
 *
 * Every transition is one transaction that moves `run_jobs.state` and `runs.status` together and
 * only from the states allowed here, so the two never disagree and two racing transitions (a
 * cancel and a finish, two workers claiming) cannot both win. This module is the only writer of
 * either column after a run is created.
 */
import { Op, type Transaction, type WhereOptions } from "sequelize";
import { Run, RunJob, sequelize } from "@/lib/db";
import type { RunStatus } from "@/models/run";

/** Which states each state may move to. */
export const RUN_TRANSITIONS: Readonly<Record<RunStatus, readonly RunStatus[]>> = {
  queued: ["running", "cancelled", "failed"],
  running: ["ok", "failed", "cancelled", "queued"],
  ok: [],
  failed: [],
  cancelled: [],
};

export const FINAL_STATES: readonly RunStatus[] = ["ok", "failed", "cancelled"];

export function canMove(from: RunStatus, to: RunStatus): boolean {
  return RUN_TRANSITIONS[from].includes(to);
}

/** A running job whose worker has not written for this long is taken to have lost its worker. */
export const STALE_JOB_SECONDS = 40;
/** How often a working job writes its heartbeat (progress writes count as heartbeats too). */
export const HEARTBEAT_SECONDS = 10;
/** Attempts after which an interrupted solve is failed instead of queued again. */
export const MAX_JOB_ATTEMPTS = 3;

export interface RunJobView {
  runId: string;
  jobId: string | null;
  state: RunStatus;
  /** 0…1 */
  progress: number;
  cancelRequested: boolean;
  error: string | null;
  startedAt: string | null;
  finishedAt: string | null;
}

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

function toView(j: RunJob): RunJobView {
  return {
    runId: j.runId,
    jobId: j.jobId,
    state: j.state,
    progress: Math.max(0, Math.min(1, Number(j.progress))),
    cancelRequested: j.cancelRequested,
    error: j.error,
    startedAt: iso(j.startedAt),
    finishedAt: iso(j.finishedAt),
  };
}

type JobPatch = Partial<
  Pick<RunJob, "progress" | "error" | "worker" | "startedAt" | "finishedAt" | "jobId">
> & {
  attempts?: unknown;
  cancelRequested?: boolean;
};
type RunPatch = Partial<
  Pick<Run, "solverVersion" | "result" | "measures" | "checks" | "checksPassed" | "checksTotal" | "timings">
>;

/**
 * Move one run from one of `from` to `to`, with extra job and run fields, in one transaction.
 * Returns false (and changes nothing) when the run was not in one of `from` (someone else moved
 * it first) or `where` did not hold.
 */
async function move(
  runId: string,
  from: readonly RunStatus[],
  to: RunStatus,
  patch: { job?: JobPatch; run?: RunPatch; where?: WhereOptions<RunJob> } = {},
  outer?: Transaction,
): Promise<boolean> {
  for (const f of from) if (!canMove(f, to)) throw new Error(`a run cannot move from ${f} to ${to}`);
  const work = async (transaction: Transaction) => {
    const [count] = await RunJob.update(
      {
        ...(patch.job as object),
        state: to,
        ...(FINAL_STATES.includes(to) ? { finishedAt: new Date() } : {}),
      },
      { where: { runId, state: { [Op.in]: [...from] }, ...(patch.where as object) }, transaction },
    );
    if (count === 0) return false;
    await Run.update({ ...patch.run, status: to }, { where: { id: runId }, transaction });
    return true;
  };
  return outer ? work(outer) : sequelize.transaction(work);
}

/** The job row of a freshly saved 'queued' run (its pg-boss job id comes with `attachQueueJob`). */
export async function openJob(runId: string): Promise<void> {
  await RunJob.upsert({ runId, state: "queued", progress: 0, cancelRequested: false, error: null });
}

export async function attachQueueJob(runId: string, jobId: string): Promise<void> {
  await RunJob.update({ jobId }, { where: { runId } });
}

/** queued → running, unless a cancel was asked for. The worker's name is kept. */
export function claim(runId: string, worker: string): Promise<boolean> {
  return move(runId, ["queued"], "running", {
    job: { worker, startedAt: new Date(), attempts: sequelize.literal("attempts + 1") },
    where: { cancelRequested: false },
  });
}

/**
 * Progress (0…1) and heartbeat of a running job. Returns whether a cancel was requested, or null
 * when the job is no longer running (moved by someone else).
 */
export async function beat(runId: string, progress?: number): Promise<{ cancelRequested: boolean } | null> {
  const [, rows] = await RunJob.update(
    { ...(progress === undefined ? {} : { progress }), updatedAt: new Date() },
    { where: { runId, state: "running" }, returning: true },
  );
  const row = rows[0];
  return row ? { cancelRequested: row.cancelRequested } : null;
}

/** running → ok with the solved result (a cancel that came after the last progress check loses). */
export function complete(runId: string, run: RunPatch): Promise<boolean> {
  return move(runId, ["running"], "ok", { job: { progress: 1, error: null }, run });
}

/** queued or running → failed, with the reason kept for the run page. */
export function fail(runId: string, error: string): Promise<boolean> {
  return move(runId, ["queued", "running"], "failed", { job: { error }, run: { result: null } });
}

/** running → cancelled (the worker saw the request). */
export function finishCancelled(runId: string): Promise<boolean> {
  return move(runId, ["running"], "cancelled");
}

/**
 * Ask for a run's solve to stop: a queued one is cancelled at once (returns "cancelled"); a running
 * one is flagged and its worker stops at its next progress check ("requested"); a finished one is
 * left alone ("final").
 */
export async function requestCancel(runId: string): Promise<"cancelled" | "requested" | "final" | "none"> {
  return sequelize.transaction(async (transaction) => {
    const job = await RunJob.findByPk(runId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!job) return "none";
    if (FINAL_STATES.includes(job.state)) return "final";
    if (job.state === "queued") {
      await move(runId, ["queued"], "cancelled", { job: { cancelRequested: true } }, transaction);
      return "cancelled";
    }
    await RunJob.update({ cancelRequested: true }, { where: { runId }, transaction });
    return "requested";
  });
}

/** A running job the queue stopped (shutdown, expiry): made stale at once for `recoverStale`. */
export async function markAbandoned(runId: string): Promise<void> {
  // Raw SQL: Sequelize's update() always stamps updated_at with now().
  await sequelize.query(
    "UPDATE run_jobs SET updated_at = 'epoch' WHERE run_id = :runId AND state = 'running'",
    {
      replacements: { runId },
    },
  );
}

/**
 * The runs whose worker is gone (a running job without a heartbeat for `staleSeconds`): a cancel
 * asked for meanwhile is finished as cancelled; after MAX_JOB_ATTEMPTS the run fails; the others
 * go back to 'queued' and are returned so that the caller puts them on the queue again.
 */
export async function recoverStale(staleSeconds = STALE_JOB_SECONDS): Promise<string[]> {
  const stale = await RunJob.findAll({
    attributes: ["runId", "attempts", "cancelRequested"],
    where: { state: "running", updatedAt: { [Op.lt]: new Date(Date.now() - staleSeconds * 1000) } },
  });
  const requeued: string[] = [];
  for (const j of stale) {
    const still = { updatedAt: { [Op.lt]: new Date(Date.now() - staleSeconds * 1000) } };
    if (j.cancelRequested) {
      await move(j.runId, ["running"], "cancelled", { where: still });
    } else if (j.attempts >= MAX_JOB_ATTEMPTS) {
      const error = `the solve was interrupted ${j.attempts} times; save the run again to retry`;
      await move(j.runId, ["running"], "failed", { job: { error }, where: still });
    } else {
      const back = await move(j.runId, ["running"], "queued", {
        job: { progress: 0, startedAt: null, worker: null },
        where: still,
      });
      if (back) requeued.push(j.runId);
    }
  }
  return requeued;
}

/** The job of a run, or null when the run was solved in its request (never queued). */
export async function getRunJob(runId: string): Promise<RunJobView | null> {
  const job = await RunJob.findByPk(runId);
  return job ? toView(job) : null;
}
