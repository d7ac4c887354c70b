import { authorizeProject, can, type Role } from "@/lib/authz";
import { Membership, Team, User } from "@/lib/db";
import { withDb } from "@/lib/errors";
import type { Actor } from "@/lib/session";

export type ProjectOverview = {
  id: string;
  name: string;
  description: string | null;
  teamId: string;
  teamName: string;
  role: Role;
  canCreateRun: boolean;
  canUpload: boolean;
  members: { id: string; name: string }[];
};

/** The project header of the runs page: name, team, the caller's role, members (for the author filter). */
export async function getProjectOverview(actor: Actor, projectId: string): Promise<ProjectOverview> {
  const { project, role } = await authorizeProject(actor.userId, projectId, "project:read");
  const teamId = String(project.get("teamId"));
  const [team, members] = await withDb(() =>
    Promise.all([
      Team.findByPk(teamId, { attributes: ["id", "name"] }),
      Membership.findAll({
        where: { teamId },
        include: [{ model: User, as: "user", attributes: ["id", "name"] }],
      }),
    ]),
  );
  return {
    id: String(project.get("id")),
    name: String(project.get("name")),
    description: (project.get("description") as string | null) ?? null,
    teamId,
    teamName: team?.name ?? "",
    role,
    canCreateRun: can(role, "run:create"),
    canUpload: can(role, "measurement:upload"),
    members: members
      .map((m) => ({ id: m.userId, name: m.user?.name ?? "" }))
      .sort((a, b) => a.name.localeCompare(b.name)),
  };
}
