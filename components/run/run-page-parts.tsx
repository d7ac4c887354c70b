import Link from "next/link";
import type { ReactNode } from "react";
import { AnalysesPanel } from "@/components/analyses/analyses-panel";
import { analysisSections } from "@/components/analyses/analysis-math";
import { GroupDelayView } from "@/components/analyses/group-delay-view";
import { ReviewActions } from "@/components/review/review-actions";
import { ReviewHistory } from "@/components/review/review-history";
import { ReviewStateBadge } from "@/components/review/review-state-badge";
import { Caution } from "@/components/run/caution";
import { ExportButtons } from "@/components/run/export-buttons";
import { NetlistView } from "@/components/run/netlist-view";
import { WarningsList } from "@/components/run/warnings-list";
import { buttonClass } from "@/components/ui/button-class";
import { Panel, PanelHeader } from "@/components/ui/panel";
import type { DrawnResult } from "@/lib/drawn-result";
import type { RunDetail } from "@/lib/run-types";
import { formatDate } from "@/lib/utils";
import type { Warning } from "@/solver/types";

/** The run page's parts that need no client state: its header, review panel and the netlist column. */

/** Breadcrumb, title, author line, revision links, Revise and export buttons. */
export function RunHeader({
  run,
  plotId,
  hasResult,
}: {
  run: RunDetail;
  plotId: string;
  hasResult: boolean;
}) {
  return (
    <>
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
          {hasResult ? <ExportButtons runId={run.id} plotId={plotId} fileName={run.title} /> : null}
        </div>
      </header>
    </>
  );
}

/** Where the run stands in review and the steps this viewer may take. */
export function ReviewPanel({ run, isAuthor }: { run: RunDetail; isAuthor: boolean }) {
  return (
    <Panel aria-labelledby="review-h">
      <PanelHeader id="review-h" title="Review" />
      <div className="space-y-5 p-4">
        <ReviewActions
          runId={run.id}
          reviewState={run.reviewState}
          isAuthor={isAuthor}
          canRequest={run.permissions.askSignOff}
          canReview={run.permissions.review}
        />
        <ReviewHistory events={run.reviewEvents} />
      </div>
    </Panel>
  );
}

/** Warnings and the netlist beside the caution note (and the review panel when there is no plot). */
export function RunDetails({
  run,
  warnings,
  reviewPanel,
}: {
  run: RunDetail;
  warnings: Warning[];
  reviewPanel: ReactNode;
}) {
  return (
    <div className="mt-6 grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="min-w-0 space-y-6">
        {warnings.length > 0 ? (
          <Panel aria-labelledby="warn-h">
            <PanelHeader id="warn-h" title="Warnings" />
            <div className="p-4">
              <WarningsList warnings={warnings} netlistIdPrefix="netlist" />
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
            <NetlistView netlist={run.netlist} warnings={warnings} idPrefix="netlist" />
          </div>
        </Panel>
      </div>
      <div className="space-y-6">
        {reviewPanel}
        <Caution />
      </div>
    </div>
  );
}

/** Solve progress and the studies beyond one sweep; nothing when the run has none. */
export function RunAnalyses({ run, result }: { run: RunDetail; result: DrawnResult | null }) {
  if (analysisSections(result, run.status).length === 0) return null;
  return (
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
  );
}

/** The group delay of the traces that carry it (a panel of its own under the plot). */
export function GroupDelayPanel({ result }: { result: DrawnResult }) {
  if (!result.traces.some((t) => t.groupDelay)) return null;
  return (
    <Panel className="mt-6">
      <div className="p-4 sm:p-5">
        <GroupDelayView traces={result.traces} frequencies={result.frequencies} />
      </div>
    </Panel>
  );
}
