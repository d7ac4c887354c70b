import { json, readJson, withActor } from "@/lib/api";
import { setCommentState } from "@/lib/comments";
import { commentPatchSchema } from "@/lib/validations/comment";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** PATCH /api/runs/:id/comments/:commentId `{state: "open"|"settled"}` → the comment, settled or open again. */
export const PATCH = withActor<{ params: Promise<{ id: string; commentId: string }> }>(
  async (actor, { id, commentId }, req) => {
    const { state } = await readJson(req, commentPatchSchema);
    return json({ comment: await setCommentState(actor, id, commentId, state) });
  },
);
