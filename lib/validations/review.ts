import { z } from "zod";

export const REVIEW_ACTIONS = ["request", "approve", "request_changes", "supersede"] as const;
export type ReviewActionInput = (typeof REVIEW_ACTIONS)[number];

/**
 * `POST /api/runs/:id/review`. `supersede` is posted on the older run and names the later run of
 * the same project that replaces it (`supersededBy`).
 */
export const reviewActionSchema = z
  .object({
    action: z.enum(REVIEW_ACTIONS, "Choose request, approve, request_changes or supersede."),
    note: z.string().trim().max(2000, "Keep the note under 2000 characters.").optional(),
    supersededBy: z.uuid("Not a run id.").optional(),
  })
  .refine((v) => v.action !== "supersede" || v.supersededBy !== undefined, {
    message: "Name the later run that supersedes this one.",
    path: ["supersededBy"],
  })
  .refine((v) => v.action !== "request_changes" || (v.note !== undefined && v.note.length > 0), {
    message: "Say what should change.",
    path: ["note"],
  });
export type ReviewActionBody = z.infer<typeof reviewActionSchema>;
