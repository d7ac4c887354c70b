import type { Metadata } from "next";
import { TeamProjects } from "@/components/projects/team-projects";
import { AwaitingList } from "@/components/review/awaiting-list";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeading } from "@/components/ui/panel";
import { listAwaitingMySignOff } from "@/lib/awaiting";
import { listTeamsWithProjects } from "@/lib/projects";
import { requireUser } from "@/lib/session";

export const metadata: Metadata = { title: "Projects" };

export default async function ProjectsPage() {
  const actor = await requireUser();
  const [teams, awaiting] = await Promise.all([
    listTeamsWithProjects(actor.userId),
    listAwaitingMySignOff(actor.userId),
  ]);
  return (
    <div className="mx-auto max-w-6xl px-4 py-10 sm:px-6">
      <PageHeading
        title="Projects"
        lead="Every team you belong to, and the networks each one is working on."
      />
      <AwaitingList runs={awaiting} />
      {teams.length === 0 ? (
        <EmptyState title="You are not in a team yet">
          Ask a teammate to invite you, or sign up again to get a workbench team of your own.
        </EmptyState>
      ) : (
        <div className="space-y-8">
          {teams.map((team) => (
            <TeamProjects key={team.id} team={team} />
          ))}
        </div>
      )}
    </div>
  );
}
