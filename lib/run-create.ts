/**
 * Saving a run: the netlist is checked against the limits, solved in the request (or, for a large
 * study, saved as 'queued' for the worker: lib/jobs.ts), and written with its supersede link
 * (lib/supersede.ts) in one transaction. Reading runs is lib/runs.ts.
 */
import type { InferCreationAttributes } from "sequelize";
import { authorizeProject, type Role } from "@/lib/authz";
import { Run, sequelize } from "@/lib/db";
import { NetlistInvalidError, TooLargeError, withDb } from "@/lib/errors";
import { sha256Hex } from "@/lib/hash";
import { enqueueRunSolve, planRunSolve } from "@/lib/jobs";
import { MAX_NETLIST_BYTES, MAX_SAVED_POINTS } from "@/lib/limits";
import { derivedRunColumns } from "@/lib/run-columns";
import type { RunSummary } from "@/lib/run-types";
import { toSummary } from "@/lib/runs";
import type { Actor } from "@/lib/session";
import { checkRevisionOf, linkSupersede } from "@/lib/supersede";
import type { RunCreateInput } from "@/lib/validations/run";
import { solveNetlist } from "@/solver";
import type { NetlistError } from "@/solver/types";

/**
 * Solves the netlist and saves it as a new run. The solve happens first; the run (and, when it
 * supersedes an earlier run, that run's "supersede" review event) are written in one transaction.
 * A netlist with errors throws NetlistInvalidError (422) with the solver's errors and saves nothing.
 */
export async function createRun(actor: Actor, projectId: string, input: RunCreateInput): Promise<RunSummary> {
  const { role } = await authorizeProject(actor.userId, projectId, "run:create");
  const bytes = Buffer.byteLength(input.netlist, "utf8");
  if (bytes > MAX_NETLIST_BYTES) {
    throw new TooLargeError(`The netlist is ${bytes} bytes; the limit is ${MAX_NETLIST_BYTES}.`, {
      limit: MAX_NETLIST_BYTES,
    });
  }
  const olderId = input.supersedesId;
  if (olderId) await withDb(() => checkRevisionOf(role, projectId, olderId));
  // Job queue (lib/jobs.ts): a large study (over MAX_INLINE_WORK in lib/limits.ts) is checked
  // here, saved as 'queued' without a result and solved by `npm run worker`.
  const plan = planRunSolve(input.netlist, MAX_SAVED_POINTS);
  if (plan.mode === "invalid") throw invalid(plan.errors);
  if (plan.mode === "queue") return createQueuedRun(actor, role, projectId, input, plan.solverVersion);

  const started = performance.now();
  const result = solveNetlist(input.netlist, { maxPoints: MAX_SAVED_POINTS });
  const solveMs = performance.now() - started;
  if (!result.ok) throw invalid(result.errors);
  if (result.stats.points > MAX_SAVED_POINTS) {
    throw new TooLargeError(
      `The sweep has ${result.stats.points} points; a saved run may have ${MAX_SAVED_POINTS}.`,
      {
        limit: MAX_SAVED_POINTS,
      },
    );
  }
  const run = await saveRun(actor, role, projectId, input, {
    ...derivedRunColumns(result),
    status: "ok",
    timings: { solveMs: round3(solveMs), engineMs: result.stats.solveMs },
  });
  return { ...toSummary(run), authorName: actor.name };
}

function invalid(errors: NetlistError[]): NetlistInvalidError {
  const n = errors.length;
  return new NetlistInvalidError(`The netlist has ${n} error${n === 1 ? "" : "s"}; nothing was saved.`, {
    errors,
  });
}

type RunOutcome = Pick<
  InferCreationAttributes<Run>,
  "solverVersion" | "status" | "result" | "measures" | "checks" | "checksPassed" | "checksTotal" | "timings"
>;

/** Writes the run and, when it supersedes an earlier run, that run's "supersede" event: one transaction. */
async function saveRun(
  actor: Actor,
  role: Role,
  projectId: string,
  input: RunCreateInput,
  outcome: RunOutcome,
): Promise<Run> {
  return withDb(() =>
    sequelize.transaction(async (transaction) => {
      const created = await Run.create(
        {
          projectId,
          authorId: actor.userId,
          title: input.title,
          netlist: input.netlist,
          netlistHash: sha256Hex(input.netlist),
          reviewState: "draft",
          ...outcome,
        },
        { transaction },
      );
      if (input.supersedesId) {
        await linkSupersede({
          role,
          actorId: actor.userId,
          olderId: input.supersedesId,
          newerId: created.id,
          field: "supersedesId",
          transaction,
        });
        created.supersedesId = input.supersedesId; // as linkSupersede wrote it
      }
      return created;
    }),
  );
}

/**
 * Job queue (issue 5): save a run as 'queued' (no result yet) with its supersede event, then put
 * it on the queue (lib/jobs.ts). If the queue cannot take it, the run is marked 'failed'.
 */
async function createQueuedRun(
  actor: Actor,
  role: Role,
  projectId: string,
  input: RunCreateInput,
  solverVersion: string,
): Promise<RunSummary> {
  const run = await saveRun(actor, role, projectId, input, {
    solverVersion,
    status: "queued",
    result: null,
    measures: null,
    checks: null,
    checksPassed: null,
    checksTotal: null,
    timings: null,
  });
  try {
    await enqueueRunSolve(run.id);
  } catch (error) {
    // enqueueRunSolve has moved the run to 'failed' (lib/run-lifecycle.ts).
    console.error("[runs] the job queue did not take run", run.id, error);
    run.status = "failed";
  }
  return { ...toSummary(run), authorName: actor.name };
}

function round3(x: number): number {
  return Math.round(x * 1000) / 1000;
}
