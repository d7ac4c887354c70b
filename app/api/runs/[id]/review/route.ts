import { json, readJson, withActor } from "@/lib/api";
import { reviewRun } from "@/lib/review";
import { reviewActionSchema } from "@/lib/validations/review";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * POST /api/runs/:id/review `{action: "submit"|"sign_off"|"send_back"|"supersede", note?, supersededBy?}`
 * → the new review state and the recorded event. 409 when the run's state doesn't allow the step.
 */
export const POST = withActor<{ params: Promise<{ id: string }> }>(async (actor, { id }, req) => {
  const body = await readJson(req, reviewActionSchema);
  return json(await reviewRun(actor, id, body));
});
