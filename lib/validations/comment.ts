import { z } from "zod";
import { THREAD_STATES } from "@/lib/review-states";

export const MAX_COMMENT_CHARS = 5000;

/** `POST /api/runs/:id/comments`: a remark, optionally pinned to a frequency on a trace, optionally a reply. */
export const commentCreateSchema = z.object({
  body: z
    .string()
    .trim()
    .min(1, "Write something first.")
    .max(MAX_COMMENT_CHARS, `Keep a comment under ${MAX_COMMENT_CHARS} characters.`),
  frequencyHz: z.number().positive("A pinned frequency must be above 0 Hz.").finite().nullish(),
  trace: z.string().trim().min(1).max(120).nullish(),
  parentId: z.uuid("Not a comment id.").nullish(),
});
export type CommentCreateInput = z.infer<typeof commentCreateSchema>;

/** `PATCH /api/runs/:id/comments/:commentId` `{state: "open" | "settled"}`: settle a thread or open it again. */
export const commentPatchSchema = z.object({
  state: z.enum(THREAD_STATES, `Choose ${THREAD_STATES.join(" or ")}.`),
});
