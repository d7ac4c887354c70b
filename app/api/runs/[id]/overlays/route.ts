import { json, readJson, withApi } from "@/lib/api";
import { overlayIds, setOverlays } from "@/lib/run-overlays";
import { getRun } from "@/lib/runs";
import { requireActor } from "@/lib/session";
import { overlaysSchema } from "@/lib/validations/overlays";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/runs/:id/overlays → `{measurementIds}` drawn on the run's plot (anyone who reads the run). */
export const GET = withApi(async (req: Request, { params }: Ctx) => {
  const actor = await requireActor(req);
  const { id } = await params;
  await getRun(actor, id);
  return json({ measurementIds: await overlayIds(id) });
});

/** PUT /api/runs/:id/overlays `{measurementIds}` → the new list (designers and owners). */
export const PUT = withApi(async (req: Request, { params }: Ctx) => {
  const actor = await requireActor(req);
  const { id } = await params;
  const { measurementIds } = await readJson(req, overlaysSchema);
  return json({ measurementIds: await setOverlays(actor, id, measurementIds) });
});
