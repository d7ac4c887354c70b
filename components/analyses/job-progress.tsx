"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";

interface JobState {
  state: string;
  progress: number;
  error?: string | null;
  cancelRequested?: boolean;
}

const ACTIVE = new Set(["queued", "running"]);
const POLL_MS = 1000;

/**
 * Progress of a queued or running solve: polls GET /api/runs/:id/job every second, offers Cancel
 * (DELETE), and refreshes the page when the job ends so the result appears.
 */
async function readJob(runId: string, signal: AbortSignal): Promise<JobState> {
  const res = await fetch(`/api/runs/${runId}/job`, { cache: "no-store", signal });
  if (!res.ok) throw new Error(`the progress could not be read (HTTP ${res.status})`);
  return (await res.json()) as JobState;
}

async function cancelJob(runId: string): Promise<JobState> {
  const res = await fetch(`/api/runs/${runId}/job`, { method: "DELETE" });
  const body = (await res.json().catch(() => null)) as (JobState & { error?: { message?: string } }) | null;
  if (!res.ok || !body) throw new Error(body?.error?.message ?? `cancel failed (HTTP ${res.status})`);
  return { ...body, error: null };
}

/**
 * Progress of a queued or running solve through the query cache: polls GET /api/runs/:id/job every
 * second while the job is active (`refetchInterval` stops at a final state), offers Cancel (a mutation
 * that writes its answer into the cache), and refreshes the page when the job ends so the result appears.
 */
export function JobProgress({
  runId,
  initialState,
  canCancel = true,
  onFinished,
}: {
  runId: string;
  initialState: string;
  canCancel?: boolean;
  onFinished?: (state: string) => void;
}) {
  const router = useRouter();
  const client = useQueryClient();
  const key = ["run-job", runId] as const;
  const query = useQuery({
    queryKey: key,
    queryFn: ({ signal }) => readJob(runId, signal),
    initialData: { state: initialState, progress: 0 },
    initialDataUpdatedAt: 0,
    enabled: ACTIVE.has(initialState),
    refetchInterval: (q) =>
      q.state.data && !ACTIVE.has(q.state.data.state) ? false : q.state.error ? POLL_MS * 3 : POLL_MS,
    retry: false,
  });
  const cancel = useMutation({
    mutationFn: () => cancelJob(runId),
    onSuccess: (next) => client.setQueryData(key, next),
  });
  const job = query.data;
  const finished = useRef(!ACTIVE.has(initialState));
  useEffect(() => {
    if (ACTIVE.has(job.state) || finished.current) return;
    finished.current = true;
    onFinished?.(job.state);
    router.refresh();
  }, [job.state, onFinished, router]);
  const problem = cancel.error?.message ?? (query.isError ? query.error.message : null);
  const cancelling = cancel.isPending;

  const pct = Math.round(Math.max(0, Math.min(1, job.progress)) * 100);
  const active = ACTIVE.has(job.state);
  const label =
    job.state === "queued"
      ? "Waiting for a solver worker…"
      : job.state === "running"
        ? job.cancelRequested
          ? "Stopping…"
          : `Solving… ${pct} %`
        : job.state === "ok"
          ? "Solved"
          : job.state === "cancelled"
            ? "Cancelled"
            : "The solve failed";
  return (
    <section aria-label="Solve progress" className="border-paper-200 bg-paper-50 rounded-panel border p-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-ink-800 text-sm font-medium" aria-live="polite">
          {label}
        </p>
        {active && canCancel ? (
          <Button
            variant="danger"
            size="sm"
            onClick={() => cancel.mutate()}
            disabled={cancelling || job.cancelRequested}
          >
            {cancelling ? "Cancelling…" : "Cancel"}
          </Button>
        ) : null}
      </div>
      <div
        className="bg-paper-200 mt-3 h-2.5 w-full overflow-hidden rounded-full"
        role="progressbar"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct}
        aria-label="Solve progress"
      >
        <div
          className={`h-full rounded-full transition-[width] duration-500 ${
            job.state === "failed"
              ? "bg-signal-fault"
              : job.state === "cancelled"
                ? "bg-ink-400"
                : "bg-board-500"
          } ${job.state === "queued" ? "animate-pulse" : ""}`}
          style={{ width: `${job.state === "queued" ? 4 : pct}%` }}
        />
      </div>
      {job.state === "failed" && job.error ? (
        <pre className="text-signal-fault mt-3 font-mono text-xs whitespace-pre-wrap">{job.error}</pre>
      ) : null}
      {problem ? <p className="text-signal-warn mt-2 text-sm">{problem}</p> : null}
    </section>
  );
}
