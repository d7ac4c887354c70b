import { Op, type Transaction } from "sequelize";
import { authorizeRun } from "@/lib/authz";
import { Membership, ReviewEvent, RUN_HEAVY_COLUMNS, Run, sequelize, User } from "@/lib/db";
import { ConflictError, ForbiddenError, NotFoundError, withDb } from "@/lib/errors";
import { deliverSoon, enqueueEmails } from "@/lib/mail/outbox";
import { signOffRequestMail, verdictMail } from "@/lib/mail/templates";
import type { MailMessage } from "@/lib/mail/transport";
import { readingSummaryLines } from "@/lib/readings";
import {
  nextReviewState,
  REVIEW_STATE_LABELS,
  type ReviewState,
  type ReviewStep,
  VERDICT_ACTIONS,
} from "@/lib/review-states";
import type { Actor } from "@/lib/session";
import { linkSupersede } from "@/lib/supersede";
import type { ReviewActionBody } from "@/lib/validations/review";

export type ReviewOutcome = {
  runId: string;
  reviewState: ReviewState;
  event: { id: string; action: string; note: string | null; createdAt: string };
  emails: number;
};

function outcomeOf(run: Run, event: ReviewEvent, emails: number): ReviewOutcome {
  return {
    runId: run.id,
    reviewState: run.reviewState as ReviewState,
    event: {
      id: event.id,
      action: event.action,
      note: event.note ?? null,
      createdAt: event.createdAt.toISOString(),
    },
    emails,
  };
}

/**
 * One step of the review flow, in one transaction with its e-mails:
 * submit (designer/owner; draft or sent back → awaiting sign-off; mails the team's reviewers),
 * sign_off / send_back (reviewer/owner, not the run's author; awaiting sign-off → verdict; mails the author),
 * supersede (designer/owner; links a later run of the same project as this run's replacement: lib/supersede.ts).
 */
export async function reviewRun(actor: Actor, runId: string, body: ReviewActionBody): Promise<ReviewOutcome> {
  const isVerdict = (VERDICT_ACTIONS as readonly string[]).includes(body.action);
  const permission = isVerdict ? "run:review" : "run:request_review";
  const { project, role } = await authorizeRun(actor.userId, runId, permission);
  const teamId = String(project.get("teamId"));
  const note = body.note && body.note.length > 0 ? body.note : null;
  const outcome = await withDb(() =>
    sequelize.transaction(async (transaction) => {
      const run = await Run.findByPk(runId, {
        attributes: { exclude: RUN_HEAVY_COLUMNS },
        lock: transaction.LOCK.UPDATE,
        transaction,
      });
      if (!run) throw new NotFoundError("Run not found.");
      if (body.action === "supersede") {
        const event = await linkSupersede({
          role,
          actorId: actor.userId,
          olderId: run.id,
          newerId: body.supersededBy ?? "",
          field: "supersededBy",
          note,
          transaction,
        });
        return outcomeOf(run, event, 0);
      }
      const step = body.action;
      const from = run.reviewState as ReviewState;
      const to = nextReviewState(from, step);
      if (to === null) {
        const label = REVIEW_STATE_LABELS[from].toLowerCase();
        throw new ConflictError(`This run is ${label}; it cannot take "${step}".`, { reviewState: from });
      }
      if (isVerdict && run.authorId === actor.userId) {
        throw new ForbiddenError("You cannot sign off or send back your own run.");
      }
      await run.update({ reviewState: to }, { transaction });
      const mails = await stepMails({ actor, run, teamId, step, note, transaction });
      const event = await ReviewEvent.create(
        { runId, actorId: actor.userId, action: step, note },
        { transaction },
      );
      return outcomeOf(run, event, await enqueueEmails(mails, transaction));
    }),
  );
  if (outcome.emails > 0) deliverSoon();
  return outcome;
}

/**
 * The e-mails of a step: asking for sign-off mails the team's reviewers (not the asker); a verdict
 * mails the run's author (never the actor: `reviewRun` refuses a verdict on one's own run).
 */
async function stepMails(p: {
  actor: Actor;
  run: Run;
  teamId: string;
  step: ReviewStep;
  note: string | null;
  transaction: Transaction;
}): Promise<MailMessage[]> {
  const { actor, run, note, transaction } = p;
  const readings = await readingSummaryLines(run.id);
  const common = { runTitle: run.title, runId: run.id, note, readings };
  if (p.step === "submit") {
    const reviewers = await Membership.findAll({
      where: { teamId: p.teamId, role: "reviewer", userId: { [Op.ne]: actor.userId } },
      include: [{ model: User, as: "user", attributes: ["email"] }],
      transaction,
    });
    return reviewers.flatMap((m) =>
      m.user
        ? [signOffRequestMail({ to: m.user.email, requester: actor.name || actor.email, ...common })]
        : [],
    );
  }
  const author = await User.findByPk(run.authorId, { attributes: ["email"], transaction });
  return author
    ? [verdictMail({ to: author.email, reviewer: actor.name || actor.email, verdict: p.step, ...common })]
    : [];
}
