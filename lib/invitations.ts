import { createHash, randomBytes } from "node:crypto";
import { Op } from "sequelize";
import { authorizeTeam } from "@/lib/authz";
import { Invitation, Membership, sequelize, Team, User } from "@/lib/db";
import { AppError, BadRequestError, ForbiddenError, NotFoundError, withDb } from "@/lib/errors";
import { deliverSoon, enqueueEmails } from "@/lib/mail/outbox";
import { invitationMail } from "@/lib/mail/templates";
import type { Actor } from "@/lib/session";
import { type InvitationCreateInput, invitationCreateSchema } from "@/lib/validations/invitation";
import { requireVerifiedEmail } from "@/lib/verification";

/** An invitation link works for seven days. */
export const INVITATION_TTL_MS = 7 * 24 * 3600 * 1000;

export type InvitationView = {
  id: string;
  email: string;
  role: string;
  expiresAt: string;
  createdAt: string;
};

export function hashInvitationToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

function toView(i: Invitation): InvitationView {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    expiresAt: i.expiresAt.toISOString(),
    createdAt: i.createdAt.toISOString(),
  };
}

/**
 * Invites an e-mail address into the team (owner only). Only the token's sha256 is stored; the
 * token itself travels in the e-mail, which is written to the outbox in the same transaction.
 * An earlier pending invitation to the same address stops working.
 */
export async function createInvitation(
  actor: Actor,
  teamId: string,
  input: InvitationCreateInput,
): Promise<InvitationView> {
  await authorizeTeam(actor.userId, teamId, "team:manage");
  const token = randomBytes(32).toString("base64url");
  const expiresAt = new Date(Date.now() + INVITATION_TTL_MS);
  const created = await withDb(() =>
    sequelize.transaction(async (transaction) => {
      const team = await Team.findByPk(teamId, { transaction });
      if (!team) throw new NotFoundError("Team not found.");
      const existing = await User.findOne({ where: { email: input.email }, attributes: ["id"], transaction });
      if (existing && (await Membership.count({ where: { teamId, userId: existing.id }, transaction })) > 0) {
        throw new BadRequestError("That person is already in the team.", {
          fields: { email: ["Already a member of this team."] },
        });
      }
      await Invitation.update(
        { expiresAt: new Date() },
        {
          where: { teamId, email: input.email, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
          transaction,
        },
      );
      const invitation = await Invitation.create(
        {
          teamId,
          email: input.email,
          role: input.role,
          tokenHash: hashInvitationToken(token),
          invitedById: actor.userId,
          expiresAt,
        },
        { transaction },
      );
      await enqueueEmails(
        [
          invitationMail({
            to: input.email,
            inviter: actor.name || actor.email,
            teamName: team.name,
            role: input.role,
            token,
            expiresAt,
          }),
        ],
        transaction,
      );
      return invitation;
    }),
  );
  deliverSoon();
  return toView(created);
}

/** Pending (not accepted, not expired) invitations of a team, newest first (owner only). */
export async function listInvitations(actor: Actor, teamId: string): Promise<InvitationView[]> {
  await authorizeTeam(actor.userId, teamId, "team:manage");
  const rows = await withDb(() =>
    Invitation.findAll({
      where: { teamId, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
      order: [["createdAt", "DESC"]],
    }),
  );
  return rows.map(toView);
}

/** A pending invitation of the team (owner only), or NotFoundError. */
async function pendingInvitation(actor: Actor, teamId: string, invitationId: string): Promise<Invitation> {
  await authorizeTeam(actor.userId, teamId, "team:manage");
  const inv = await withDb(() =>
    Invitation.findOne({
      where: { id: invitationId, teamId, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
    }),
  );
  if (!inv) throw new NotFoundError("No open invitation with that id in this team.");
  return inv;
}

/** Withdraws a pending invitation (owner only): its link stops working at once. */
export async function revokeInvitation(actor: Actor, teamId: string, invitationId: string): Promise<void> {
  const inv = await pendingInvitation(actor, teamId, invitationId);
  await withDb(() => inv.update({ expiresAt: new Date() }));
}

/**
 * Sends a pending invitation again (owner only) with a fresh link and seven more days; the earlier
 * link stops working (the same rule as inviting the address again).
 */
export async function resendInvitation(
  actor: Actor,
  teamId: string,
  invitationId: string,
): Promise<InvitationView> {
  const inv = await pendingInvitation(actor, teamId, invitationId);
  const role = invitationCreateSchema.shape.role.parse(inv.role);
  return createInvitation(actor, teamId, { email: inv.email, role });
}

export type InvitationPreview = {
  teamId: string;
  teamName: string;
  role: string;
  email: string;
  inviterName: string;
  expiresAt: string;
  state: "pending" | "expired" | "accepted";
};

/** What the accept page shows for a token, or null for an unknown token. */
export async function previewInvitation(token: string): Promise<InvitationPreview | null> {
  if (token.length < 20 || token.length > 100) return null;
  const inv = await withDb(() =>
    Invitation.findOne({
      where: { tokenHash: hashInvitationToken(token) },
      include: [
        { model: Team, as: "team", attributes: ["id", "name"] },
        { model: User, as: "invitedBy", attributes: ["id", "name"] },
      ],
    }),
  );
  if (!inv) return null;
  return {
    teamId: inv.teamId,
    teamName: inv.team?.name ?? "",
    role: inv.role,
    email: inv.email,
    inviterName: inv.invitedBy?.name ?? "",
    expiresAt: inv.expiresAt.toISOString(),
    state: inv.acceptedAt ? "accepted" : inv.expiresAt.getTime() <= Date.now() ? "expired" : "pending",
  };
}

/**
 * Accepts an invitation (single use) for the signed-in user, whose e-mail must be the invited one and
 * verified (EmailUnverifiedError otherwise). Returns the team id.
 */
export async function acceptInvitation(
  actor: Actor,
  token: string,
): Promise<{ teamId: string; role: string }> {
  return withDb(() =>
    sequelize.transaction(async (transaction) => {
      const inv = await Invitation.findOne({
        where: { tokenHash: hashInvitationToken(token) },
        lock: transaction.LOCK.UPDATE,
        transaction,
      });
      if (!inv) throw new NotFoundError("This invitation link is not valid.");
      if (inv.acceptedAt) throw new AppError(410, "gone", "This invitation was already used.");
      if (inv.expiresAt.getTime() <= Date.now())
        throw new AppError(410, "gone", "This invitation has expired.");
      if (inv.email.toLowerCase() !== actor.email.toLowerCase()) {
        throw new ForbiddenError(
          `This invitation was sent to ${inv.email}. Sign in with that address to accept it.`,
        );
      }
      await requireVerifiedEmail(actor.userId, transaction);
      const member = await Membership.findOne({
        where: { teamId: inv.teamId, userId: actor.userId },
        transaction,
      });
      if (!member)
        await Membership.create(
          { teamId: inv.teamId, userId: actor.userId, role: inv.role },
          { transaction },
        );
      await inv.update({ acceptedAt: new Date() }, { transaction });
      return { teamId: inv.teamId, role: member ? member.role : inv.role };
    }),
  );
}
