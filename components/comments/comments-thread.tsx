"use client";

import { useState } from "react";
import { formatHz } from "@/components/plot/hover-format";
import { Button, PlainButton } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import type { CommentView } from "@/lib/comments";
import { THREAD_STATE_LABELS, type ThreadState } from "@/lib/review-states";
import { cn, formatDate } from "@/lib/utils";
import { CommentForm, type PinDraft } from "./comment-form";
import { useThreadState } from "./comments-query";
import { PinIcon } from "./pin-icon";

export type CommentsThreadProps = {
  runId: string;
  comments: CommentView[];
  canComment: boolean;
  pin: PinDraft | null;
  onClearPin: () => void;
  /** Sets the pin from the keyboard (a typed frequency and a trace). */
  onPin: (pin: PinDraft) => void;
  traces: string[];
  /** A pin in the list was chosen: the plot zooms to it. */
  onFocusPin: (hz: number) => void;
};

/** Comment threads (a first comment and its replies), with pins, replies, settle and open again. */
export function CommentsThread(props: CommentsThreadProps) {
  const { runId, comments, canComment, pin, onClearPin, onPin, traces, onFocusPin } = props;
  const roots = comments.filter((c) => !c.parentId);
  const replies = (id: string) => comments.filter((c) => c.parentId === id);
  return (
    <div className="space-y-5">
      {roots.length === 0 ? (
        <EmptyState title="No comments yet">
          {canComment ? "Start the discussion below." : "Team members who may comment start it."}
        </EmptyState>
      ) : (
        <ul className="space-y-4">
          {roots.map((c) => (
            <li key={c.id}>
              <Thread
                root={c}
                replies={replies(c.id)}
                runId={runId}
                canComment={canComment}
                onFocusPin={onFocusPin}
              />
            </li>
          ))}
        </ul>
      )}
      {canComment ? (
        <div className="border-paper-200 border-t pt-4">
          <CommentForm runId={runId} pin={pin} onClearPin={onClearPin} onPin={onPin} traces={traces} />
        </div>
      ) : null}
    </div>
  );
}

function Thread(props: {
  root: CommentView;
  replies: CommentView[];
  runId: string;
  canComment: boolean;
  onFocusPin: (hz: number) => void;
}) {
  const { root, replies, runId, canComment, onFocusPin } = props;
  const [replying, setReplying] = useState(false);
  const change = useThreadState(runId, root.id);
  const error = change.error?.message ?? null;
  const settled = root.state === "settled";

  const setState = (state: ThreadState) => change.mutate(state);

  return (
    <article
      className={cn(
        "rounded-md border p-3",
        settled ? "border-paper-200 bg-paper-50" : "border-paper-300 bg-white",
      )}
      aria-label={`Comment by ${root.authorName}`}
    >
      <CommentBody c={root} onFocusPin={onFocusPin} />
      {replies.length > 0 ? (
        <ul className="border-paper-200 mt-3 space-y-3 border-l-2 pl-3">
          {replies.map((r) => (
            <li key={r.id}>
              <CommentBody c={r} onFocusPin={onFocusPin} />
            </li>
          ))}
        </ul>
      ) : null}
      <div className="mt-3 flex flex-wrap items-center gap-2">
        <span
          className={cn(
            "text-caption rounded-[2px] border-l-[3px] px-1.5 font-semibold tracking-wider uppercase",
            settled
              ? "border-board-600 bg-board-50 text-board-800"
              : "border-copper-500 bg-copper-50 text-copper-700",
          )}
        >
          {THREAD_STATE_LABELS[root.state]}
        </span>
        {settled ? (
          <span className="text-caption text-ink-500">
            by {root.settledByName} · {formatDate(root.settledAt)}
          </span>
        ) : null}
        {canComment ? (
          <>
            {!settled ? (
              <Button
                size="sm"
                variant="ghost"
                onClick={() => setReplying((v) => !v)}
                aria-expanded={replying}
              >
                Reply
              </Button>
            ) : null}
            <Button size="sm" variant="ghost" onClick={() => setState(settled ? "open" : "settled")}>
              {settled ? "Open again" : "Settle"}
            </Button>
          </>
        ) : null}
      </div>
      <div aria-live="polite" className="text-signal-fault text-sm">
        {error}
      </div>
      {replying ? (
        <div className="mt-2">
          <CommentForm
            runId={runId}
            parentId={root.id}
            compact
            label={`Reply to ${root.authorName}`}
            onPosted={() => setReplying(false)}
          />
        </div>
      ) : null}
    </article>
  );
}

function CommentBody({ c, onFocusPin }: { c: CommentView; onFocusPin: (hz: number) => void }) {
  return (
    <div>
      <p className="text-sm">
        <span className="text-ink-900 font-medium">{c.authorName}</span>
        <span className="text-ink-500"> · {formatDate(c.createdAt)}</span>
        {c.frequencyHz !== null ? (
          <PlainButton
            type="button"
            onClick={() => onFocusPin(c.frequencyHz as number)}
            className="bg-copper-50 text-caption text-copper-700 ring-copper-200 hover:bg-copper-100 ml-2 rounded-full px-2 py-0.5 font-mono ring-1 ring-inset"
            aria-label={`Show ${formatHz(c.frequencyHz)} on the plot`}
          >
            <PinIcon /> {formatHz(c.frequencyHz)}
            {c.trace ? ` · ${c.trace}` : ""}
          </PlainButton>
        ) : null}
      </p>
      <p className="text-ink-800 mt-1 text-sm whitespace-pre-wrap">{c.body}</p>
    </div>
  );
}
