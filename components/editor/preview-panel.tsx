"use client";

import type { ReactNode } from "react";
import { AnalysesPanel } from "@/components/analyses/analyses-panel";
import { Caution } from "@/components/run/caution";
import { CheckBadges } from "@/components/run/check-badges";
import { MeasuresTable } from "@/components/run/measures-table";
import { WarningsList } from "@/components/run/warnings-list";
import { TickedText } from "@/components/ui/ticked-text";
import { cn } from "@/lib/utils";
import type { NetlistError, SolveResult, SolveSuccess } from "@/solver/types";
import type { LiveSolveState } from "./use-live-solve";

export interface PreviewPanelProps {
  state: LiveSolveState;
  errors: NetlistError[];
  lastGood: SolveSuccess | null;
  plot: ReactNode;
  onGoToLine: (line: number, column?: number) => void;
  onSelectFrequency: (hz: number) => void;
}

/** Status line, plot, errors, measures, checks, warnings and the caution of the live preview. */
export function PreviewPanel({
  state,
  errors,
  lastGood,
  plot,
  onGoToLine,
  onSelectFrequency,
}: PreviewPanelProps) {
  const current = state.status === "done" ? state.result : null;
  const stale = errors.length > 0 || state.status === "error";
  return (
    <>
      <div
        role="status"
        aria-live="polite"
        data-testid="preview-status"
        className={cn(
          "flex min-h-9 items-center gap-2 rounded-md border px-3 py-1.5 text-sm",
          errors.length > 0
            ? "border-signal-fault/30 bg-signal-fault-soft text-signal-fault"
            : state.status === "error"
              ? "border-signal-warn/30 bg-signal-warn-soft text-signal-warn"
              : "border-paper-200 text-ink-600 bg-white",
        )}
      >
        {state.status === "loading" ? (
          <span
            className="border-board-300 inline-block size-3 animate-spin rounded-full border-2 border-t-transparent"
            aria-hidden
          />
        ) : null}
        <span>{statusText(state, errors, current)}</span>
      </div>

      {errors.length > 0 ? (
        <ol className="flex flex-col gap-1 text-sm" aria-label="Netlist errors">
          {errors.map((e, i) => (
            <li key={`${e.line}-${e.column}-${i}`}>
              <button
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
              </button>
            </li>
          ))}
        </ol>
      ) : null}

      <div
        className={cn(
          "rounded-panel border-paper-200 shadow-panel min-h-72 border bg-white p-2",
          stale && "opacity-60",
        )}
      >
        {plot ?? (
          <div className="text-ink-400 flex h-72 items-center justify-center px-6 text-center text-sm">
            {state.status === "loading" ? "Solving…" : "The plot appears here once the netlist solves."}
          </div>
        )}
        {plot && stale ? (
          <p className="text-caption text-ink-500 px-2 pb-1">Showing the last preview that solved.</p>
        ) : null}
      </div>

      {lastGood ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <div>
            <h3 className="text-ink-800 mb-1 text-sm font-semibold">Measures</h3>
            <MeasuresTable measures={lastGood.measures} onSelectFrequency={onSelectFrequency} />
          </div>
          <div>
            <h3 className="text-ink-800 mb-1 text-sm font-semibold">Checks</h3>
            <CheckBadges checks={lastGood.checks} />
          </div>
        </div>
      ) : null}
      {lastGood ? <AnalysesPanel result={lastGood} /> : null}
      <WarningsList
        warnings={(current ?? lastGood)?.warnings ?? []}
        onLineClick={(line) => onGoToLine(line)}
      />
      <Caution />
    </>
  );
}

function statusText(state: LiveSolveState, errors: NetlistError[], current: SolveResult | null): string {
  if (errors.length > 0)
    return `The netlist has ${errors.length} ${errors.length === 1 ? "error" : "errors"}.`;
  if (state.status === "error") return state.message;
  if (state.status === "loading") return "Solving…";
  if (state.status === "idle") return "Type a netlist to see its response.";
  if (current?.ok) {
    const s = current.stats;
    return `Solved ${s.points.toLocaleString("en")} points, ${s.nodes} nodes, in ${s.solveMs.toFixed(1)} ms.`;
  }
  return "";
}
