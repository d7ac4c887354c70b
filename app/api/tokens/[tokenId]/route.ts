import { withActor } from "@/lib/api";
import { revokeApiToken } from "@/lib/tokens";

type Ctx = { params: Promise<{ tokenId: string }> };

/** DELETE /api/tokens/:id — revoke one of the caller's tokens (someone else's → 404). */
export const DELETE = withActor<Ctx>(async (actor, { tokenId }) => {
  await revokeApiToken(actor.userId, tokenId);
  return new Response(null, { status: 204 });
});
