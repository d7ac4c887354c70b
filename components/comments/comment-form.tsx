"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import type { CommentView } from "@/lib/comments";
import { PinIcon } from "./pin-icon";
import { PinPicker } from "./pin-picker";

export type PinDraft = { frequencyHz: number; trace: string | null };

/** Writes a comment or a reply; a pin (picked on the plot) rides along and can be removed. */
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
  onPosted: (c: CommentView) => void;
  label?: string;
  compact?: boolean;
}) {
  const id = useId();
  const [body, setBody] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function submit() {
    setBusy(true);
    setError(null);
    try {
      const res = await fetch(`/api/runs/${runId}/comments`, {
        method: "POST",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify({
          body,
          ...(parentId ? { parentId } : {}),
          ...(pin ? { frequencyHz: pin.frequencyHz, trace: pin.trace } : {}),
        }),
      });
      const data = await res.json().catch(() => null);
      if (!res.ok) {
        const fields = data?.error?.details?.fields as Record<string, string[]> | undefined;
        const first = fields ? Object.values(fields)[0]?.[0] : undefined;
        setError(first ?? data?.error?.message ?? `Not saved (${res.status}).`);
        return;
      }
      setBody("");
      onClearPin?.();
      onPosted(data.comment as CommentView);
    } catch {
      setError("The comment did not reach the server; your text is still here. Try again.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form
      className="space-y-2"
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
    >
      <label htmlFor={id} className={compact ? "sr-only" : "text-ink-700 block text-sm font-medium"}>
        {label}
      </label>
      {pin ? (
        <p className="flex flex-wrap items-center gap-2 text-sm">
          <span className="bg-copper-50 text-copper-700 ring-copper-200 rounded-full px-2 py-0.5 font-mono ring-1 ring-inset">
            <PinIcon /> {formatPin(pin.frequencyHz)}
            {pin.trace ? ` · ${pin.trace}` : ""}
          </span>
          <button type="button" className="text-ink-500 hover:text-ink-800 underline" onClick={onClearPin}>
            Remove pin
          </button>
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

export function formatPin(hz: number): string {
  if (hz >= 1e6) return `${Number((hz / 1e6).toPrecision(4))} MHz`;
  if (hz >= 1e3) return `${Number((hz / 1e3).toPrecision(4))} kHz`;
  return `${Number(hz.toPrecision(4))} Hz`;
}
