import type { Metadata } from "next";
import { authorizeTeam } from "@/lib/authz";
import { Team } from "@/lib/db";
import { withDb } from "@/lib/errors";
import { canReadProject, canReadRun } from "@/lib/page-access";
import { getActor } from "@/lib/session";

/**
 * Browser-tab titles that name the thing on the page (the framework's route announcer reads them to
 * screen-reader users after a navigation). Only what the caller may see is named; anything else —
 * signed out, not visible, database down — falls back to the generic title, and the page itself then
 * answers as it does.
 */
async function titled(fallback: string, load: (userId: string) => Promise<string | null>): Promise<Metadata> {
  try {
    const actor = await getActor();
    const title = actor ? await load(actor.userId) : null;
    return { title: title || fallback };
  } catch {
    return { title: fallback };
  }
}

export function runPageMetadata(runId: string): Promise<Metadata> {
  return titled("Run", async (userId) => {
    const { run } = await canReadRun(userId, runId);
    return String(run.get("title"));
  });
}

export function projectPageMetadata(projectId: string, prefix = ""): Promise<Metadata> {
  return titled(prefix ? prefix.trim() : "Project", async (userId) => {
    const { project } = await canReadProject(userId, projectId);
    return `${prefix}${String(project.get("name"))}`;
  });
}

export function teamPageMetadata(teamId: string): Promise<Metadata> {
  return titled("Team", async (userId) => {
    await authorizeTeam(userId, teamId, "team:read");
    const team = await withDb(() => Team.findByPk(teamId, { attributes: ["name"] }));
    return team ? String(team.get("name")) : null;
  });
}
