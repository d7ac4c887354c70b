"use client";

import { type ReactNode, useMemo, useState } from "react";
import type { PinDraft } from "@/components/comments/comment-form";
import { useComments } from "@/components/comments/comments-query";
import { CommentsThread } from "@/components/comments/comments-thread";
import { BodePlot } from "@/components/plot/bode-plot";
import type { PlotStamp } from "@/components/plot/plot-registry";
import type { BodeMarker, BodePin, BodeSeries } from "@/components/plot/types";
import { MeasuresTable } from "@/components/run/measures-table";
import { Panel, PanelHeader } from "@/components/ui/panel";
import type { CommentView } from "@/lib/comments";
import type { MeasureResult, TraceResult } from "@/solver/types";

export type RunWorkspaceProps = {
  runId: string;
  plotId: string;
  exportName: string;
  /** Printed above the plot in the PNG export, with the date. */
  stamp: PlotStamp;
  frequencies: number[];
  traces: Pick<TraceResult, "name" | "magnitudeDb" | "phaseDeg">[];
  measures: MeasureResult[];
  measurements: BodeSeries[];
  comments: CommentView[];
  canComment: boolean;
  /** Server-rendered panels for the right column under the measures (e.g. the review panel). */
  aside?: ReactNode;
  /** The control choosing which bench data sets the plot draws. */
  benchChooser?: ReactNode;
};

/**
 * The interactive middle of the run page: the Bode plot with measure markers and comment pins,
 * the measures table, and the comments. Clicking the plot starts a pinned comment; clicking a pin
 * or a frequency measure zooms the plot to it.
 */
export function RunWorkspace(props: RunWorkspaceProps) {
  const {
    runId,
    plotId,
    exportName,
    stamp,
    frequencies,
    traces,
    measures,
    measurements,
    canComment,
    aside,
    benchChooser,
  } = props;
  // The comments live in the query cache (seeded by the server's list); posting and settling update it.
  const { data: comments } = useComments(runId, props.comments);
  const [pin, setPin] = useState<PinDraft | null>(null);
  const [focusHz, setFocusHz] = useState<number | null>(null);

  const markers = useMemo<BodeMarker[]>(
    () =>
      measures
        .filter((m) => m.unit === "Hz" && m.value !== null && Number.isFinite(m.value))
        .map((m) => ({ frequencyHz: m.value as number, label: m.name })),
    [measures],
  );
  const pins = useMemo<BodePin[]>(
    () => [
      ...comments
        .filter((c) => c.frequencyHz !== null && c.state === "open")
        .map((c) => ({
          frequencyHz: c.frequencyHz as number,
          trace: c.trace,
          label: `${c.authorName}: ${c.body.slice(0, 60)}`,
        })),
      ...(pin ? [{ frequencyHz: pin.frequencyHz, trace: pin.trace, label: "New pin" }] : []),
    ],
    [comments, pin],
  );

  // The axis spans the run's sweep: bench data outside it does not stretch the plot.
  const first = frequencies[0];
  const last = frequencies[frequencies.length - 1];
  const xRange = useMemo(
    () => (first !== undefined && last !== undefined ? ([first, last] as const) : null),
    [first, last],
  );

  const focus = (hz: number) => {
    setFocusHz(hz);
    document.getElementById(plotId)?.scrollIntoView({ behavior: "smooth", block: "center" });
  };

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
      <Panel aria-labelledby="plot-h" className="min-w-0 lg:col-start-1">
        <PanelHeader id="plot-h" title="Response" description="Magnitude and phase against frequency." />
        <div id={plotId} className="scroll-mt-24 p-2 sm:p-4">
          <BodePlot
            plotId={plotId}
            exportName={exportName}
            stamp={stamp}
            frequencies={frequencies}
            traces={traces}
            measurements={measurements}
            xRangeHz={xRange}
            markers={markers}
            pins={pins}
            focusHz={focusHz}
            onPickFrequency={
              canComment ? (hz, trace) => setPin({ frequencyHz: hz, trace: trace || null }) : undefined
            }
          />
          {benchChooser ? (
            <details
              className="border-paper-200 mt-2 rounded-md border px-3 py-2"
              open={measurements.length > 0}
            >
              <summary className="text-ink-800 cursor-pointer text-sm font-medium">
                Bench data on this plot ({measurements.length})
              </summary>
              <div className="pt-2">{benchChooser}</div>
            </details>
          ) : null}
        </div>
      </Panel>
      <div className="space-y-6 self-start lg:col-start-2 lg:row-span-2 lg:row-start-1">
        <Panel aria-labelledby="measures-h">
          <PanelHeader id="measures-h" title="Measures" />
          <div className="p-3">
            <MeasuresTable measures={measures} onSelectFrequency={focus} />
          </div>
        </Panel>
        {aside}
      </div>
      <Panel aria-labelledby="comments-h" className="min-w-0 lg:col-start-1">
        <PanelHeader
          id="comments-h"
          title={`Comments (${comments.filter((c) => !c.parentId).length})`}
          description="Pin a remark to a frequency by clicking the plot first."
        />
        <div className="p-4 sm:p-5">
          <CommentsThread
            runId={runId}
            comments={comments}
            canComment={canComment}
            pin={pin}
            onClearPin={() => setPin(null)}
            onPin={(p) => {
              setPin(p);
              setFocusHz(p.frequencyHz);
            }}
            traces={traces.map((t) => t.name)}
            onFocusPin={focus}
          />
        </div>
      </Panel>
    </div>
  );
}
