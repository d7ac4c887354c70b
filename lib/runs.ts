import { type InferCreationAttributes, Op, type Order, type WhereOptions } from "sequelize";
import { type Action, authorizeProject, authorizeRun, can, type Role } from "@/lib/authz";
import { Project, ReviewEvent, RUN_HEAVY_COLUMNS, Run, sequelize, Team, User } from "@/lib/db";
import { NetlistInvalidError, NotFoundError, TooLargeError, withDb } from "@/lib/errors";
import { sha256Hex } from "@/lib/hash";
import { enqueueRunSolve, planRunSolve } from "@/lib/jobs";
import { MAX_NETLIST_BYTES, MAX_SAVED_POINTS } from "@/lib/limits";
import { derivedRunColumns, storedResult } from "@/lib/run-columns";
import type { RunDetail, RunListPage, RunSummary } from "@/lib/run-types";
import type { Actor } from "@/lib/session";
import { checkRevisionOf, linkSupersede } from "@/lib/supersede";
import type { RunCreateInput, RunListQuery } from "@/lib/validations/run";
import { solveNetlist } from "@/solver";
import type { CheckResult, MeasureResult, NetlistError } from "@/solver/types";

export { sha256Hex } from "@/lib/hash";
export type { ReviewEventView, ReviewStateName, RunDetail, RunListPage, RunSummary } from "@/lib/run-types";

function iso(d: unknown): string {
  return d instanceof Date ? d.toISOString() : String(d);
}

function asArray<T>(v: unknown): T[] {
  return Array.isArray(v) ? (v as T[]) : [];
}

function toSummary(run: Run): RunSummary {
  return {
    id: run.id,
    projectId: run.projectId,
    title: run.title,
    authorId: run.authorId,
    authorName: run.author?.name ?? "",
    createdAt: iso(run.createdAt),
    status: run.status,
    reviewState: run.reviewState,
    checksPassed: run.checksPassed ?? null,
    checksTotal: run.checksTotal ?? null,
    measures: asArray<MeasureResult>(run.measures),
    supersedesId: run.supersedesId ?? null,
  };
}

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

const SORT_COLUMNS: Record<RunListQuery["sort"], (dir: "ASC" | "DESC") => Order> = {
  createdAt: (dir) => [["createdAt", dir]],
  // Case-insensitive, whatever the database collation is.
  title: (dir) => [
    [sequelize.fn("lower", sequelize.col("Run.title")), dir],
    ["createdAt", "DESC"],
  ],
  author: (dir) => [
    [sequelize.fn("lower", sequelize.col("author.name")), dir],
    ["createdAt", "DESC"],
  ],
  reviewState: (dir) => [
    ["reviewState", dir],
    ["createdAt", "DESC"],
  ],
  checksPassed: (dir) => [
    ["checksPassed", dir === "ASC" ? "ASC NULLS FIRST" : "DESC NULLS LAST"],
    ["createdAt", "DESC"],
  ],
};

/** One page of a project's runs, sorted and filtered on the server. */
export async function listRuns(actor: Actor, projectId: string, query: RunListQuery): Promise<RunListPage> {
  await authorizeProject(actor.userId, projectId, "project:read");
  const where: WhereOptions = { projectId };
  const and: WhereOptions[] = [where];
  if (query.q) and.push({ title: { [Op.iLike]: `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` } });
  if (query.review) and.push({ reviewState: query.review });
  if (query.author) and.push({ authorId: query.author });
  const dir = query.dir === "asc" ? "ASC" : "DESC";
  const { rows, count } = await withDb(() =>
    Run.findAndCountAll({
      where: { [Op.and]: and },
      attributes: { exclude: RUN_HEAVY_COLUMNS },
      include: [{ model: User, as: "author", attributes: ["id", "name"] }],
      order: SORT_COLUMNS[query.sort](dir),
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    }),
  );
  return {
    runs: rows.map(toSummary),
    total: count,
    page: query.page,
    pageSize: query.pageSize,
    pages: Math.max(1, Math.ceil(count / query.pageSize)),
  };
}

/** Loads a run the caller may act on, with what the run page needs. */
export async function getRun(actor: Actor, runId: string, action: Action = "run:read"): Promise<RunDetail> {
  const { role } = await authorizeRun(actor.userId, runId, action);
  return withDb(async () => {
    const run = await Run.findByPk(runId, {
      include: [
        { model: User, as: "author", attributes: ["id", "name"] },
        {
          model: Project,
          as: "project",
          attributes: ["id", "name", "teamId"],
          include: [{ model: Team, as: "team", attributes: ["id", "name"] }],
        },
        { model: Run, as: "supersedes", attributes: ["id", "title"] },
      ],
    });
    if (!run?.project) throw new NotFoundError("Run not found.");
    const [events, later] = await Promise.all([
      ReviewEvent.findAll({
        where: { runId },
        include: [{ model: User, as: "actor", attributes: ["id", "name"] }],
        order: [["createdAt", "ASC"]],
      }),
      Run.findAll({
        where: { supersedesId: runId },
        attributes: ["id", "title"],
        order: [["createdAt", "ASC"]],
      }),
    ]);
    const result = storedResult(run.result);
    return {
      ...toSummary(run),
      netlist: run.netlist,
      netlistHash: run.netlistHash,
      solverVersion: run.solverVersion,
      result,
      checks: asArray<CheckResult>(run.checks),
      timings: (run.timings ?? null) as Record<string, number> | null,
      project: {
        id: run.project.id,
        name: run.project.name,
        teamId: run.project.teamId,
        teamName: run.project.team?.name ?? "",
      },
      role,
      permissions: {
        comment: can(role, "run:comment"),
        review: can(role, "run:review"),
        askSignOff: can(role, "run:request_review"),
        createRun: can(role, "run:create"),
      },
      reviewEvents: events.map((e) => ({
        id: e.id,
        action: e.action,
        note: e.note ?? null,
        actorName: e.actor?.name ?? "",
        createdAt: iso(e.createdAt),
      })),
      supersedes: run.supersedes ? { id: run.supersedes.id, title: run.supersedes.title } : null,
      supersededBy: later.map((r) => ({ id: r.id, title: r.title })),
    };
  });
}
