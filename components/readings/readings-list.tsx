"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { QUANTITY_LABEL } from "@/lib/reading-kinds";
import { percentileWords } from "@/lib/reading-math";
import type { ReadingView } from "@/lib/readings";
import { formatDate } from "@/lib/utils";
import { formatPercent, formatQuantity } from "@/solver/format";

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

/** The run's readings beside the prediction; designers and owners may delete them. */
export function ReadingsList({
  runId,
  readings,
  canDelete,
}: {
  runId: string;
  readings: ReadingView[];
  canDelete: boolean;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function remove(r: ReadingView) {
    if (!window.confirm(`Delete the reading “${r.steps}”${r.attachment ? " and its attached file" : ""}?`))
      return;
    setBusy(r.id);
    setError(null);
    try {
      const res = await fetch(`/api/runs/${runId}/readings/${r.id}`, { method: "DELETE" });
      if (!res.ok) {
        const body = await res.json().catch(() => null);
        setError(body?.error?.message ?? `Deleting failed (${res.status}).`);
        return;
      }
      router.refresh();
    } catch {
      setError("The request did not reach the server. Try again.");
    } finally {
      setBusy(null);
    }
  }

  return (
    <div className="space-y-3">
      <div className="overflow-x-auto">
        <table className="w-full min-w-[44rem] text-left text-sm">
          <caption className="sr-only">Bench readings beside the run's prediction</caption>
          <thead className="text-ink-600 border-paper-200 border-b text-xs tracking-wide uppercase">
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
          <tbody className="divide-paper-200 divide-y">
            {readings.map((r) => {
              const c = r.comparison;
              return (
                <tr key={r.id} className="align-top">
                  <td className="py-2 pr-3">
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
                  <td className="py-2 pr-3 tabular-nums">
                    {c.unit ? formatQuantity(c.predicted, c.unit, 4) : "—"}
                  </td>
                  <td className="py-2 pr-3 tabular-nums">
                    {c.unit ? formatQuantity(c.measured, c.unit, 4) : "—"}
                  </td>
                  <td className="py-2 pr-3 tabular-nums">{formatPercent(c.deviationPct, 3)}</td>
                  <td className="py-2 pr-3">
                    <SpreadCell r={r} />
                  </td>
                  <td className="py-2 text-right">
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
