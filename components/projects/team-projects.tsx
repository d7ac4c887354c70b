import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";
import { Panel, PanelHeader } from "@/components/ui/panel";
import { RoleBadge } from "@/components/ui/role-badge";
import { can } from "@/lib/authz";
import type { TeamWithProjects } from "@/lib/projects";
import { formatDate } from "@/lib/utils";
import { CreateProjectForm } from "./create-project-form";

/** One team's projects, with the create form when the caller's role allows it. */
export function TeamProjects({ team }: { team: TeamWithProjects }) {
  const headingId = `team-${team.id}`;
  const mayCreate = can(team.role, "project:create");
  return (
    <Panel aria-labelledby={headingId}>
      <PanelHeader
        id={headingId}
        title={team.name}
        description={`${team.projects.length} project${team.projects.length === 1 ? "" : "s"} · ${team.memberCount} member${team.memberCount === 1 ? "" : "s"}`}
        action={
          <div className="flex items-center gap-3">
            <RoleBadge role={team.role} />
            <Link
              href={`/teams/${team.id}`}
              className="text-board-700 text-sm underline-offset-2 hover:underline"
            >
              Team
            </Link>
          </div>
        }
      />
      <div className="grid gap-6 p-5 lg:grid-cols-[1fr_20rem]">
        {team.projects.length === 0 ? (
          <EmptyState title="No projects yet">
            {mayCreate
              ? "Start one for the board or network you are working on; runs and reviews collect inside it."
              : "When an owner or designer starts a project, it shows up here."}
          </EmptyState>
        ) : (
          <ul className="divide-paper-200 divide-y">
            {team.projects.map((p) => (
              <li key={p.id} className="py-3 first:pt-0 last:pb-0">
                <Link
                  href={`/projects/${p.id}`}
                  className="group hover:bg-paper-100 -m-2 block rounded-md p-2"
                >
                  <span className="text-ink-900 group-hover:text-board-700 font-medium">{p.name}</span>
                  {p.description ? (
                    <span className="text-ink-600 mt-0.5 line-clamp-2 block text-sm">{p.description}</span>
                  ) : null}
                  <span className="text-caption text-ink-500 mt-1 block font-mono">
                    {p.runCount} run{p.runCount === 1 ? "" : "s"}
                    {p.lastRunAt ? ` · last run ${formatDate(p.lastRunAt)}` : ""} · project created{" "}
                    {formatDate(p.createdAt)}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        )}
        {mayCreate ? (
          <div className="border-paper-200 bg-paper-50 rounded-md border p-4">
            <h3 className="text-ink-800 mb-3 text-sm font-semibold">New project</h3>
            <CreateProjectForm teamId={team.id} teamName={team.name} />
          </div>
        ) : (
          <p className="text-ink-500 text-sm">
            {`Your role (${team.role}) can read and ${team.role === "reviewer" ? "review runs" : "follow runs"}; owners and designers create projects.`}
          </p>
        )}
      </div>
    </Panel>
  );
}
