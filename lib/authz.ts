/**
 * The one authorization module. Every route handler and server action asks here.
 * A resource of a team the caller is not in answers 404 (NotFoundError), never 403, so ids don't leak.
 */

import { cache } from "react";
import { Membership, Project, RUN_HEAVY_COLUMNS, Run } from "@/lib/db";
import { ForbiddenError, NotFoundError, withDb } from "@/lib/errors";

import { isRole, ROLES, type Role } from "@/lib/roles";

export { isRole, ROLES, type Role };
export type Action =
  | "team:read"
  | "team:manage"
  | "project:create"
  | "project:delete"
  | "project:read"
  | "run:create"
  | "run:read"
  | "run:comment"
  | "run:review"
  | "run:request_review"
  | "measurement:upload";

export const ACTIONS: readonly Action[] = [
  "team:read",
  "team:manage",
  "project:create",
  "project:delete",
  "project:read",
  "run:create",
  "run:read",
  "run:comment",
  "run:review",
  "run:request_review",
  "measurement:upload",
];

const READ: Action[] = ["team:read", "project:read", "run:read"];

/** The roles table of PRODUCT.md: owner everything; designer builds; reviewer reads, comments, decides; viewer reads. */
const PERMISSIONS: Record<Role, ReadonlySet<Action>> = {
  owner: new Set(ACTIONS),
  designer: new Set<Action>([
    ...READ,
    "project:create",
    "run:create",
    "run:comment",
    "run:request_review",
    "measurement:upload",
  ]),
  reviewer: new Set<Action>([...READ, "run:comment", "run:review"]),
  viewer: new Set<Action>(READ),
};

/** Whether a member with `role` may perform `action`. Pure; unknown roles may do nothing. */
export function can(role: Role, action: Action): boolean {
  return PERMISSIONS[role]?.has(action) ?? false;
}

/**
 * Who may settle a comment thread or open it again: the comment's author, the run's author, and the
 * team's reviewers and owners (the people who decide on the run). Pure.
 */
export function canSettleComment(p: {
  role: Role;
  userId: string;
  commentAuthorId: string;
  runAuthorId: string;
}): boolean {
  if (!can(p.role, "run:comment")) return false;
  if (p.role === "owner" || p.role === "reviewer") return true;
  return p.userId === p.commentAuthorId || p.userId === p.runAuthorId;
}

/** ForbiddenError unless `canSettleComment`. */
export function authorizeSettle(p: Parameters<typeof canSettleComment>[0]): void {
  if (!canSettleComment(p)) {
    throw new ForbiddenError(
      "Only the comment's author, the run's author, a reviewer or an owner may settle or reopen this thread.",
    );
  }
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export function isUuid(value: unknown): value is string {
  return typeof value === "string" && UUID.test(value);
}

/*
 * The look-ups behind each check run once per request: React's request cache (`cache`) shares them
 * between a page's layout, its tab title and every loader the page calls (one run page view asked
 * four times before). Outside a render (route handlers, server actions, tests) `cache` calls through,
 * so an action's change is always seen by the render that follows it. What they return is shared:
 * read it, never change it.
 */
const roleIn = cache(async (userId: string, teamId: string): Promise<Role | null> => {
  if (!isUuid(userId) || !isUuid(teamId)) return null;
  const m = await Membership.findOne({ where: { teamId, userId }, attributes: ["role"] });
  const role: unknown = m?.get("role");
  return isRole(role) ? role : null;
});

const projectAccess = cache(async (userId: string, projectId: string) => {
  if (!isUuid(projectId)) return null;
  const project = await Project.findByPk(projectId);
  const role = project ? await roleIn(userId, project.teamId) : null;
  return project && role ? { project, role } : null;
});

const runAccess = cache(async (userId: string, runId: string) => {
  if (!isUuid(runId)) return null;
  // Only the run's keys and state: its result can be megabytes (see getRun for the whole run).
  const run = await Run.findByPk(runId, {
    attributes: { exclude: RUN_HEAVY_COLUMNS },
    include: [{ model: Project, as: "project" }],
  });
  const project = run?.project;
  const role = project ? await roleIn(userId, project.teamId) : null;
  return run && project && role ? { run, project, role } : null;
});

function check(role: Role, action: Action): void {
  if (!can(role, action)) throw new ForbiddenError(`Your role (${role}) does not allow this.`);
}

/** The caller's role in a team, if it allows `action`. Not a member or bad id → NotFoundError. */
export async function authorizeTeam(userId: string, teamId: string, action: Action): Promise<{ role: Role }> {
  const role = await withDb(() => roleIn(userId, teamId));
  if (!role) throw new NotFoundError("Team not found.");
  check(role, action);
  return { role };
}

/** The project and the caller's role in its team, if it allows `action`. */
export async function authorizeProject(userId: string, projectId: string, action: Action) {
  const access = await withDb(() => projectAccess(userId, projectId));
  if (!access) throw new NotFoundError("Project not found.");
  check(access.role, action);
  return access;
}

/** The run (keys and state as of the request's first check), its project and the caller's role, if it allows `action`. */
export async function authorizeRun(userId: string, runId: string, action: Action) {
  const access = await withDb(() => runAccess(userId, runId));
  if (!access) throw new NotFoundError("Run not found.");
  check(access.role, action);
  return access;
}
