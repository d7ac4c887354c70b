/**
 * "Waiting for my sign-off": runs across all of a user's teams that are awaiting sign-off, in teams
 * where the user's role may sign off (lib/authz.ts decides which roles), authored by someone else.
 * Oldest request first, so the longest wait is at the top.
 */
import { can, ROLES } from "@/lib/authz";
import { sequelize } from "@/lib/db";
import { withDb } from "@/lib/errors";

export type AwaitingRun = {
  id: string;
  title: string;
  projectId: string;
  projectName: string;
  teamName: string;
  authorName: string;
  /** When the author asked for sign-off (ISO). */
  askedAt: string;
};

export async function listAwaitingMySignOff(userId: string, limit = 50): Promise<AwaitingRun[]> {
  const roles = ROLES.filter((r) => can(r, "run:review"));
  return withDb(async () => {
    const rows = (await sequelize.query(
      `SELECT r.id, r.title, p.id AS "projectId", p.name AS "projectName", t.name AS "teamName",
              u.name AS "authorName",
              COALESCE((SELECT MAX(e.created_at) FROM review_events e
                         WHERE e.run_id = r.id AND e.action = 'submit'), r.created_at) AS "askedAt"
         FROM runs r
         JOIN projects p ON p.id = r.project_id
         JOIN teams t ON t.id = p.team_id
         JOIN memberships m ON m.team_id = p.team_id AND m.user_id = :userId AND m.role::text IN (:roles)
         JOIN users u ON u.id = r.author_id
        WHERE r.review_state = 'awaiting_signoff' AND r.author_id <> :userId
        ORDER BY "askedAt" ASC
        LIMIT :limit`,
      { replacements: { userId, roles, limit }, type: "SELECT" },
    )) as (Omit<AwaitingRun, "askedAt"> & { askedAt: Date | string })[];
    return rows.map((r) => ({ ...r, askedAt: new Date(r.askedAt).toISOString() }));
  });
}
