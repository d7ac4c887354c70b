import { json, withApi } from "@/lib/api";
import { env } from "@/lib/env";
import { openApiDocument } from "@/lib/openapi/document";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/openapi.json → the API's OpenAPI 3.1 description (public: it holds no data). */
export const GET = withApi(async () => {
  return json(openApiDocument(env.NEXTAUTH_URL), 200, { "cache-control": "public, max-age=300" });
});
