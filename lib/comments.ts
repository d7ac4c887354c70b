import { authorizeRun, authorizeSettle, isUuid } from "@/lib/authz";
import { Comment, sequelize, User } from "@/lib/db";
import { BadRequestError, NotFoundError, withDb } from "@/lib/errors";
import { deliverSoon, enqueueEmails } from "@/lib/mail/outbox";
import { commentMail } from "@/lib/mail/templates";
import type { ThreadState } from "@/lib/review-states";
import { type SweepFacts, sweepFacts } from "@/lib/run-columns";
import type { Actor } from "@/lib/session";
import type { CommentCreateInput } from "@/lib/validations/comment";

export type CommentView = {
  id: string;
  runId: string;
  parentId: string | null;
  body: string;
  frequencyHz: number | null;
  trace: string | null;
  authorId: string;
  authorName: string;
  createdAt: string;
  state: ThreadState;
  settledAt: string | null;
  settledByName: string | null;
};

function toView(c: Comment): CommentView {
  return {
    id: c.id,
    runId: c.runId,
    parentId: c.parentId ?? null,
    body: c.body,
    frequencyHz: c.frequencyHz ?? null,
    trace: c.trace ?? null,
    authorId: c.authorId,
    authorName: c.author?.name ?? "",
    createdAt: c.createdAt.toISOString(),
    state: c.settledAt ? "settled" : "open",
    settledAt: c.settledAt ? c.settledAt.toISOString() : null,
    settledByName: c.settledBy?.name ?? null,
  };
}

const INCLUDE = [
  { model: User, as: "author", attributes: ["id", "name"] },
  { model: User, as: "settledBy", attributes: ["id", "name"] },
];

/** A run's comments, oldest first (threads are built by the client from parentId). */
export async function listComments(actor: Actor, runId: string): Promise<CommentView[]> {
  await authorizeRun(actor.userId, runId, "run:read");
  const rows = await withDb(() =>
    Comment.findAll({ where: { runId }, include: INCLUDE, order: [["createdAt", "ASC"]] }),
  );
  return rows.map(toView);
}

/** A pin must name a frequency inside the run's sweep and, when given, one of its traces. */
function checkPin(facts: SweepFacts | null, input: CommentCreateInput): void {
  const fields: Record<string, string[]> = {};
  const hz = input.frequencyHz ?? null;
  if (input.trace && hz == null) fields.trace = ["A trace pin needs a frequency too."];
  if (hz != null && facts && facts.lo !== null && facts.hi !== null) {
    const { lo, hi } = facts;
    if (hz < lo * (1 - 1e-9) || hz > hi * (1 + 1e-9)) {
      fields.frequencyHz = [`Pick a frequency inside the sweep (${lo} Hz to ${hi} Hz).`];
    }
  }
  if (input.trace && facts && !facts.traces.includes(input.trace)) {
    fields.trace = [`This run has no trace named "${input.trace}".`];
  }
  if (Object.keys(fields).length > 0) throw new BadRequestError("The pin does not fit this run.", { fields });
}

/**
 * Adds a comment (or a reply: replies hang off the thread's first comment). The comment and the
 * e-mails to the run's author and the thread's participants (never the commenter) are written in one
 * transaction; delivery starts after the commit.
 */
export async function createComment(
  actor: Actor,
  runId: string,
  input: CommentCreateInput,
): Promise<CommentView> {
  const { run } = await authorizeRun(actor.userId, runId, "run:comment");
  checkPin(await withDb(() => sweepFacts(runId)), input);
  const created = await withDb(() =>
    sequelize.transaction(async (transaction) => {
      let rootId: string | null = null;
      if (input.parentId) {
        const parent = await Comment.findOne({ where: { id: input.parentId, runId }, transaction });
        if (!parent) {
          throw new BadRequestError("That comment is not on this run.", {
            fields: { parentId: ["Not a comment of this run."] },
          });
        }
        rootId = parent.parentId ?? parent.id;
      }
      const comment = await Comment.create(
        {
          runId,
          authorId: actor.userId,
          parentId: rootId,
          body: input.body,
          frequencyHz: input.frequencyHz ?? null,
          trace: input.trace ?? null,
        },
        { transaction },
      );
      const recipientIds = new Set<string>([String(run.get("authorId"))]);
      if (rootId) {
        const thread = await Comment.findAll({
          where: { runId, parentId: rootId },
          attributes: ["authorId"],
          transaction,
        });
        const root = await Comment.findByPk(rootId, { attributes: ["authorId"], transaction });
        if (root) recipientIds.add(root.authorId);
        for (const t of thread) recipientIds.add(t.authorId);
      }
      recipientIds.delete(actor.userId);
      const recipients = await User.findAll({
        where: { id: [...recipientIds] },
        attributes: ["email"],
        transaction,
      });
      await enqueueEmails(
        recipients.map((u) =>
          commentMail({
            to: u.email,
            commenter: actor.name || actor.email,
            runTitle: String(run.get("title")),
            runId,
            body: input.body,
            frequencyHz: input.frequencyHz ?? null,
            trace: input.trace ?? null,
            isReply: rootId !== null,
          }),
        ),
        transaction,
      );
      return comment;
    }),
  );
  deliverSoon();
  const full = await withDb(() => Comment.findByPk(created.id, { include: INCLUDE }));
  if (!full) throw new NotFoundError("Comment not found.");
  return toView(full);
}

/** Settles a comment thread of the run, or opens it again (who may: `canSettleComment` in lib/authz.ts). */
export async function setCommentState(
  actor: Actor,
  runId: string,
  commentId: string,
  state: ThreadState,
): Promise<CommentView> {
  const { run, role } = await authorizeRun(actor.userId, runId, "run:comment");
  return withDb(async () => {
    const comment = isUuid(commentId) ? await Comment.findOne({ where: { id: commentId, runId } }) : null;
    if (!comment) throw new NotFoundError("Comment not found.");
    authorizeSettle({
      role,
      userId: actor.userId,
      commentAuthorId: comment.authorId,
      runAuthorId: String(run.get("authorId")),
    });
    await comment.update(
      state === "settled"
        ? { settledAt: new Date(), settledById: actor.userId }
        : { settledAt: null, settledById: null },
    );
    const full = await Comment.findByPk(comment.id, { include: INCLUDE });
    if (!full) throw new NotFoundError("Comment not found.");
    return toView(full);
  });
}
