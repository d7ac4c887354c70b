import { randomBytes } from "node:crypto";
import type { Transaction } from "sequelize";
import { authorizeTeam, isRole, type Role } from "@/lib/authz";
import { Membership, sequelize, Team, User } from "@/lib/db";
import { BadRequestError, NotFoundError, withDb } from "@/lib/errors";
import { bumpSessionVersion } from "@/lib/session-version";

export type TeamSummary = { id: string; name: string; slug: string; role: Role; memberCount: number };
export type TeamMember = {
  membershipId: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
};

/** The teams the user belongs to, with their role, by name. */
export async function listTeamsForUser(userId: string): Promise<TeamSummary[]> {
  return withDb(async () => {
    const memberships = await Membership.findAll({
      where: { userId },
      include: [{ model: Team, as: "team" }],
    });
    const teamIds = memberships.map((m) => m.teamId);
    const counts = teamIds.length
      ? ((await sequelize.query(
          'SELECT team_id AS "teamId", COUNT(*)::int AS n FROM memberships WHERE team_id IN (:teamIds) GROUP BY team_id',
          { replacements: { teamIds }, type: "SELECT" },
        )) as { teamId: string; n: number }[])
      : [];
    const countOf = new Map(counts.map((c) => [c.teamId, c.n]));
    return memberships
      .filter((m) => m.team && isRole(m.role))
      .map((m) => ({
        id: m.teamId,
        name: m.team!.name,
        slug: m.team!.slug,
        role: m.role,
        memberCount: countOf.get(m.teamId) ?? 1,
      }))
      .sort((a, b) => a.name.localeCompare(b.name));
  });
}

/** A team and its members, for a caller who may read it (else NotFoundError). */
export async function getTeamForMember(
  userId: string,
  teamId: string,
): Promise<{ team: { id: string; name: string; slug: string }; role: Role; members: TeamMember[] }> {
  const { role } = await authorizeTeam(userId, teamId, "team:read");
  return withDb(async () => {
    const team = await Team.findByPk(teamId);
    if (!team) throw new NotFoundError("Team not found.");
    const rows = await Membership.findAll({
      where: { teamId },
      include: [{ model: User, as: "user", attributes: ["id", "name", "email"] }],
      order: [["createdAt", "ASC"]],
    });
    const rank: Record<Role, number> = { owner: 0, designer: 1, reviewer: 2, viewer: 3 };
    const members = rows
      .map((m) => ({
        membershipId: m.id,
        userId: m.userId,
        name: m.user?.name ?? "",
        email: m.user?.email ?? "",
        role: m.role,
        joinedAt: m.createdAt.toISOString(),
      }))
      .sort((a, b) => rank[a.role] - rank[b.role] || a.name.localeCompare(b.name));
    return { team: { id: team.id, name: team.name, slug: team.slug }, role, members };
  });
}

/** A URL-safe slug from a name with a short random tail, e.g. "ada-lovelace-7f3k". */
export function slugify(name: string): string {
  const base = name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 40);
  return `${base || "team"}-${randomBytes(3).toString("hex")}`;
}

/** Creates a team with `userId` as its owner, inside the caller's transaction. */
export async function createTeamWithOwner(
  userId: string,
  name: string,
  transaction: Transaction,
): Promise<{ id: string; slug: string }> {
  const team = await Team.create({ name, slug: slugify(name) }, { transaction });
  await Membership.create({ teamId: team.id, userId, role: "owner" }, { transaction });
  return { id: team.id, slug: team.slug };
}

const LAST_OWNER = "A team needs at least one owner: make someone else owner first.";

/** Loads the target membership and the team's owners, locked for the rest of the transaction. */
async function lockMembership(teamId: string, membershipId: string, transaction: Transaction) {
  const owners = await Membership.findAll({ where: { teamId, role: "owner" }, lock: true, transaction });
  const target = await Membership.findOne({ where: { id: membershipId, teamId }, lock: true, transaction });
  if (!target) throw new NotFoundError("That person is not a member of this team.");
  return { owners, target };
}

/** Owner only: gives a member another role (ending their sessions). The last owner cannot be demoted. */
export async function changeMemberRole(
  actorId: string,
  teamId: string,
  membershipId: string,
  role: Role,
): Promise<void> {
  await authorizeTeam(actorId, teamId, "team:manage");
  await withDb(() =>
    sequelize.transaction(async (transaction) => {
      const { owners, target } = await lockMembership(teamId, membershipId, transaction);
      if (target.role === "owner" && role !== "owner" && owners.length <= 1) {
        throw new BadRequestError(LAST_OWNER, { fields: { role: [LAST_OWNER] } });
      }
      if (target.role !== role) {
        await target.update({ role }, { transaction });
        // The member's open sessions end: they sign in again under the new role.
        await bumpSessionVersion(target.userId, transaction);
      }
    }),
  );
}

/** Owner only: removes a member from the team. The last owner cannot be removed. */
export async function removeMember(actorId: string, teamId: string, membershipId: string): Promise<void> {
  await authorizeTeam(actorId, teamId, "team:manage");
  await withDb(() =>
    sequelize.transaction(async (transaction) => {
      const { owners, target } = await lockMembership(teamId, membershipId, transaction);
      if (target.role === "owner" && owners.length <= 1) {
        throw new BadRequestError(LAST_OWNER);
      }
      await target.destroy({ transaction });
    }),
  );
}
