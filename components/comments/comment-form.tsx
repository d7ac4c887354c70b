"use client";

import { useId, useState } from "react";
import { formatHz } from "@/components/plot/hover-format";
import { Button, PlainButton } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import type { CommentView } from "@/lib/comments";
import { usePostComment } from "./comments-query";
import { PinIcon } from "./pin-icon";
import { PinPicker } from "./pin-picker";

export type PinDraft = { frequencyHz: number; trace: string | null };

/** Writes a comment or a reply (a query-cache mutation); a pin picked on the plot rides along. */
export function CommentForm({
  runId,
  parentId,
  pin,
  onClearPin,
  onPin,
  traces = [],
  onPosted,
  label = "Add a comment",
  compact = false,
}: {
  runId: string;
  parentId?: string;
  pin?: PinDraft | null;
  onClearPin?: () => void;
  /** Offers the typed pin (keyboard alternative to clicking the plot) when given. */
  onPin?: (pin: PinDraft) => void;
  traces?: string[];
  /** Called after the comment is saved (the cache already holds it). */
  onPosted?: (c: CommentView) => void;
  label?: string;
  compact?: boolean;
}) {
  const id = useId();
  const [body, setBody] = useState("");
  const post = usePostComment(runId);
  const busy = post.isPending;
  const error = post.error?.message ?? null;

  function submit() {
    post.mutate(
      {
        body,
        ...(parentId ? { parentId } : {}),
        ...(pin ? { frequencyHz: pin.frequencyHz, trace: pin.trace } : {}),
      },
      {
        onSuccess: (c) => {
          setBody("");
          onClearPin?.();
          onPosted?.(c);
        },
      },
    );
  }

  return (
    <form
      className="space-y-2"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
    >
      <label htmlFor={id} className={compact ? "sr-only" : "text-ink-700 block text-sm font-medium"}>
        {label}
      </label>
      {pin ? (
        <p className="flex flex-wrap items-center gap-2 text-sm">
          <span className="bg-copper-50 text-copper-700 ring-copper-200 rounded-full px-2 py-0.5 font-mono ring-1 ring-inset">
            <PinIcon /> {formatHz(pin.frequencyHz)}
            {pin.trace ? ` · ${pin.trace}` : ""}
          </span>
          <PlainButton
            type="button"
            className="text-ink-500 hover:text-ink-800 underline"
            onClick={onClearPin}
          >
            Remove pin
          </PlainButton>
        </p>
      ) : onPin ? (
        <PinPicker traces={traces} onPin={onPin} />
      ) : null}
      <textarea
        id={id}
        rows={compact ? 2 : 3}
        className={inputClass}
        value={body}
        maxLength={5000}
        required
        onChange={(e) => setBody(e.target.value)}
        placeholder={compact ? "Reply…" : "What do you see? Click the plot to pin a frequency."}
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-err`}
      />
      <div id={`${id}-err`} aria-live="polite" className="text-signal-fault text-sm">
        {error}
      </div>
      <Button type="submit" size="sm" disabled={busy || body.trim() === ""}>
        {busy ? "Posting…" : parentId ? "Reply" : "Post comment"}
      </Button>
    </form>
  );
}
