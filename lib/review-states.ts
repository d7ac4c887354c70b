/**
 * The review vocabulary, declared once (client-safe: no imports). The database enums, the zod
 * schemas, the transition rules and every label on screen and in e-mail derive from these lists.
 * The words are those of a hardware design review: a designer asks for sign-off, a reviewer signs
 * the run off or sends it back with a note.
 */

/** A run's review state: draft → awaiting sign-off → signed off / sent back (→ awaiting sign-off again). */
export const REVIEW_STATES = ["draft", "awaiting_signoff", "signed_off", "sent_back"] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];

/** The steps of the API (`POST /api/runs/:id/review`), in the order a run meets them. */
export const REVIEW_ACTIONS = ["submit", "sign_off", "send_back", "supersede"] as const;
export type ReviewAction = (typeof REVIEW_ACTIONS)[number];

/** The steps that move a run between states (supersede links runs and keeps the state). */
export type ReviewStep = Exclude<ReviewAction, "supersede">;

/** Where each step may start and where it leads; a step from another state is a 409. */
export const REVIEW_TRANSITIONS = {
  submit: { from: ["draft", "sent_back"], to: "awaiting_signoff" },
  sign_off: { from: ["awaiting_signoff"], to: "signed_off" },
  send_back: { from: ["awaiting_signoff"], to: "sent_back" },
} as const satisfies Record<ReviewStep, { from: readonly ReviewState[]; to: ReviewState }>;

/** Steps that give the verdict (reviewer/owner, never the run's author). */
export const VERDICT_ACTIONS = ["sign_off", "send_back"] as const satisfies readonly ReviewStep[];

/** Steps that need a note saying why. */
export const NOTE_REQUIRED_ACTIONS = ["send_back"] as const satisfies readonly ReviewAction[];

export const REVIEW_STATE_LABELS: Record<ReviewState, string> = {
  draft: "Draft",
  awaiting_signoff: "Awaiting sign-off",
  signed_off: "Signed off",
  sent_back: "Sent back",
};

/** Button words for each action. */
export const REVIEW_ACTION_LABELS: Record<ReviewAction, string> = {
  submit: "Ask for sign-off",
  sign_off: "Sign off",
  send_back: "Send back",
  supersede: "Mark superseded",
};

/** How a step reads in the run's history ("Dana signed off"). */
export const REVIEW_ACTION_PAST: Record<ReviewAction, string> = {
  submit: "asked for sign-off",
  sign_off: "signed off",
  send_back: "sent back",
  supersede: "marked superseded",
};

/** A comment thread is open until someone settles it; it can be opened again. */
export const THREAD_STATES = ["open", "settled"] as const;
export type ThreadState = (typeof THREAD_STATES)[number];

export const THREAD_STATE_LABELS: Record<ThreadState, string> = { open: "Open", settled: "Settled" };

export function isReviewState(value: string): value is ReviewState {
  return (REVIEW_STATES as readonly string[]).includes(value);
}

/** The state a step leads to, or null when the run's current state does not allow it. */
export function nextReviewState(from: ReviewState, step: ReviewStep): ReviewState | null {
  const rule = REVIEW_TRANSITIONS[step];
  return (rule.from as readonly ReviewState[]).includes(from) ? rule.to : null;
}

/**
 * Why the review panel offers no step to this viewer, in words ("the author has not asked for
 * sign-off yet" rather than a statement about roles).
 */
export function reviewWaitSentence(opts: {
  reviewState: ReviewState;
  isAuthor: boolean;
  canReview: boolean;
}): string {
  const { reviewState, isAuthor, canReview } = opts;
  switch (reviewState) {
    case "draft":
      return isAuthor
        ? "A draft. Your role cannot ask for sign-off; a designer or owner can."
        : "A draft: the author has not asked for sign-off yet.";
    case "awaiting_signoff":
      if (canReview && isAuthor) return "Another reviewer signs off or sends back your own run.";
      return canReview ? "Waiting for sign-off." : "Waiting for a reviewer to sign off or send it back.";
    case "sent_back":
      return isAuthor
        ? "Sent back. Revise it, then ask for sign-off again."
        : "Sent back: waiting for the author's revision.";
    case "signed_off":
      return "Signed off. A revision is saved as a new run.";
  }
}
