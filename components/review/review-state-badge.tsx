import { isReviewState, REVIEW_STATE_LABELS, type ReviewState } from "@/lib/review-states";
import { cn } from "@/lib/utils";

/**
 * A tag like the revision block of a drawing: square corners, a thick left rule in the state's
 * colour, a small mark, and the state in small capitals. The words carry the meaning; the colour
 * and the mark repeat it.
 */
const STYLES: Record<ReviewState, string> = {
  draft: "border-ink-300 bg-paper-50 text-ink-600",
  awaiting_signoff: "border-copper-500 bg-copper-50 text-copper-700",
  signed_off: "border-board-600 bg-board-50 text-board-800",
  sent_back: "border-signal-warn bg-signal-warn-soft text-signal-warn",
};

/** A 10 px mark per state, drawn in currentColor. */
function StateMark({ state }: { state: ReviewState }) {
  const common = { width: 10, height: 10, viewBox: "0 0 10 10", "aria-hidden": true } as const;
  switch (state) {
    case "draft":
      return (
        <svg {...common}>
          <rect x="1" y="1" width="8" height="8" fill="none" stroke="currentColor" strokeDasharray="2 1.5" />
        </svg>
      );
    case "awaiting_signoff":
      return (
        <svg {...common}>
          <path d="M2 1h6L5 5l3 4H2l3-4z" fill="none" stroke="currentColor" strokeLinejoin="round" />
        </svg>
      );
    case "signed_off":
      return (
        <svg {...common}>
          <path d="M1 9l2.5-1L9 2.5 7.5 1 2 6.5z" fill="currentColor" />
        </svg>
      );
    case "sent_back":
      return (
        <svg {...common}>
          <path d="M4 1L1 4l3 3M1 4h5a3 3 0 010 6H4" fill="none" stroke="currentColor" strokeWidth="1.4" />
        </svg>
      );
  }
}

/** The run's review state as a revision-block tag. */
export function ReviewStateBadge({ state, className }: { state: string; className?: string }) {
  const s: ReviewState = isReviewState(state) ? state : "draft";
  return (
    <span
      data-review-state={s}
      className={cn(
        "text-caption inline-flex items-center gap-1.5 rounded-[2px] border-l-[3px] py-0.5 pr-2 pl-1.5 font-semibold tracking-wider whitespace-nowrap uppercase",
        STYLES[s],
        className,
      )}
    >
      <StateMark state={s} />
      {REVIEW_STATE_LABELS[s]}
    </span>
  );
}
