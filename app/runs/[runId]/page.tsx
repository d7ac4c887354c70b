import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { AnalysesPanel } from "@/components/analyses/analyses-panel";
import { analysisSections } from "@/components/analyses/analysis-math";
import { GroupDelayView } from "@/components/analyses/group-delay-view";
import { ReadingsPanel } from "@/components/readings/readings-panel";
import { ReviewActions } from "@/components/review/review-actions";
import { ReviewHistory } from "@/components/review/review-history";
import { ReviewStateBadge } from "@/components/review/review-state-badge";
import { Caution } from "@/components/run/caution";
import { CheckBadges } from "@/components/run/check-badges";
import { ExportButtons } from "@/components/run/export-buttons";
import { NetlistView } from "@/components/run/netlist-view";
import { WarningsList } from "@/components/run/warnings-list";
import { OverlayChooser } from "@/components/runs/overlay-chooser";
import { RunWorkspace } from "@/components/runs/run-workspace";
import { buttonClass } from "@/components/ui/button-class";
import { Notice } from "@/components/ui/notice";
import { Panel, PanelHeader } from "@/components/ui/panel";
import { can } from "@/lib/authz";
import { listComments } from "@/lib/comments";
import { drawnResult } from "@/lib/drawn-result";
import { NotFoundError } from "@/lib/errors";
import { listMeasurements } from "@/lib/measurements";
import { runPageMetadata } from "@/lib/page-titles";
import { listReadings } from "@/lib/readings";
import { overlaidData } from "@/lib/run-overlays";
import { getRun } from "@/lib/runs";
import { requireUser } from "@/lib/session";
import { formatDate } from "@/lib/utils";

export function generateMetadata({ params }: { params: Promise<{ runId: string }> }): Promise<Metadata> {
  return params.then(({ runId }) => runPageMetadata(runId));
}

