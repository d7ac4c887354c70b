import { json, readJson, withApi } from "@/lib/api";
import { createComment, listComments } from "@/lib/comments";
import { requireActor } from "@/lib/session";
import { commentCreateSchema } from "@/lib/validations/comment";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/runs/:id/comments → the run's comments, oldest first. */
export const GET = withApi(async (req: Request, { params }: Ctx) => {
  const actor = await requireActor(req);
  const { id } = await params;
  return json({ comments: await listComments(actor, id) });
});

/** POST /api/runs/:id/comments `{body, frequencyHz?, trace?, parentId?}` → 201 with the comment. */
export const POST = withApi(async (req: Request, { params }: Ctx) => {
  const actor = await requireActor(req);
  const { id } = await params;
  const input = await readJson(req, commentCreateSchema);
  return json({ comment: await createComment(actor, id, input) }, 201);
});
