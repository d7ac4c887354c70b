"use client";

import { useRouter } from "next/navigation";
import { useCallback, useEffect, useRef, useState } from "react";
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
  const [job, setJob] = useState<JobState>({ state: initialState, progress: 0 });
  const [problem, setProblem] = useState<string | null>(null);
  const [cancelling, setCancelling] = useState(false);
  const finished = useRef(false);

  const apply = useCallback(
    (next: JobState) => {
      setJob(next);
      if (!ACTIVE.has(next.state) && !finished.current) {
        finished.current = true;
        onFinished?.(next.state);
        router.refresh();
      }
    },
    [onFinished, router],
  );

  useEffect(() => {
    if (!ACTIVE.has(initialState)) return;
    let stop = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const poll = async () => {
      try {
        const res = await fetch(`/api/runs/${runId}/job`, { cache: "no-store" });
        if (!res.ok) throw new Error(`the progress could not be read (HTTP ${res.status})`);
        const body = (await res.json()) as JobState;
        if (stop) return;
        setProblem(null);
        apply(body);
        if (ACTIVE.has(body.state)) timer = setTimeout(poll, POLL_MS);
      } catch (error) {
        if (stop) return;
        setProblem(error instanceof Error ? error.message : String(error));
        timer = setTimeout(poll, POLL_MS * 3);
      }
    };
    void poll();
    return () => {
      stop = true;
      if (timer) clearTimeout(timer);
    };
  }, [runId, initialState, apply]);

  const cancel = async () => {
    setCancelling(true);
    try {
      const res = await fetch(`/api/runs/${runId}/job`, { method: "DELETE" });
      const body = (await res.json()) as unknown;
      if (!res.ok) {
        const err = (body as { error?: { message?: string } } | null)?.error;
        throw new Error(err?.message ?? `cancel failed (HTTP ${res.status})`);
      }
      apply({ ...(body as JobState), error: null });
    } catch (error) {
      setProblem(error instanceof Error ? error.message : String(error));
    } finally {
      setCancelling(false);
    }
  };

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
            onClick={() => void cancel()}
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
