import { json, readJson, withApi } from "@/lib/api";
import { setCommentState } from "@/lib/comments";
import { requireActor } from "@/lib/session";
import { commentPatchSchema } from "@/lib/validations/comment";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** PATCH /api/runs/:id/comments/:commentId `{state: "open"|"settled"}` → the comment, settled or open again. */
export const PATCH = withApi(
  async (req: Request, { params }: { params: Promise<{ id: string; commentId: string }> }) => {
    const actor = await requireActor(req);
    const { id, commentId } = await params;
    const { state } = await readJson(req, commentPatchSchema);
    return json({ comment: await setCommentState(actor, id, commentId, state) });
  },
);
