import { json, readJson, withActor, withApi } from "@/lib/api";
import { requireSessionActor } from "@/lib/session";
import { createApiToken, listApiTokens } from "@/lib/tokens";
import { tokenCreateSchema } from "@/lib/validations/project";

/** GET /api/tokens — the caller's tokens (prefix only). */
export const GET = withActor(async (actor) => {
  return json({ tokens: await listApiTokens(actor.userId) });
});

/** POST /api/tokens {name} — a new token; its secret is in the answer once. Session only: 403 with an API token. */
export const POST = withApi(async (req: Request) => {
  const actor = await requireSessionActor(req);
  const { name } = await readJson(req, tokenCreateSchema);
  const { token, summary } = await createApiToken(actor.userId, name);
  return json({ token, ...summary }, 201);
});
