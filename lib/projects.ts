import { UniqueConstraintError } from "sequelize";
import { authorizeTeam, type Role } from "@/lib/authz";
import { Project, sequelize } from "@/lib/db";
import { BadRequestError, withDb } from "@/lib/errors";
import { listTeamsForUser, type TeamSummary } from "@/lib/teams";
import type { ProjectCreateInput } from "@/lib/validations/project";

export type ProjectSummary = {
  id: string;
  teamId: string;
  name: string;
  description: string | null;
  createdAt: string;
  runCount: number;
  lastRunAt: string | null;
};

export type TeamWithProjects = TeamSummary & { projects: ProjectSummary[] };

type ProjectRow = {
  id: string;
  teamId: string;
  name: string;
  description: string | null;
  createdAt: Date;
};

function toSummary(p: ProjectRow, stats?: { n: number; last: Date | null }): ProjectSummary {
  return {
    id: p.id,
    teamId: p.teamId,
    name: p.name,
    description: p.description ?? null,
    createdAt: p.createdAt.toISOString(),
    runCount: stats?.n ?? 0,
    lastRunAt: stats?.last ? new Date(stats.last).toISOString() : null,
  };
}

/** Projects of the given teams with their run counts, by name. The caller has checked membership. */
async function projectsOfTeams(teamIds: string[]): Promise<ProjectSummary[]> {
  if (teamIds.length === 0) return [];
  const projects = await Project.findAll({ where: { teamId: teamIds }, order: [["name", "ASC"]] });
  const ids = projects.map((p) => p.id);
  const stats = ids.length
    ? ((await sequelize.query(
        'SELECT project_id AS "projectId", COUNT(*)::int AS n, MAX(created_at) AS last FROM runs WHERE project_id IN (:ids) GROUP BY project_id',
        { replacements: { ids }, type: "SELECT" },
      )) as { projectId: string; n: number; last: Date | null }[])
    : [];
  const byProject = new Map(stats.map((s) => [s.projectId, s]));
  return projects.map((p) => toSummary(p, byProject.get(p.id)));
}

/** Every team of the user with its projects (the /projects page). */
export async function listTeamsWithProjects(userId: string): Promise<TeamWithProjects[]> {
  const teams = await listTeamsForUser(userId);
  const projects = await withDb(() => projectsOfTeams(teams.map((t) => t.id)));
  return teams.map((t) => ({ ...t, projects: projects.filter((p) => p.teamId === t.id) }));
}

/** Projects visible to the user, optionally of one team (a team the user is not in → NotFoundError). */
export async function listProjects(
  userId: string,
  teamId?: string,
): Promise<(ProjectSummary & { teamName: string; role: Role })[]> {
  if (teamId) await authorizeTeam(userId, teamId, "project:read");
  const teams = (await listTeamsForUser(userId)).filter((t) => !teamId || t.id === teamId);
  const byTeam = new Map(teams.map((t) => [t.id, t]));
  const projects = await withDb(() => projectsOfTeams([...byTeam.keys()]));
  return projects.map((p) => {
    const team = byTeam.get(p.teamId)!;
    return { ...p, teamName: team.name, role: team.role };
  });
}

/** Creates a project in a team where the user may (owner or designer). Names are unique per team. */
export async function createProject(userId: string, input: ProjectCreateInput): Promise<ProjectSummary> {
  await authorizeTeam(userId, input.teamId, "project:create");
  try {
    const project = await withDb(() =>
      Project.create({
        teamId: input.teamId,
        name: input.name,
        description: input.description ?? null,
        createdById: userId,
      }),
    );
    return toSummary(project);
  } catch (err) {
    if (err instanceof UniqueConstraintError) {
      const message = "This team already has a project with that name.";
      throw new BadRequestError(message, { fields: { name: [message] } });
    }
    throw err;
  }
}
