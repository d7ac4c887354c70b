"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";

export type ReviewActionsProps = {
  runId: string;
  reviewState: string;
  isAuthor: boolean;
  canRequest: boolean;
  canReview: boolean;
};

/** The review steps the caller may take on this run now; the server checks them again. */
export function ReviewActions({ runId, reviewState, isAuthor, canRequest, canReview }: ReviewActionsProps) {
  const router = useRouter();
  const noteId = useId();
  const [note, setNote] = useState("");
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const mayRequest = canRequest && (reviewState === "draft" || reviewState === "changes_requested");
  const mayDecide = canReview && reviewState === "in_review" && !isAuthor;

  async function send(action: "request" | "approve" | "request_changes") {
    setBusy(action);
    setError(null);
    try {
      const res = await fetch(`/api/runs/${runId}/review`, {
        method: "POST",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify(note.trim() ? { action, note: note.trim() } : { action }),
      });
      if (!res.ok) {
        const body = await res.json().catch(() => null);
        const fields = body?.error?.details?.fields as Record<string, string[]> | undefined;
        setError(fields?.note?.[0] ?? body?.error?.message ?? `The step failed (${res.status}).`);
        return;
      }
      setNote("");
      router.refresh();
    } catch {
      setError("The request did not reach the server. Try again.");
    } finally {
      setBusy(null);
    }
  }

  if (!mayRequest && !mayDecide) {
    const why =
      canReview && isAuthor && reviewState === "in_review"
        ? "Another reviewer gives the verdict on your own run."
        : reviewState === "in_review"
          ? "Waiting for a reviewer."
          : reviewState === "approved"
            ? "Approved. A revision is saved as a new run."
            : "Your role can read this run.";
    return <p className="text-ink-500 text-sm">{why}</p>;
  }

  return (
    <div className="space-y-3">
      <div>
        <label htmlFor={noteId} className="text-ink-700 mb-1 block text-sm font-medium">
          Note {mayDecide ? "(required to request changes)" : "(optional)"}
        </label>
        <textarea
          id={noteId}
          rows={2}
          className={inputClass}
          value={note}
          maxLength={2000}
          onChange={(e) => setNote(e.target.value)}
        />
      </div>
      <div className="flex flex-wrap gap-2">
        {mayRequest ? (
          <Button onClick={() => send("request")} disabled={busy !== null}>
            {busy === "request" ? "Requesting…" : "Request review"}
          </Button>
        ) : null}
        {mayDecide ? (
          <>
            <Button onClick={() => send("approve")} disabled={busy !== null}>
              {busy === "approve" ? "Approving…" : "Approve"}
            </Button>
            <Button variant="danger" onClick={() => send("request_changes")} disabled={busy !== null}>
              {busy === "request_changes" ? "Sending…" : "Request changes"}
            </Button>
          </>
        ) : null}
      </div>
      <div aria-live="polite">{error ? <Notice tone="fault">{error}</Notice> : null}</div>
    </div>
  );
}
