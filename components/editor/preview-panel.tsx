"use client";

import { memo, type ReactNode } from "react";
import { AnalysesPanel } from "@/components/analyses/analyses-panel";
import { analysisSections } from "@/components/analyses/analysis-math";
import { Caution } from "@/components/run/caution";
import { CheckBadges } from "@/components/run/check-badges";
import { MeasuresTable } from "@/components/run/measures-table";
import { WarningsList } from "@/components/run/warnings-list";
import { Button, PlainButton } from "@/components/ui/button";
import { TickedText } from "@/components/ui/ticked-text";
import { cn } from "@/lib/utils";
import { type PreviewView, previewStatus } from "./preview-view";

// The studies' charts are redrawn only when the studies shown change (not on every keystroke).
const Analyses = memo(AnalysesPanel);

export interface PreviewPanelProps {
  view: PreviewView;
  plot: ReactNode;
  onGoToLine: (line: number, column?: number) => void;
  onSelectFrequency: (hz: number) => void;
  /** Saves the netlist as a run so the whole analysis is solved (queued); offered when the preview deferred it. */
  onRunFull?: () => void;
}

/**
 * Status line, plot, errors, measures, checks, warnings and the caution of the live preview. What it
 * may show comes from `previewView`: nothing of another text, except the last good result marked stale
 * while an edit is on its way.
 */
export function PreviewPanel({ view, plot, onGoToLine, onSelectFrequency, onRunFull }: PreviewPanelProps) {
  const result = view.kind === "result" ? view.result : null;
  const stale = view.kind === "result" && view.stale;
  const errors = view.kind === "errors" ? view.errors : [];
  const analyses = view.kind === "result" ? view.analyses : null;
  const studying = view.kind === "result" && view.pendingStudies.length > 0;
  return (
    <>
      <div
        role="status"
        aria-live="polite"
        data-testid="preview-status"
        className={cn(
          "flex min-h-9 items-center gap-2 rounded-md border px-3 py-1.5 text-sm",
          view.kind === "errors"
            ? "border-signal-fault/30 bg-signal-fault-soft text-signal-fault"
            : view.kind === "failed"
              ? "border-signal-warn/30 bg-signal-warn-soft text-signal-warn"
              : "border-paper-200 text-ink-600 bg-white",
        )}
      >
        {view.kind === "solving" || stale || studying || (view.kind === "errors" && view.checking) ? (
          <span
            className="border-board-300 inline-block size-3 animate-spin rounded-full border-2 border-t-transparent"
            aria-hidden
          />
        ) : null}
        <span>{previewStatus(view)}</span>
      </div>

      {errors.length > 0 ? (
        <ol className="flex flex-col gap-1 text-sm" aria-label="Netlist errors">
          {errors.map((e, i) => (
            <li key={`${e.line}-${e.column}-${i}`}>
              <PlainButton
                type="button"
                onClick={() => onGoToLine(e.line, e.column)}
                className="border-signal-fault/20 hover:bg-signal-fault-soft w-full rounded-md border bg-white px-2.5 py-1.5 text-left"
              >
                <span className="text-signal-fault font-mono font-semibold">
                  {e.line}:{e.column}
                </span>{" "}
                <span className="text-ink-900">
                  <TickedText text={e.message} />
                </span>
                {e.hint ? (
                  <span className="text-ink-600 block">
                    <TickedText text={e.hint} />
                  </span>
                ) : null}
              </PlainButton>
            </li>
          ))}
        </ol>
      ) : null}

      <div
        data-testid="preview-plot"
        data-stale={stale || undefined}
        className={cn(
          "rounded-panel border-paper-200 shadow-panel min-h-72 border bg-white p-2",
          stale && "opacity-60",
        )}
      >
        {result ? (
          plot
        ) : (
          <div className="text-ink-500 flex h-72 items-center justify-center px-6 text-center text-sm">
            {emptyPlotText(view)}
          </div>
        )}
        {stale ? (
          <p className="text-caption text-ink-600 px-2 pb-1">Stale: solved before your last edit.</p>
        ) : null}
      </div>

      {result?.deferred && !stale ? (
        <div
          role="status"
          data-testid="preview-deferred"
          className="border-copper-300 bg-copper-50 text-ink-800 flex flex-wrap items-center gap-3 rounded-md border px-3 py-2 text-sm"
        >
          <span className="min-w-0 flex-1">
            Nominal sweep only: {result.deferred.replace(/^the /, "The ")}
          </span>
          {onRunFull ? (
            <Button type="button" size="sm" onClick={onRunFull}>
              Run full analysis
            </Button>
          ) : null}
        </div>
      ) : null}

      {result ? (
        <div className={cn("grid gap-4 sm:grid-cols-2", stale && "opacity-60")}>
          <div>
            <h3 className="text-ink-800 mb-1 text-sm font-semibold">Measures</h3>
            <MeasuresTable measures={result.measures} onSelectFrequency={onSelectFrequency} />
          </div>
          <div>
            <h3 className="text-ink-800 mb-1 text-sm font-semibold">Checks</h3>
            <CheckBadges checks={result.checks} />
          </div>
        </div>
      ) : null}
      {analyses ? (
        <div
          data-testid="preview-analyses"
          data-stale={analyses.stale || undefined}
          className={cn(analyses.stale && "opacity-60")}
        >
          {analyses.stale && analysisSections(analyses.result, "ok").length > 0 ? (
            <p className="text-caption text-ink-600 mb-2">
              {stale
                ? "Stale: solved before your last edit."
                : "Stale: from before your last edit; updating…"}
            </p>
          ) : null}
          <Analyses result={analyses.result} />
        </div>
      ) : null}
      <WarningsList warnings={result?.warnings ?? []} onLineClick={(line) => onGoToLine(line)} />
      <Caution />
    </>
  );
}

function emptyPlotText(view: PreviewView): string {
  switch (view.kind) {
    case "solving":
      return "Solving…";
    case "errors":
      return "No plot while the netlist has errors: fix the ones listed above.";
    case "failed":
      return "No plot: the preview could not be solved. Your netlist is unchanged.";
    default:
      return "The plot appears here once the netlist solves.";
  }
}
