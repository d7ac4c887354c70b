"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { apiErrorMessage } from "@/lib/api-error";
import {
  nextReviewState,
  REVIEW_ACTION_LABELS,
  type ReviewState,
  type ReviewStep,
  reviewWaitSentence,
} from "@/lib/review-states";

export type ReviewActionsProps = {
  runId: string;
  reviewState: ReviewState;
  isAuthor: boolean;
  canRequest: boolean;
  canReview: boolean;
};

/** The review steps the caller may take on this run now; the server checks them again. */
export function ReviewActions({ runId, reviewState, isAuthor, canRequest, canReview }: ReviewActionsProps) {
  const router = useRouter();
  const noteId = useId();
  const [note, setNote] = useState("");
  // One review step as a query-cache mutation; the page (state badge, history) is refreshed after it.
  const step = useMutation({
    mutationFn: async (action: ReviewStep) => {
      const res = await fetch(`/api/runs/${runId}/review`, {
        method: "POST",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify(note.trim() ? { action, note: note.trim() } : { action }),
      }).catch(() => null);
      if (!res) throw new Error("The request did not reach the server. Try again.");
      if (!res.ok) throw new Error(await apiErrorMessage(res, `The step failed (${res.status}).`, "note"));
    },
    onSuccess: () => {
      setNote("");
      router.refresh();
    },
  });
  const busy = step.isPending ? step.variables : null;
  const error = step.error?.message ?? null;
  const mayRequest = canRequest && nextReviewState(reviewState, "submit") !== null;
  const mayDecide = canReview && nextReviewState(reviewState, "sign_off") !== null && !isAuthor;
  const send = (action: ReviewStep) => step.mutate(action);

  if (!mayRequest && !mayDecide) {
    const why = reviewWaitSentence({ reviewState, isAuthor, canReview });
    return <p className="text-ink-600 text-sm">{why}</p>;
  }

  return (
    <div className="space-y-3">
      <div>
        <label htmlFor={noteId} className="text-ink-700 mb-1 block text-sm font-medium">
          Note {mayDecide ? "(required to send back)" : "(optional)"}
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
          <Button onClick={() => send("submit")} disabled={busy !== null}>
            {busy === "submit" ? "Asking…" : REVIEW_ACTION_LABELS.submit}
          </Button>
        ) : null}
        {mayDecide ? (
          <>
            <Button onClick={() => send("sign_off")} disabled={busy !== null}>
              {busy === "sign_off" ? "Signing off…" : REVIEW_ACTION_LABELS.sign_off}
            </Button>
            <Button variant="secondary" onClick={() => send("send_back")} disabled={busy !== null}>
              {busy === "send_back" ? "Sending back…" : REVIEW_ACTION_LABELS.send_back}
            </Button>
          </>
        ) : null}
      </div>
      <div aria-live="polite">{error ? <Notice tone="fault">{error}</Notice> : null}</div>
    </div>
  );
}
