import { json, withActor } from "@/lib/api";
import { resendInvitation } from "@/lib/invitations";
import { invitationRefSchema } from "@/lib/validations/invitation";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string; invitationId: string }> };

/** POST /api/teams/:id/invitations/:invitationId/resend → 201 with the new invitation (owner only). */
export const POST = withActor<Ctx>(async (actor, { id, invitationId }) => {
  const ref = invitationRefSchema.parse({ teamId: id, invitationId });
  return json({ invitation: await resendInvitation(actor, ref.teamId, ref.invitationId) }, 201);
});
