import { json, withActor } from "@/lib/api";
import { authorizeRun } from "@/lib/authz";
import { cancelRunJob, getRunJob, type RunJobView } from "@/lib/jobs";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** The job's state; a run solved in its request has no job row: its status, progress 1. */
function shape(runStatus: string, job: RunJobView | null) {
  if (!job) return { state: runStatus, progress: 1, error: null, cancelRequested: false };
  return {
    state: job.state,
    progress: job.progress,
    error: job.error,
    cancelRequested: job.cancelRequested,
    startedAt: job.startedAt,
    finishedAt: job.finishedAt,
  };
}

/** GET /api/runs/:id/job → {state, progress 0..1, error, cancelRequested} (run:read). */
export const GET = withActor<Ctx>(async (actor, { id }) => {
  const { run } = await authorizeRun(actor.userId, id, "run:read");
  return json(shape(run.status, await getRunJob(id)));
});

/** DELETE /api/runs/:id/job → cancel a queued or running solve (run:create); answers the new state. */
export const DELETE = withActor<Ctx>(async (actor, { id }) => {
  const { run } = await authorizeRun(actor.userId, id, "run:create");
  const job = await cancelRunJob(id);
  const fresh = await getRunJob(id);
  return json(shape(fresh?.state === "cancelled" ? "cancelled" : run.status, fresh ?? job));
});
