import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ReadingsPanel } from "@/components/readings/readings-panel";
import { CheckBadges } from "@/components/run/check-badges";
import {
  GroupDelayPanel,
  ReviewPanel,
  RunAnalyses,
  RunDetails,
  RunHeader,
} from "@/components/run/run-page-parts";
import { OverlayChooser } from "@/components/runs/overlay-chooser";
import { RunWorkspace } from "@/components/runs/run-workspace";
import { Notice } from "@/components/ui/notice";
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
  const reviewPanel = <ReviewPanel run={run} isAuthor={run.authorId === actor.userId} />;
  return (
    <div className="mx-auto max-w-[90rem] px-4 py-8 sm:px-6">
      <RunHeader run={run} plotId={plotId} hasResult={result !== null} />

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
          <GroupDelayPanel result={result} />
        </>
      ) : run.status === "queued" || run.status === "running" ? null : (
        <Notice tone="warn" title="This run has no result.">
          Its status is “{run.status}”.
        </Notice>
      )}

      <RunAnalyses run={run} result={result} />

      <div className="mt-6">
        <ReadingsPanel
          runId={run.id}
          readings={readings}
          measures={result?.measures ?? []}
          monteCarlo={result?.monteCarlo?.measures}
          canRecord={can(run.role, "measurement:upload")}
        />
      </div>

      <RunDetails run={run} warnings={result?.warnings ?? []} reviewPanel={result ? null : reviewPanel} />
    </div>
  );
}
