import { json, withActor } from "@/lib/api";
import { compareSavedRuns } from "@/lib/runs-compare";
import { compareQuerySchema } from "@/lib/validations/run";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/compare?a=&b= → the diff of two runs; 404 unless the caller may see both. */
export const GET = withActor(async (actor, _params, req) => {
  const sp = new URL(req.url).searchParams;
  const { a, b } = compareQuerySchema.parse({ a: sp.get("a") ?? undefined, b: sp.get("b") ?? undefined });
  return json(await compareSavedRuns(actor, a, b));
});