export default async function RunPage({ params }: { params: Promise<{ runId: string }> }) {
  const actor = await requireUser();
  const { runId } = await params;
  const [run, comments] = await Promise.all([getRun(actor, runId), listComments(actor, runId)]).catch(
    (err: unknown) => {
      if (err instanceof NotFoundError) notFound();
      throw err;
    },
  );
  const [measurements, overlaid, readings] = await Promise.all([
    listMeasurements(actor, run.projectId),
    overlaidData(run.id),
    listReadings(actor, run.id),
  ]);
  // Only what the page draws goes to its client components (lib/drawn-result.ts: no re/im).
  const result = run.result ? drawnResult(run.result) : null;
  const plotId = `run-plot-${run.id.slice(0, 8)}`;
  const stamp = { title: run.title, netlistHash: run.netlistHash };
  const hasAnalyses = analysisSections(result, run.status).length > 0;
  const reviewPanel = (
    <Panel aria-labelledby="review-h">
      <PanelHeader id="review-h" title="Review" />
      <div className="space-y-5 p-4">
        <ReviewActions
          runId={run.id}
          reviewState={run.reviewState}
          isAuthor={run.authorId === actor.userId}
          canRequest={run.permissions.askSignOff}
          canReview={run.permissions.review}
        />
        <ReviewHistory events={run.reviewEvents} />
      </div>
    </Panel>
  );
  return (
    <div className="mx-auto max-w-[90rem] px-4 py-8 sm:px-6">
      <nav aria-label="Breadcrumb" className="text-ink-500 mb-2 text-sm">
        <Link href="/projects" className="hover:underline">
          Projects
        </Link>{" "}
        /{" "}
        <Link href={`/projects/${run.projectId}`} className="hover:underline">
          {run.project.name}
        </Link>
      </nav>
      <header className="mb-6 flex flex-wrap items-start justify-between gap-4">
        <div className="min-w-0">
          <h1 className="text-headline text-ink-950 flex flex-wrap items-center gap-3 font-semibold">
            <span className="break-words">{run.title}</span>
            <ReviewStateBadge state={run.reviewState} />
          </h1>
          <p className="text-ink-600 mt-1 text-sm">
            by <span className="text-ink-800 font-medium">{run.authorName}</span> ·{" "}
            <time dateTime={run.createdAt}>{formatDate(run.createdAt)}</time> · solver {run.solverVersion}
            {run.checksTotal ? ` · checks ${run.checksPassed}/${run.checksTotal}` : ""}
          </p>
          {run.supersedes ? (
            <p className="mt-1 text-sm">
              Revises{" "}
              <Link href={`/runs/${run.supersedes.id}`} className="text-board-700 underline">
                {run.supersedes.title}
              </Link>
            </p>
          ) : null}
          {run.supersededBy.length > 0 ? (
            <p className="text-signal-warn mt-1 text-sm">
              Superseded by{" "}
              {run.supersededBy.map((s, i) => (
                <span key={s.id}>
                  {i > 0 ? ", " : ""}
                  <Link href={`/runs/${s.id}`} className="underline">
                    {s.title}
                  </Link>
                </span>
              ))}
            </p>
          ) : null}
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {run.permissions.createRun ? (
            <Link
              href={`/projects/${run.projectId}/new?revise=${run.id}`}
              className={buttonClass({
                variant: run.reviewState === "sent_back" ? "primary" : "secondary",
                size: "sm",
              })}
              title="Open this netlist in the editor; the run you save supersedes this one"
            >
              Revise
            </Link>
          ) : null}
          {result ? <ExportButtons runId={run.id} plotId={plotId} fileName={run.title} /> : null}
        </div>
      </header>

      {result ? (
        <>
          <div className="mb-6">
            <CheckBadges checks={result.checks} />
          </div>
          <RunWorkspace
            runId={run.id}
            plotId={plotId}
            exportName={run.title}
            stamp={stamp}
            frequencies={result.frequencies}
            traces={result.traces}
            measures={result.measures}
            measurements={overlaid.map((m) => ({ name: m.name, ...m.data }))}
            benchChooser={
              <OverlayChooser
                runId={run.id}
                options={measurements.map(({ id, name, points, fromHz, toHz }) => ({
                  id,
                  name,
                  points,
                  fromHz,
                  toHz,
                }))}
                selected={overlaid.map((m) => m.id)}
                canChoose={run.permissions.createRun}
              />
            }
            comments={comments}
            canComment={run.permissions.comment}
            aside={reviewPanel}
          />
          {result.traces.some((t) => t.groupDelay) ? (
            <Panel className="mt-6">
              <div className="p-4 sm:p-5">
                <GroupDelayView traces={result.traces} frequencies={result.frequencies} />
              </div>
            </Panel>
          ) : null}
        </>
      ) : run.status === "queued" || run.status === "running" ? null : (
        <Notice tone="warn" title="This run has no result.">
          Its status is “{run.status}”.
        </Notice>
      )}

      {hasAnalyses ? (
        <Panel aria-labelledby="analyses-h" className="mt-6">
          <PanelHeader
            id="analyses-h"
            title="Analyses"
            description="Solve progress and the studies beyond one sweep."
          />
          <div className="p-4 sm:p-5">
            <AnalysesPanel
              result={result}
              runId={run.id}
              status={run.status}
              canCancel={run.permissions.createRun}
            />
          </div>
        </Panel>
      ) : null}

      <div className="mt-6">
        <ReadingsPanel
          runId={run.id}
          readings={readings}
          measures={result?.measures ?? []}
          monteCarlo={result?.monteCarlo?.measures}
          canRecord={can(run.role, "measurement:upload")}
        />
      </div>

      <div className="mt-6 grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-6">
          {result && result.warnings.length > 0 ? (
            <Panel aria-labelledby="warn-h">
              <PanelHeader id="warn-h" title="Warnings" />
              <div className="p-4">
                <WarningsList warnings={result.warnings} netlistIdPrefix="netlist" />
              </div>
            </Panel>
          ) : null}
          <Panel aria-labelledby="netlist-h">
            <PanelHeader
              id="netlist-h"
              title="Netlist"
              description={`sha256 ${run.netlistHash.slice(0, 12)}…`}
            />
            <div className="p-2 sm:p-4">
              <NetlistView netlist={run.netlist} warnings={result?.warnings ?? []} idPrefix="netlist" />
            </div>
          </Panel>
        </div>
        <div className="space-y-6">
          {result ? null : reviewPanel}
          <Caution />
        </div>
      </div>
    </div>
  );
}
