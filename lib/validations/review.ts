import { z } from "zod";
import { NOTE_REQUIRED_ACTIONS, REVIEW_ACTIONS, type ReviewAction } from "@/lib/review-states";

export { REVIEW_ACTIONS };

const needsNote = (action: ReviewAction) =>
  (NOTE_REQUIRED_ACTIONS as readonly ReviewAction[]).includes(action);

/**
 * `POST /api/runs/:id/review`. `supersede` is posted on the older run and names the later run of
 * the same project that replaces it (`supersededBy`); `send_back` needs a note saying why.
 */
export const reviewActionSchema = z
  .object({
    action: z.enum(REVIEW_ACTIONS, `Choose one of ${REVIEW_ACTIONS.join(", ")}.`),
    note: z.string().trim().max(2000, "Keep the note under 2000 characters.").optional(),
    supersededBy: z.uuid("Not a run id.").optional(),
  })
  .refine((v) => v.action !== "supersede" || v.supersededBy !== undefined, {
    message: "Name the later run that supersedes this one.",
    path: ["supersededBy"],
  })
  .refine((v) => !needsNote(v.action) || (v.note !== undefined && v.note.length > 0), {
    message: "Say what needs another look before sending the run back.",
    path: ["note"],
  });
export type ReviewActionBody = z.infer<typeof reviewActionSchema>;
