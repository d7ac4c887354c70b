"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { useHydrated } from "@/components/ui/use-hydrated";
import { apiErrorMessage } from "@/lib/api-error";
import type { MeasurementSummary } from "@/lib/measurements";
import { formatQuantity } from "@/solver/format";

/** What the chooser shows of each data set (the server's summary, lib/measurements.ts). */
export type OverlayOption = Pick<MeasurementSummary, "id" | "name" | "points" | "fromHz" | "toHz">;

async function saveOverlays(runId: string, measurementIds: string[]): Promise<string[]> {
  const res = await fetch(`/api/runs/${runId}/overlays`, {
    method: "PUT",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ measurementIds }),
  });
  if (!res.ok)
    throw new Error(await apiErrorMessage(res, `Not saved (HTTP ${res.status}).`, "measurementIds"));
  const body = (await res.json()) as { measurementIds: string[] };
  return body.measurementIds;
}

/**
 * Which of the project's bench data sets this run draws on its plot: none until chosen. Designers and
 * owners change the choice (saved with the run for everyone); others read which ones are shown.
 */
export function OverlayChooser({
  runId,
  options,
  selected,
  canChoose,
}: {
  runId: string;
  options: OverlayOption[];
  selected: string[];
  canChoose: boolean;
}) {
  const router = useRouter();
  const hydrated = useHydrated();
  const id = useId();
  const [choice, setChoice] = useState<string[]>(selected);
  const save = useMutation({
    mutationFn: (ids: string[]) => saveOverlays(runId, ids),
    onSuccess: () => router.refresh(),
  });
  if (options.length === 0) {
    return (
      <p className="text-ink-600 text-sm">
        No bench data in this project yet: upload a CSV on the project page.
      </p>
    );
  }
  const dirty = choice.length !== selected.length || choice.some((c) => !selected.includes(c));
  return (
    <form
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate(choice);
      }}
      className="space-y-2"
    >
      <fieldset disabled={!canChoose || !hydrated}>
        <legend className="sr-only">Bench data drawn on this run's plot</legend>
        <ul className="space-y-1">
          {options.map((o) => (
            <li key={o.id}>
              <label htmlFor={`${id}-${o.id}`} className="text-ink-800 flex items-baseline gap-2 text-sm">
                <input
                  id={`${id}-${o.id}`}
                  type="checkbox"
                  checked={choice.includes(o.id)}
                  onChange={(e) =>
                    setChoice((c) => (e.target.checked ? [...c, o.id] : c.filter((x) => x !== o.id)))
                  }
                />
                <span className="min-w-0 font-medium break-words">{o.name}</span>
                <span className="text-ink-600 text-caption whitespace-nowrap">
                  {o.points} points
                  {o.fromHz !== null && o.toHz !== null
                    ? `, ${formatQuantity(o.fromHz, "Hz", 3)} – ${formatQuantity(o.toHz, "Hz", 3)}`
                    : ""}
                </span>
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      {canChoose ? (
        <div className="flex flex-wrap items-center gap-2">
          <Button
            type="submit"
            size="sm"
            variant="secondary"
            disabled={!hydrated || !dirty || save.isPending}
          >
            {save.isPending ? "Saving…" : "Show the chosen data"}
          </Button>
          <span role="status" aria-live="polite" className="text-caption">
            {save.isError ? <span className="text-signal-fault">{save.error.message}</span> : null}
          </span>
        </div>
      ) : null}
    </form>
  );
}
