import { json, withActor } from "@/lib/api";
import { getRun } from "@/lib/runs";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/runs/:id → the run with its result, review history and the caller's permissions. */
export const GET = withActor<{ params: Promise<{ id: string }> }>(async (actor, { id }) => {
  return json({ run: await getRun(actor, id) });
});
