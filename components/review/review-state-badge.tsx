import { cn } from "@/lib/utils";

export type ReviewState = "draft" | "in_review" | "approved" | "changes_requested";

const LABELS: Record<ReviewState, string> = {
  draft: "Draft",
  in_review: "In review",
  approved: "Approved",
  changes_requested: "Changes requested",
};

const STYLES: Record<ReviewState, string> = {
  draft: "bg-paper-100 text-ink-600 ring-1 ring-paper-300 ring-inset",
  in_review: "bg-copper-50 text-copper-700 ring-1 ring-copper-200 ring-inset",
  approved: "bg-signal-ok-soft text-signal-ok ring-1 ring-signal-ok/30 ring-inset",
  changes_requested: "bg-signal-warn-soft text-signal-warn ring-1 ring-signal-warn/30 ring-inset",
};

export function reviewStateLabel(state: string): string {
  return LABELS[state as ReviewState] ?? state;
}

/** The run's review state as a small pill; the text itself carries the meaning (not only the colour). */
export function ReviewStateBadge({ state, className }: { state: string; className?: string }) {
  const s = (state in LABELS ? state : "draft") as ReviewState;
  return (
    <span
      className={cn(
        "text-caption inline-flex items-center rounded-full px-2 py-0.5 font-medium whitespace-nowrap",
        STYLES[s],
        className,
      )}
    >
      {LABELS[s]}
    </span>
  );
}
