import { json, readJson, withActor } from "@/lib/api";
import { createComment, listComments } from "@/lib/comments";
import { commentCreateSchema } from "@/lib/validations/comment";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/runs/:id/comments → the run's comments, oldest first. */
export const GET = withActor<Ctx>(async (actor, { id }) => {
  return json({ comments: await listComments(actor, id) });
});

/** POST /api/runs/:id/comments `{body, frequencyHz?, trace?, parentId?}` → 201 with the comment. */
export const POST = withActor<Ctx>(async (actor, { id }, req) => {
  const input = await readJson(req, commentCreateSchema);
  return json({ comment: await createComment(actor, id, input) }, 201);
});
