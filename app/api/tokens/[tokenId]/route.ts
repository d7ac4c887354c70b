import { withApi } from "@/lib/api";
import { requireActor } from "@/lib/session";
import { revokeApiToken } from "@/lib/tokens";

type Ctx = { params: Promise<{ tokenId: string }> };

/** DELETE /api/tokens/:id — revoke one of the caller's tokens (someone else's → 404). */
export const DELETE = withApi(async (req: Request, ctx: Ctx) => {
  const actor = await requireActor(req);
  const { tokenId } = await ctx.params;
  await revokeApiToken(actor.userId, tokenId);
  return new Response(null, { status: 204 });
});
