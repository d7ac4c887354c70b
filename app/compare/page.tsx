import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Suspense } from "react";
import { GroupDelayView } from "@/components/analyses/group-delay-view";
import { CompareSkeleton } from "@/components/compare/compare-skeleton";
import { FlippedChecks } from "@/components/compare/flipped-checks";
import { MeasuresCompare } from "@/components/compare/measures-compare";
import { NetlistDiff } from "@/components/compare/netlist-diff";
import { CompareOverlayPlot } from "@/components/compare/overlay-plot";
import { PartsChanges } from "@/components/compare/parts-changes";
import { ReadingsCompare } from "@/components/compare/readings-compare";
import { ReviewStateBadge } from "@/components/review/review-state-badge";
import { Caution } from "@/components/run/caution";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeading, Panel, PanelHeader } from "@/components/ui/panel";
import { authorizeRun } from "@/lib/authz";
import type { RunComparison } from "@/lib/compare";
import { describeDiffStats } from "@/lib/netlist-diff";
import { visibleOr404 } from "@/lib/page-access";
import { type CompareSideView, compareSavedRuns } from "@/lib/runs-compare";
import { type Actor, requireUser } from "@/lib/session";
import { formatDate } from "@/lib/utils";
import { compareQuerySchema } from "@/lib/validations/run";

