"use client";

import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Notice } from "@/components/ui/notice";
import {
  stackBody,
  stackCell,
  stackHead,
  stackRow,
  stackTable,
  stackTitle,
} from "@/components/ui/stacked-table";
import { QUANTITY_LABEL } from "@/lib/reading-kinds";
import { percentileWords } from "@/lib/reading-math";
import type { ReadingView } from "@/lib/readings";
import { cn, formatDate } from "@/lib/utils";
import { formatPercent, formatQuantity } from "@/solver/format";
import { useDeleteReading, useReadings } from "./readings-query";

const sizeText = (bytes: number) =>
  bytes >= 1024 * 1024
    ? `${(bytes / (1024 * 1024)).toFixed(1)} MB`
    : `${Math.max(1, Math.round(bytes / 1024))} kB`;

/** The spread verdict of one reading, or why there is none. */
function SpreadCell({ r }: { r: ReadingView }) {
  const c = r.comparison;
  if (c.spread) {
    return (
      <span className={c.spread.inside ? "text-signal-ok" : "text-signal-fault"}>
        <span className="font-medium">{c.spread.inside ? "Inside" : "Outside"}</span> p1…p99 ·{" "}
        {percentileWords(c.spread.percentile)}
        <span className="text-ink-600 block text-xs">{c.spread.verdict}</span>
      </span>
    );
  }
  if (c.predicted !== null) return <span className="text-ink-500">no Monte Carlo of this measure</span>;
  return <span className="text-ink-500">{c.reason}</span>;
}

/**
 * The run's readings beside the prediction (through the query cache, seeded by the page); designers
 * and owners may delete them. Below `sm` each reading is a card: the table's cells stack under their
 * column names, so a phone never scrolls sideways.
 */
export function ReadingsList({
  runId,
  readings: initial,
  canDelete,
}: {
  runId: string;
  readings: ReadingView[];
  canDelete: boolean;
}) {
  const { data: readings } = useReadings(runId, initial);
  const del = useDeleteReading(runId);
  const busy = del.isPending ? del.variables : null;
  const error = del.error?.message ?? null;

  function remove(r: ReadingView) {
    if (!window.confirm(`Delete the reading “${r.steps}”${r.attachment ? " and its attached file" : ""}?`))
      return;
    del.mutate(r.id);
  }

  if (readings.length === 0) {
    return (
      <EmptyState title="No bench readings yet">
        {canDelete
          ? "Record a frequency, an oscilloscope period or an amplitude below to set it beside the prediction."
          : "Designers and owners record what the bench showed here."}
      </EmptyState>
    );
  }
  return (
    <div className="space-y-3">
      <div className="sm:overflow-x-auto">
        <table className={cn("w-full text-left text-sm sm:min-w-[44rem]", stackTable)}>
          <caption className="sr-only">Bench readings beside the run's prediction</caption>
          <thead
            className={cn(
              "text-ink-600 border-paper-200 border-b text-xs tracking-wide uppercase",
              stackHead,
            )}
          >
            <tr>
              <th scope="col" className="py-2 pr-3 font-medium">
                Reading
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Predicted
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Measured
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Deviation
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Spread
              </th>
              <th scope="col" className="py-2 font-medium">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody className={cn("divide-paper-200 divide-y max-sm:divide-y-0", stackBody)}>
            {readings.map((r) => {
              const c = r.comparison;
              return (
                <tr key={r.id} className={cn("align-top", stackRow)}>
                  <td className={cn("py-2 pr-3", stackTitle)}>
                    <span className="text-ink-900 font-medium">{QUANTITY_LABEL[r.quantity]}</span>
                    {r.measureName ? <span className="text-ink-600"> vs {r.measureName}</span> : null}
                    {r.node ? <span className="text-ink-600"> at {r.node}</span> : null}
                    <span className="text-ink-800 block font-mono text-xs">{r.steps}</span>
                    {r.note ? <span className="text-ink-600 block">{r.note}</span> : null}
                    <span className="text-ink-500 block text-xs">
                      {r.authorName}, <time dateTime={r.createdAt}>{formatDate(r.createdAt)}</time>
                    </span>
                    {r.attachment ? (
                      <a
                        href={r.attachment.url}
                        className="text-board-700 text-xs underline"
                        target="_blank"
                        rel="noopener"
                      >
                        {r.attachment.name} ({r.attachment.type === "text/csv" ? "CSV" : "image"},{" "}
                        {sizeText(r.attachment.size)})
                      </a>
                    ) : null}
                  </td>
                  <td data-label="Predicted" className={cn("py-2 pr-3 tabular-nums", stackCell)}>
                    {c.unit ? formatQuantity(c.predicted, c.unit, 4) : "—"}
                  </td>
                  <td data-label="Measured" className={cn("py-2 pr-3 tabular-nums", stackCell)}>
                    {c.unit ? formatQuantity(c.measured, c.unit, 4) : "—"}
                  </td>
                  <td data-label="Deviation" className={cn("py-2 pr-3 tabular-nums", stackCell)}>
                    {formatPercent(c.deviationPct, 3)}
                  </td>
                  <td data-label="Spread" className={cn("py-2 pr-3", stackCell)}>
                    <SpreadCell r={r} />
                  </td>
                  <td className="py-2 text-right max-sm:block max-sm:pb-0 max-sm:text-left">
                    {canDelete ? (
                      <Button
                        variant="ghost"
                        size="sm"
                        onClick={() => void remove(r)}
                        disabled={busy === r.id}
                        aria-label={`Delete reading ${r.steps}`}
                      >
                        {busy === r.id ? "Deleting…" : "Delete"}
                      </Button>
                    ) : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div aria-live="polite">{error ? <Notice tone="fault">{error}</Notice> : null}</div>
    </div>
  );
}
