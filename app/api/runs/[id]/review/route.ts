import { json, readJson, withApi } from "@/lib/api";
import { reviewRun } from "@/lib/review";
import { requireActor } from "@/lib/session";
import { reviewActionSchema } from "@/lib/validations/review";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * POST /api/runs/:id/review `{action: "submit"|"sign_off"|"send_back"|"supersede", note?, supersededBy?}`
 * → the new review state and the recorded event. 409 when the run's state doesn't allow the step.
 */
export const POST = withApi(async (req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireActor(req);
  const { id } = await params;
  const body = await readJson(req, reviewActionSchema);
  return json(await reviewRun(actor, id, body));
});