export const metadata: Metadata = { title: "Compare runs" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

export default async function ComparePage({ searchParams }: Props) {
  const actor = await requireUser();
  const sp = await searchParams;
  const parsed = compareQuerySchema.safeParse({ a: sp.a, b: sp.b });
  if (!parsed.success) {
    // Two ids of which one is malformed: the same "not found" as an id that matches no run.
    if (sp.a && sp.b) notFound();
    return (
      <div className="mx-auto max-w-3xl px-4 py-12 sm:px-6">
        <PageHeading title="Compare runs" />
        <EmptyState title="Choose two runs first">
          Open a project, tick two runs in its table and press “Compare selected”.{" "}
          <Link href="/projects" className="text-board-700 underline">
            Go to projects
          </Link>
        </EmptyState>
      </div>
    );
  }
  const ids = parsed.data;
  // Both runs must be visible: a 404 (with its status) before the comparison streams in.
  await visibleOr404(() =>
    Promise.all([
      authorizeRun(actor.userId, ids.a, "run:read"),
      authorizeRun(actor.userId, ids.b, "run:read"),
    ]),
  );
  return (
    <Suspense fallback={<CompareSkeleton />}>
      <Comparison actor={actor} a={ids.a} b={ids.b} />
    </Suspense>
  );
}

/** The comparison itself: both results loaded, diffed and overlaid. */
async function Comparison({ actor, a: idA, b: idB }: { actor: Actor; a: string; b: string }) {
  const { a, b, comparison, readings } = await visibleOr404(() => compareSavedRuns(actor, idA, idB));
  const labelA = `A: ${a.title}`;
  const labelB = `B: ${b.title}`;
  return (
    <div className="mx-auto max-w-6xl px-4 py-8 sm:px-6">
      <PageHeading
        title="Compare runs"
        lead="What changed from run A to run B: netlist, parts, measures, checks and response."
      />
      <div className="mb-6 grid gap-4 sm:grid-cols-2">
        <SideCard side={a} letter="A" />
        <SideCard side={b} letter="B" />
      </div>
      <div className="space-y-6">
        <Panel aria-labelledby="overlay-h">
          <PanelHeader
            id="overlay-h"
            title="Response overlay"
            description="B solid, A dashed; the difference B − A dotted on its own axes at the right."
          />
          <div className="p-2 sm:p-4">
            <CompareOverlayPlot
              traces={comparison.traces}
              labelA={labelA}
              labelB={labelB}
              markers={comparison.measures
                .filter((m) => m.unit === "Hz" && m.b !== null && m.b > 0)
                .map((m) => ({ frequencyHz: m.b as number, label: `${m.name} (B)` }))}
              exportName="compare"
            />
          </div>
        </Panel>
        <DelayComparePanel traces={comparison.traces} />
        {/* min-w-0: a grid cell may shrink below its table's width (the table then fits or stacks). */}
        <div className="grid gap-6 lg:grid-cols-2 [&>*]:min-w-0">
          <Panel aria-labelledby="measures-h">
            <PanelHeader id="measures-h" title="Measures" description="Side by side with Δ and Δ%." />
            <div className="p-3">
              <MeasuresCompare measures={comparison.measures} labelA="A" labelB="B" />
            </div>
          </Panel>
          <div className="space-y-6">
            <Panel aria-labelledby="checks-h">
              <PanelHeader id="checks-h" title="Checks that flipped" />
              <div className="p-3">
                <FlippedChecks checks={comparison.flippedChecks} labelA="A" labelB="B" />
              </div>
            </Panel>
            <Panel aria-labelledby="parts-h">
              <PanelHeader id="parts-h" title="Parts changed" />
              <div className="overflow-x-auto p-3">
                <PartsChanges parts={comparison.parts} errors={comparison.partErrors} />
              </div>
            </Panel>
          </div>
        </div>
        <Panel aria-labelledby="readings-h">
          <PanelHeader
            id="readings-h"
            title="Bench readings"
            description="What the boards showed, against A's and B's prediction (deviation in %)."
          />
          <div className="p-3">
            <ReadingsCompare rows={readings} />
          </div>
        </Panel>
        <Panel aria-labelledby="diff-h">
          <PanelHeader
            id="diff-h"
            title="Netlist changes"
            description={describeDiffStats(comparison.rowStats)}
          />
          <div className="overflow-x-auto p-2 sm:p-4">
            <NetlistDiff rows={comparison.rows} labelA={labelA} labelB={labelB} />
          </div>
        </Panel>
        <Caution />
      </div>
    </div>
  );
}

/** Group delay of both runs and B − A, when both carry it (a chart of its own). */
function DelayComparePanel({ traces }: { traces: RunComparison["traces"] }) {
  if (!traces.some((t) => t.delay)) return null;
  return (
    <Panel aria-labelledby="delay-cmp-h">
      <PanelHeader
        id="delay-cmp-h"
        title="Group delay"
        description="B solid, A dashed; the difference B − A dotted on its own axis at the right."
      />
      <div className="p-2 sm:p-4">
        <GroupDelayView
          inPanel
          frequencies={traces.find((t) => t.delay)?.frequencies ?? []}
          series={traces.flatMap((t) =>
            t.delay
              ? [
                  { name: `${t.name} · B`, y: t.delay.b },
                  { name: `${t.name} · A`, y: t.delay.a, dash: "dash" as const },
                  {
                    name: `${t.name} Δ (B − A)`,
                    y: t.delay.diff,
                    dash: "dot" as const,
                    difference: true,
                  },
                ]
              : [],
          )}
        />
      </div>
    </Panel>
  );
}

function SideCard({ side, letter }: { side: CompareSideView; letter: "A" | "B" }) {
  return (
    <Panel className="p-4">
      <p className="text-caption text-copper-600 font-mono tracking-widest uppercase">Run {letter}</p>
      <h2 className="text-ink-900 text-lead mt-1 flex flex-wrap items-center gap-2 font-semibold">
        <Link href={`/runs/${side.id}`} className="hover:underline">
          {side.title}
        </Link>
        <ReviewStateBadge state={side.reviewState} />
      </h2>
      <p className="text-ink-600 mt-1 text-sm">
        {side.authorName} · {formatDate(side.createdAt)} · {side.project.name}
        {side.checksTotal ? ` · checks ${side.checksPassed}/${side.checksTotal}` : ""}
      </p>
    </Panel>
  );
}
