import { json, withApi } from "@/lib/api";
import { getRun } from "@/lib/runs";
import { requireActor } from "@/lib/session";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/runs/:id → the run with its result, review history and the caller's permissions. */
export const GET = withApi(async (req: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireActor(req);
  const { id } = await params;
  return json({ run: await getRun(actor, id) });
});
