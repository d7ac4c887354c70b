"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiErrorMessage } from "@/lib/api-error";
import type { ReadingView } from "@/lib/readings";

/**
 * A run's bench readings in the query cache: the page's server-rendered list seeds it; recording and
 * deleting a reading write their answer into it (the table agrees at once) and the list is read again
 * from the server after each change.
 */
export const readingsKey = (runId: string) => ["readings", runId] as const;

async function readReadings(runId: string, signal: AbortSignal): Promise<ReadingView[]> {
  const res = await fetch(`/api/runs/${runId}/readings`, { cache: "no-store", signal });
  if (!res.ok) throw new Error(`the readings could not be read (HTTP ${res.status})`);
  return ((await res.json()) as { readings: ReadingView[] }).readings;
}

export function useReadings(runId: string, initial: ReadingView[]) {
  return useQuery({
    queryKey: readingsKey(runId),
    queryFn: ({ signal }) => readReadings(runId, signal),
    initialData: initial,
    staleTime: 30_000,
  });
}

/** A refused reading: the server's sentence and its messages per form field. */
export class ReadingRefused extends Error {
  constructor(
    message: string,
    readonly fields: Record<string, string[]>,
  ) {
    super(message);
  }
}

/** POST /api/runs/:id/readings with the form's multipart data; field errors come back per field. */
export function useRecordReading(runId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (data: FormData): Promise<ReadingView> => {
      const res = await fetch(`/api/runs/${runId}/readings`, { method: "POST", body: data }).catch(
        () => null,
      );
      if (!res) throw new ReadingRefused("The reading did not reach the server. Try again.", {});
      const body = (await res.json().catch(() => null)) as {
        reading?: ReadingView;
        error?: { message?: string; details?: { fields?: Record<string, string[]> } };
      } | null;
      if (!res.ok || !body?.reading) {
        throw new ReadingRefused(
          body?.error?.message ?? `Saving failed (${res.status}).`,
          body?.error?.details?.fields ?? {},
        );
      }
      return body.reading;
    },
    onSuccess: (reading) => {
      client.setQueryData<ReadingView[]>(readingsKey(runId), (list = []) => [
        ...list.filter((r) => r.id !== reading.id),
        reading,
      ]);
      void client.invalidateQueries({ queryKey: readingsKey(runId) });
    },
  });
}

/** DELETE one reading (and its attached file); the row leaves the cache at once. */
export function useDeleteReading(runId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (readingId: string): Promise<string> => {
      const res = await fetch(`/api/runs/${runId}/readings/${readingId}`, { method: "DELETE" }).catch(
        () => null,
      );
      if (!res) throw new Error("The request did not reach the server. Try again.");
      if (!res.ok) throw new Error(await apiErrorMessage(res, `Deleting failed (${res.status}).`));
      return readingId;
    },
    onSuccess: (readingId) => {
      client.setQueryData<ReadingView[]>(readingsKey(runId), (list = []) =>
        list.filter((r) => r.id !== readingId),
      );
      void client.invalidateQueries({ queryKey: readingsKey(runId) });
    },
  });
}
