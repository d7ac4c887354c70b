/**
 * One run superseding another, in one place. Both ways of saying it go through here: the review step
 * "supersede" on the older run (lib/review.ts, `POST /api/runs/:id/review`) and saving a revision
 * with `supersedesId` (lib/runs.ts `createRun`, the editor's "Revise" flow).
 */
import type { Transaction } from "sequelize";
import { type Action, can, type Role } from "@/lib/authz";
import { ReviewEvent, RUN_HEAVY_COLUMNS, Run } from "@/lib/db";
import { BadRequestError, ConflictError, ForbiddenError } from "@/lib/errors";

/** Who may link runs: the role that asks for sign-off (designer, owner). */
export const SUPERSEDE_ACTION: Action = "run:request_review";

/** What the rules look at on each side. `newer` is absent while a revision is not saved yet. */
export type SupersedeSide = { id: string; projectId: string; createdAt: Date; supersedesId: string | null };

export type SupersedeProblem =
  | "missing"
  | "other_project"
  | "same_run"
  | "not_later"
  | "supersedes_another"
  | "already_linked";

/**
 * Why `newer` may not supersede `older`, or null when it may. Pure. Rules: both runs exist and are of
 * the same project; a run never supersedes itself; the newer run was made later; a run supersedes
 * at most one run, and a link is made once (one "supersede" event per link).
 */
export function supersedeProblem(
  older: SupersedeSide | null,
  newer: SupersedeSide | null,
): SupersedeProblem | null {
  if (!older || !newer) return "missing";
  if (older.projectId !== newer.projectId) return "other_project";
  if (older.id === newer.id) return "same_run";
  if (newer.createdAt.getTime() <= older.createdAt.getTime()) return "not_later";
  if (newer.supersedesId === older.id) return "already_linked";
  if (newer.supersedesId !== null) return "supersedes_another";
  return null;
}

/** The field each request names: the later run on the review step, the earlier run on a revision. */
export type SupersedeField = "supersededBy" | "supersedesId";

const FIELD_MESSAGES: Record<
  "missing" | "other_project" | "same_run" | "not_later",
  Record<SupersedeField, string>
> = {
  missing: { supersededBy: "Not a later run of this project.", supersedesId: "Not a run of this project." },
  other_project: {
    supersededBy: "Not a later run of this project.",
    supersedesId: "Not a run of this project.",
  },
  same_run: {
    supersededBy: "A run cannot supersede itself.",
    supersedesId: "A run cannot supersede itself.",
  },
  not_later: { supersededBy: "This run is older.", supersedesId: "That run is newer than this one." },
};

/** The error for a problem: 400 naming `field`, or 409 for a link that exists already. */
export function supersedeError(
  problem: SupersedeProblem,
  field: SupersedeField,
): BadRequestError | ConflictError {
  switch (problem) {
    case "already_linked":
      return new ConflictError("That run already supersedes this one.");
    case "supersedes_another":
      return new ConflictError("That run already supersedes another run.");
    case "not_later":
      return new BadRequestError("A run can only be superseded by a later run.", {
        fields: { [field]: [FIELD_MESSAGES.not_later[field]] },
      });
    case "same_run":
      return new BadRequestError("A run cannot supersede itself.", {
        fields: { [field]: [FIELD_MESSAGES.same_run[field]] },
      });
    default:
      return new BadRequestError(
        field === "supersedesId"
          ? "The run to supersede is not in this project."
          : "The superseding run must be another run of the same project.",
        { fields: { [field]: [FIELD_MESSAGES[problem][field]] } },
      );
  }
}

async function findSide(id: string, transaction?: Transaction, lock = false): Promise<Run | null> {
  return Run.findByPk(id, {
    attributes: { exclude: RUN_HEAVY_COLUMNS },
    ...(transaction ? { transaction, ...(lock ? { lock: transaction.LOCK.UPDATE } : {}) } : {}),
  });
}

function side(run: Run | null): SupersedeSide | null {
  return run
    ? {
        id: run.id,
        projectId: run.projectId,
        createdAt: run.createdAt,
        supersedesId: run.supersedesId ?? null,
      }
    : null;
}

/**
 * Before a revision is solved: may a run saved now in `projectId` supersede `olderId`? Throws the
 * request's error (field `supersedesId`) so nothing is solved for a revision that cannot be saved.
 */
export async function checkRevisionOf(role: Role, projectId: string, olderId: string): Promise<void> {
  if (!can(role, SUPERSEDE_ACTION)) throw new ForbiddenError(`Your role (${role}) does not allow this.`);
  const older = side(await findSide(olderId));
  const prospective: SupersedeSide = { id: "", projectId, createdAt: new Date(), supersedesId: null };
  const problem = supersedeProblem(older, prospective);
  if (problem) throw supersedeError(problem, "supersedesId");
}

/**
 * Link `newerId` as the replacement of `olderId` inside `transaction`: both rows locked, the rules of
 * `supersedeProblem` checked, the newer run's `supersedesId` set and a "supersede" event written on
 * the older run (its history says what replaced it).
 */
export async function linkSupersede(p: {
  role: Role;
  actorId: string;
  olderId: string;
  newerId: string;
  field: SupersedeField;
  /** The actor's own words; by default the event names the newer run. */
  note?: string | null;
  transaction: Transaction;
}): Promise<ReviewEvent> {
  const { transaction } = p;
  if (!can(p.role, SUPERSEDE_ACTION)) throw new ForbiddenError(`Your role (${p.role}) does not allow this.`);
  // Always lock in id order, so two links over the same pair cannot deadlock.
  const [firstId, secondId] = p.olderId < p.newerId ? [p.olderId, p.newerId] : [p.newerId, p.olderId];
  const first = await findSide(firstId, transaction, true);
  const second = firstId === secondId ? first : await findSide(secondId, transaction, true);
  const older = firstId === p.olderId ? first : second;
  const newer = firstId === p.olderId ? second : first;
  const problem = supersedeProblem(side(older), side(newer));
  if (problem || !older || !newer) throw supersedeError(problem ?? "missing", p.field);
  await newer.update({ supersedesId: older.id }, { transaction });
  return ReviewEvent.create(
    {
      runId: older.id,
      actorId: p.actorId,
      action: "supersede",
      note: p.note || `Superseded by "${newer.title}".`,
    },
    { transaction },
  );
}
