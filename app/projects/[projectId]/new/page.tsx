import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { NetlistEditor } from "@/components/editor/netlist-editor";
import { Notice } from "@/components/ui/notice";
import { authorizeProject, isUuid } from "@/lib/authz";
import { AppError, ForbiddenError, NotFoundError } from "@/lib/errors";
import { listExamples } from "@/lib/examples";
import { solveLivePreview } from "@/lib/live-preview";
import { projectPageMetadata } from "@/lib/page-titles";
import { getRun } from "@/lib/runs";
import { type Actor, requireUser } from "@/lib/session";

export function generateMetadata({ params }: { params: Promise<{ projectId: string }> }): Promise<Metadata> {
  return params.then(({ projectId }) => projectPageMetadata(projectId, "New run · "));
}

type Props = {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<{ revise?: string | string[] }>;
};

/** The run to revise (`?revise=RUN_ID`): readable by the caller and in this project, else none. */
async function runToRevise(actor: Actor, projectId: string, id: string | undefined) {
  if (!id || !isUuid(id)) return null;
  const run = await getRun(actor, id).catch((err: unknown) => {
    if (err instanceof NotFoundError || err instanceof ForbiddenError) return null;
    throw err;
  });
  return run && run.projectId === projectId ? { id: run.id, title: run.title, netlist: run.netlist } : null;
}

export default async function NewRunPage({ params, searchParams }: Props) {
  const actor = await requireUser();
  const { projectId } = await params;
  const { revise } = await searchParams;
  const access = await authorizeProject(actor.userId, projectId, "run:create").catch((err: unknown) => {
    if (err instanceof NotFoundError) notFound();
    if (err instanceof ForbiddenError) return null;
    throw err;
  });
  if (!access) {
    return (
      <div className="mx-auto max-w-3xl px-4 py-12 sm:px-6">
        <Notice tone="warn" title="Your role in this team cannot create runs.">
          Ask a team owner for the designer role, or{" "}
          <Link href={`/projects/${projectId}`} className="underline">
            go back to the project
          </Link>
          .
        </Notice>
      </div>
    );
  }
  const [examples, revising] = await Promise.all([
    listExamples(),
    runToRevise(actor, projectId, typeof revise === "string" ? revise : undefined),
  ]);
  const projectName = String(access.project.get("name"));
  // The first text's preview is solved here, as POST /api/solve would (same budget, same pool), so the
  // page's HTML carries it and the editor asks nothing for it.
  const initialText = revising?.netlist ?? examples[0]?.text ?? "";
  const initialPreview =
    initialText.trim() === ""
      ? null
      : await solveLivePreview(initialText)
          .then((result) => ({ text: initialText, result }))
          .catch((err: unknown) => {
            // Pool full or too slow: the editor asks for it as before.
            if (err instanceof AppError) return null;
            throw err;
          });

  return (
    <div className="mx-auto max-w-[96rem] px-4 py-6 sm:px-6">
      <nav aria-label="Breadcrumb" className="text-ink-500 mb-1 text-sm">
        <Link href="/projects" className="hover:underline">
          Projects
        </Link>{" "}
        /{" "}
        <Link href={`/projects/${projectId}`} className="hover:underline">
          {projectName}
        </Link>
      </nav>
      <h1 className="text-ink-950 text-title mb-4 font-semibold">{revising ? "Revise a run" : "New run"}</h1>
      {revising ? (
        <p className="text-ink-700 -mt-2 mb-4 text-sm" data-testid="revising">
          Editing the netlist of{" "}
          <Link href={`/runs/${revising.id}`} className="text-board-700 underline">
            {revising.title}
          </Link>
          . The run you save supersedes it; its review history stays with it.
        </p>
      ) : null}
      <NetlistEditor
        projectId={projectId}
        projectName={projectName}
        examples={examples}
        revise={revising ?? undefined}
        initialPreview={initialPreview}
      />
    </div>
  );
}
