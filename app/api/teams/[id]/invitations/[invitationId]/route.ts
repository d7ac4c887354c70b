import { json, withApi } from "@/lib/api";
import { revokeInvitation } from "@/lib/invitations";
import { requireActor } from "@/lib/session";
import { invitationRefSchema } from "@/lib/validations/invitation";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string; invitationId: string }> };

/** DELETE /api/teams/:id/invitations/:invitationId → 200; the link stops working (owner only). */
export const DELETE = withApi(async (req: Request, { params }: Ctx) => {
  const actor = await requireActor(req);
  const { id, invitationId } = await params;
  const ref = invitationRefSchema.parse({ teamId: id, invitationId });
  await revokeInvitation(actor, ref.teamId, ref.invitationId);
  return json({ revoked: true });
});
