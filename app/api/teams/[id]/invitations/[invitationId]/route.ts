import { json, withActor } from "@/lib/api";
import { revokeInvitation } from "@/lib/invitations";
import { invitationRefSchema } from "@/lib/validations/invitation";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string; invitationId: string }> };

/** DELETE /api/teams/:id/invitations/:invitationId → 200; the link stops working (owner only). */
export const DELETE = withActor<Ctx>(async (actor, { id, invitationId }) => {
  const ref = invitationRefSchema.parse({ teamId: id, invitationId });
  await revokeInvitation(actor, ref.teamId, ref.invitationId);
  return json({ revoked: true });
});
