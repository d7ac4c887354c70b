import { Op } from "sequelize";
import { authorizeRun } from "@/lib/authz";
import { Membership, ReviewEvent, RUN_HEAVY_COLUMNS, Run, sequelize, User } from "@/lib/db";
import { AppError, BadRequestError, ForbiddenError, NotFoundError, withDb } from "@/lib/errors";
import { deliverSoon, enqueueEmails } from "@/lib/mail/outbox";
import { signOffRequestMail, verdictMail } from "@/lib/mail/templates";
import { readingSummaryLines } from "@/lib/readings";
import { nextReviewState, REVIEW_STATE_LABELS, type ReviewState, VERDICT_ACTIONS } from "@/lib/review-states";
import type { Actor } from "@/lib/session";
import type { ReviewActionBody } from "@/lib/validations/review";

/** 409: the run is not in a state where this review step applies. */
export class ReviewConflictError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(409, "conflict", message, details);
  }
}

export type ReviewOutcome = {
  runId: string;
  reviewState: ReviewState;
  event: { id: string; action: string; note: string | null; createdAt: string };
  emails: number;
};

/**
 * One step of the review flow, in one transaction with its e-mails:
 * submit (designer/owner; draft or sent back → awaiting sign-off; mails the team's reviewers),
 * sign_off / send_back (reviewer/owner, not the run's author; awaiting sign-off → verdict; mails the author),
 * supersede (designer/owner; links a later run of the same project as this run's replacement).
 */
export async function reviewRun(actor: Actor, runId: string, body: ReviewActionBody): Promise<ReviewOutcome> {
  const isVerdict = (VERDICT_ACTIONS as readonly string[]).includes(body.action);
  const permission = isVerdict ? "run:review" : "run:request_review";
  const { project } = await authorizeRun(actor.userId, runId, permission);
  const teamId = String(project.get("teamId"));
  const outcome = await withDb(() =>
    sequelize.transaction(async (transaction) => {
      const run = await Run.findByPk(runId, {
        attributes: { exclude: RUN_HEAVY_COLUMNS },
        lock: transaction.LOCK.UPDATE,
        transaction,
      });
      if (!run) throw new NotFoundError("Run not found.");
      const note = body.note && body.note.length > 0 ? body.note : null;
      const mails = [];
      if (body.action === "supersede") {
        const later = await Run.findOne({
          attributes: { exclude: RUN_HEAVY_COLUMNS },
          where: { id: body.supersededBy, projectId: run.projectId },
          transaction,
        });
        if (!later || later.id === run.id) {
          throw new BadRequestError("The superseding run must be another run of the same project.", {
            fields: { supersededBy: ["Not a later run of this project."] },
          });
        }
        if (later.createdAt <= run.createdAt) {
          throw new BadRequestError("A run can only be superseded by a later run.", {
            fields: { supersededBy: ["This run is older."] },
          });
        }
        if (later.supersedesId && later.supersedesId !== run.id) {
          throw new ReviewConflictError("That run already supersedes another run.");
        }
        if (!later.supersedesId) await later.update({ supersedesId: run.id }, { transaction });
      } else {
        const from = run.reviewState as ReviewState;
        const to = nextReviewState(from, body.action);
        if (to === null) {
          const label = REVIEW_STATE_LABELS[from].toLowerCase();
          throw new ReviewConflictError(`This run is ${label}; it cannot take "${body.action}".`, {
            reviewState: from,
          });
        }
        if (isVerdict && run.authorId === actor.userId) {
          throw new ForbiddenError("You cannot sign off or send back your own run.");
        }
        await run.update({ reviewState: to }, { transaction });
        const readings = await readingSummaryLines(runId);
        if (body.action === "submit") {
          const reviewers = await Membership.findAll({
            where: { teamId, role: "reviewer", userId: { [Op.ne]: actor.userId } },
            include: [{ model: User, as: "user", attributes: ["email"] }],
            transaction,
          });
          for (const m of reviewers) {
            if (m.user) {
              mails.push(
                signOffRequestMail({
                  to: m.user.email,
                  requester: actor.name || actor.email,
                  runTitle: run.title,
                  runId,
                  note,
                  readings,
                }),
              );
            }
          }
        } else if (run.authorId !== actor.userId) {
          const author = await User.findByPk(run.authorId, { attributes: ["email"], transaction });
          if (author) {
            mails.push(
              verdictMail({
                to: author.email,
                reviewer: actor.name || actor.email,
                runTitle: run.title,
                runId,
                verdict: body.action,
                note,
                readings,
              }),
            );
          }
        }
      }
      const event = await ReviewEvent.create(
        {
          runId,
          actorId: actor.userId,
          action: body.action,
          note: body.action === "supersede" && !note ? `Superseded by run ${body.supersededBy}.` : note,
        },
        { transaction },
      );
      const emails = await enqueueEmails(mails, transaction);
      return {
        runId,
        reviewState: run.reviewState as ReviewState,
        event: {
          id: event.id,
          action: event.action,
          note: event.note ?? null,
          createdAt: event.createdAt.toISOString(),
        },
        emails,
      };
    }),
  );
  if (outcome.emails > 0) deliverSoon();
  return outcome;
}
