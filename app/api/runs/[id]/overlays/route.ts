import { json, readJson, withActor } from "@/lib/api";
import { overlayIds, setOverlays } from "@/lib/run-overlays";
import { getRun } from "@/lib/runs";
import { overlaysSchema } from "@/lib/validations/overlays";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/runs/:id/overlays → `{measurementIds}` drawn on the run's plot (anyone who reads the run). */
export const GET = withActor<Ctx>(async (actor, { id }) => {
  await getRun(actor, id);
  return json({ measurementIds: await overlayIds(id) });
});

/** PUT /api/runs/:id/overlays `{measurementIds}` → the new list (designers and owners). */
export const PUT = withActor<Ctx>(async (actor, { id }, req) => {
  const { measurementIds } = await readJson(req, overlaysSchema);
  return json({ measurementIds: await setOverlays(actor, id, measurementIds) });
});
