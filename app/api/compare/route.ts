import { json, withApi } from "@/lib/api";
import { compareSavedRuns } from "@/lib/runs-compare";
import { requireActor } from "@/lib/session";
import { compareQuerySchema } from "@/lib/validations/run";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/compare?a=&b= → the diff of two runs; 404 unless the caller may see both. */
export const GET = withApi(async (req: Request) => {
  const actor = await requireActor(req);
  const sp = new URL(req.url).searchParams;
  const { a, b } = compareQuerySchema.parse({ a: sp.get("a") ?? undefined, b: sp.get("b") ?? undefined });
  return json(await compareSavedRuns(actor, a, b));
});
