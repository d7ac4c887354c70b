/** Reading runs: one page of a project's list (sorted, filtered on the server) and one run with what its page shows. Saving is lib/run-create.ts. */
import { Op, type Order, type WhereOptions } from "sequelize";
import { type Action, authorizeProject, authorizeRun, can } from "@/lib/authz";
import { Project, ReviewEvent, RUN_HEAVY_COLUMNS, Run, sequelize, Team, User } from "@/lib/db";
import { NotFoundError, withDb } from "@/lib/errors";
import { storedResult } from "@/lib/run-columns";
import type { RunDetail, RunListPage, RunSummary } from "@/lib/run-types";
import type { Actor } from "@/lib/session";
import type { RunListQuery } from "@/lib/validations/run";
import type { CheckResult, MeasureResult } from "@/solver/types";

export { sha256Hex } from "@/lib/hash";
export type { ReviewEventView, ReviewStateName, RunDetail, RunListPage, RunSummary } from "@/lib/run-types";

function iso(d: unknown): string {
  return d instanceof Date ? d.toISOString() : String(d);
}

function asArray<T>(v: unknown): T[] {
  return Array.isArray(v) ? (v as T[]) : [];
}

export function toSummary(run: Run): RunSummary {
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
