import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { MeasurementsPanel } from "@/components/runs/measurements-panel";
import { RunsTable } from "@/components/runs/runs-table";
import { buttonClass } from "@/components/ui/button-class";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeading, Panel, PanelHeader } from "@/components/ui/panel";
import { RoleBadge } from "@/components/ui/role-badge";
import { NotFoundError } from "@/lib/errors";
import { listMeasurements } from "@/lib/measurements";
import { projectPageMetadata } from "@/lib/page-titles";
import { getProjectOverview } from "@/lib/project-overview";
import { listRuns } from "@/lib/runs";
import { requireUser } from "@/lib/session";
import { parseRunListQuery } from "@/lib/validations/run";

export function generateMetadata({ params }: { params: Promise<{ projectId: string }> }): Promise<Metadata> {
  return params.then(({ projectId }) => projectPageMetadata(projectId));
}

type Props = {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
};

export default async function ProjectPage({ params, searchParams }: Props) {
  const actor = await requireUser();
  const { projectId } = await params;
  const sp = await searchParams;
  const parsed = (() => {
    try {
      return parseRunListQuery(sp);
    } catch {
      return parseRunListQuery({});
    }
  })();
  const data = await Promise.all([
    getProjectOverview(actor, projectId),
    listRuns(actor, projectId, parsed),
    listMeasurements(actor, projectId),
  ]).catch((err: unknown) => {
    if (err instanceof NotFoundError) notFound();
    throw err;
  });
  const [project, page, measurements] = data;
  const filtered = Boolean(parsed.q || parsed.review || parsed.author);
  return (
    <div className="mx-auto max-w-6xl px-4 py-8 sm:px-6">
      <nav aria-label="Breadcrumb" className="text-ink-500 mb-2 text-sm">
        <Link href="/projects" className="hover:underline">
          Projects
        </Link>{" "}
        / {project.teamName}
      </nav>
      <PageHeading
        title={project.name}
        lead={project.description ?? undefined}
        action={
          <div className="flex items-center gap-3">
            <RoleBadge role={project.role} />
            {project.canCreateRun ? (
              <Link href={`/projects/${project.id}/new`} className={buttonClass()}>
                New run
              </Link>
            ) : null}
          </div>
        }
      />
      <Panel className="mb-8" aria-labelledby="runs-h">
        <PanelHeader
          id="runs-h"
          title="Runs"
          description="Every saved solve of this project. Runs never change; a revision is a new run."
        />
        <div className="p-4 sm:p-5">
          {page.total === 0 && !filtered ? (
            <EmptyState title="No runs yet">
              {project.canCreateRun
                ? "Open the editor with “New run”, write a netlist and save it."
                : "A designer of the team saves the first run here."}
            </EmptyState>
          ) : (
            <RunsTable
              projectId={project.id}
              runs={page.runs}
              total={page.total}
              pages={page.pages}
              query={parsed}
              members={project.members}
            />
          )}
        </div>
      </Panel>
      <Panel aria-labelledby="meas-h">
        <PanelHeader
          id="meas-h"
          title="Bench measurements"
          description="Frequency, magnitude and phase measured on real boards."
        />
        <div className="p-4 sm:p-5">
          <MeasurementsPanel
            projectId={project.id}
            canUpload={project.canUpload}
            measurements={measurements}
          />
        </div>
      </Panel>
    </div>
  );
}
