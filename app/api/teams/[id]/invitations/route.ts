import { json, readJson, withActor } from "@/lib/api";
import { createInvitation, listInvitations } from "@/lib/invitations";
import { invitationCreateSchema } from "@/lib/validations/invitation";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/teams/:id/invitations → pending invitations (owner only). */
export const GET = withActor<Ctx>(async (actor, { id }) => {
  return json({ invitations: await listInvitations(actor, id) });
});

/** POST /api/teams/:id/invitations `{email, role}` → 201; the link goes out by e-mail (owner only). */
export const POST = withActor<Ctx>(async (actor, { id }, req) => {
  const input = await readJson(req, invitationCreateSchema);
  return json({ invitation: await createInvitation(actor, id, input) }, 201);
});
