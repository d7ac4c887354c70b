"use client";

import { PlainButton } from "@/components/ui/button";
import { cn } from "@/lib/utils";

/** What a click on the plot does. */
export type ClickMode = "A" | "B" | "pin";

export interface PlotToolbarProps {
  mode: ClickMode;
  onMode: (mode: ClickMode) => void;
  /** Offer "comment pin" as a click mode (only where the caller may comment). */
  canPin: boolean;
  ready: boolean;
  onReset: () => void;
  /** Omitted when the page has its own PNG button for this plot. */
  onPng?: () => void;
}

const chip =
  "text-caption inline-flex h-8 items-center gap-1 rounded-[3px] border px-2.5 font-medium disabled:text-ink-500 disabled:border-ink-400";

/** Our controls beside the plot: what a click places, reset view, PNG. Every control is a labelled button. */
export function PlotToolbar({ mode, onMode, canPin, ready, onReset, onPng }: PlotToolbarProps) {
  const modes: { id: ClickMode; label: string }[] = [
    { id: "A", label: "cursor A" },
    { id: "B", label: "cursor B" },
    ...(canPin ? [{ id: "pin" as const, label: "comment pin" }] : []),
  ];
  return (
    <div className="flex flex-wrap items-center justify-between gap-2 px-1 pb-1">
      <fieldset className="flex flex-wrap items-center gap-1">
        <legend className="text-caption text-ink-500 float-left mr-1">Click places</legend>
        {modes.map((m) => (
          <PlainButton
            key={m.id}
            type="button"
            aria-pressed={mode === m.id}
            onClick={() => onMode(m.id)}
            className={cn(
              chip,
              mode === m.id
                ? "border-ink-800 bg-ink-800 text-paper-50"
                : "border-paper-300 text-ink-700 hover:bg-paper-100 bg-white",
            )}
          >
            {m.label}
          </PlainButton>
        ))}
      </fieldset>
      <div className="flex items-center gap-1">
        <PlainButton
          type="button"
          disabled={!ready}
          onClick={onReset}
          className={cn(chip, "border-paper-300 text-ink-700 hover:bg-paper-100 bg-white")}
        >
          Reset view
        </PlainButton>
        {onPng ? (
          <PlainButton
            type="button"
            disabled={!ready}
            onClick={onPng}
            className={cn(chip, "border-paper-300 text-ink-700 hover:bg-paper-100 bg-white")}
          >
            PNG
          </PlainButton>
        ) : null}
      </div>
    </div>
  );
}
