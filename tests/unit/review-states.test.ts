// Review words and steps declared once (lib/review-states.ts): the state machine and the sentence a
// viewer reads when the panel offers no step.
import { describe, expect, it } from "vitest";
import { nextReviewState, REVIEW_STATES, reviewWaitSentence } from "@/lib/review-states";

describe("review states", () => {
  it("walk draft → awaiting sign-off → sent back → awaiting sign-off → signed off", () => {
    expect(nextReviewState("draft", "submit")).toBe("awaiting_signoff");
    expect(nextReviewState("awaiting_signoff", "send_back")).toBe("sent_back");
    expect(nextReviewState("sent_back", "submit")).toBe("awaiting_signoff");
    expect(nextReviewState("awaiting_signoff", "sign_off")).toBe("signed_off");
    expect(nextReviewState("draft", "sign_off")).toBeNull();
    expect(nextReviewState("signed_off", "submit")).toBeNull();
  });

  it("a reviewer on a draft reads that the author has not asked yet — not a sentence about roles", () => {
    expect(reviewWaitSentence({ reviewState: "draft", isAuthor: false, canReview: true })).toBe(
      "A draft: the author has not asked for sign-off yet.",
    );
    expect(reviewWaitSentence({ reviewState: "sent_back", isAuthor: false, canReview: true })).toBe(
      "Sent back: waiting for the author's revision.",
    );
    for (const state of REVIEW_STATES) {
      for (const isAuthor of [true, false]) {
        const text = reviewWaitSentence({ reviewState: state, isAuthor, canReview: false });
        expect(text).not.toMatch(/can read this run/);
        expect(text.length).toBeGreaterThan(10);
      }
    }
  });
});
