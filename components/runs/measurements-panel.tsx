"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useRef } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { fileInputClass, inputClass } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { useHydrated } from "@/components/ui/use-hydrated";
import type { MeasurementSummary } from "@/lib/measurements";
import { formatDate } from "@/lib/utils";
import { formatQuantity } from "@/solver/format";

type UploadError = { message: string; lines: { line: number; message: string }[] };

class UploadFailure extends Error {
  constructor(readonly detail: UploadError) {
    super(detail.message);
  }
}

/** The project's bench measurements and, for designers and owners, a CSV upload form. */
export function MeasurementsPanel({
  projectId,
  measurements,
  canUpload,
}: {
  projectId: string;
  measurements: MeasurementSummary[];
  canUpload: boolean;
}) {
  const router = useRouter();
  const hydrated = useHydrated();
  const form = useRef<HTMLFormElement>(null);
  // The upload is a query-cache mutation; the page's list is server-rendered and refreshed after it.
  const send = useMutation({
    mutationFn: async (data: FormData): Promise<{ name: string; points: number }> => {
      const res = await fetch(`/api/projects/${projectId}/measurements`, {
        method: "POST",
        body: data,
      }).catch(() => null);
      if (!res)
        throw new UploadFailure({ message: "The upload did not reach the server. Try again.", lines: [] });
      const body = await res.json().catch(() => null);
      if (!res.ok) {
        throw new UploadFailure({
          message: body?.error?.message ?? `Upload failed (${res.status}).`,
          lines: body?.error?.details?.errors ?? [],
        });
      }
      return body.measurement;
    },
    onSuccess: () => {
      form.current?.reset();
      router.refresh();
    },
  });
  const busy = send.isPending;
  const error: UploadError | null = send.error instanceof UploadFailure ? send.error.detail : null;
  const done = send.data ? `Saved "${send.data.name}" with ${send.data.points} points.` : null;
  const upload = (data: FormData) => send.mutate(data);

  return (
    <div className="space-y-4">
      {measurements.length === 0 ? (
        <EmptyState title="No bench measurements yet">
          Upload a CSV of frequency (Hz), magnitude (dB) and phase (degrees) to overlay it on run plots.
        </EmptyState>
      ) : (
        <ul className="divide-paper-200 divide-y text-sm">
          {measurements.map((m) => (
            <li key={m.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
              <span className="text-ink-800 font-medium">{m.name}</span>
              <span className="text-ink-500">
                {m.points} points, {formatQuantity(m.fromHz, "Hz", 3)} – {formatQuantity(m.toHz, "Hz", 3)} ·{" "}
                {m.uploadedByName}, {formatDate(m.createdAt)}
              </span>
            </li>
          ))}
        </ul>
      )}
      {canUpload ? (
        <form
          ref={form}
          className="border-paper-200 flex flex-wrap items-end gap-3 border-t pt-4"
          onSubmit={(e) => {
            e.preventDefault();
            void upload(new FormData(e.currentTarget));
          }}
        >
          <div className="min-w-40 flex-1">
            <label htmlFor="m-name" className="text-ink-700 mb-1 block text-sm font-medium">
              Name
            </label>
            <input
              id="m-name"
              name="name"
              className={inputClass}
              placeholder="Bench sweep, board 3"
              maxLength={200}
            />
          </div>
          <div className="min-w-40 flex-1">
            <label htmlFor="m-file" className="text-ink-700 mb-1 block text-sm font-medium">
              CSV file
            </label>
            <input
              id="m-file"
              name="file"
              type="file"
              accept=".csv,text/csv,text/plain"
              required
              className={fileInputClass}
            />
          </div>
          <Button type="submit" variant="secondary" disabled={busy || !hydrated}>
            {busy ? "Uploading…" : "Upload"}
          </Button>
        </form>
      ) : null}
      <div aria-live="polite">
        {error ? (
          <Notice tone="fault" title={error.message}>
            {error.lines.length > 0 ? (
              <ul className="mt-1 list-disc pl-5">
                {error.lines.map((l) => (
                  <li key={`${l.line}-${l.message}`}>
                    Line {l.line}: {l.message}
                  </li>
                ))}
              </ul>
            ) : null}
          </Notice>
        ) : null}
        {done ? <Notice tone="ok">{done}</Notice> : null}
      </div>
    </div>
  );
}
