import { json, withApi } from "@/lib/api";
import { NotFoundError } from "@/lib/errors";
import { listOutbox, outboxVisible } from "@/lib/mail/outbox";
import { requireActor } from "@/lib/session";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * GET /api/dev/outbox → the latest e-mails addressed to the caller (only while mail goes to the local
 * mail fake, never in production: 404 there; 401 when signed out).
 */
export const GET = withApi(async (req) => {
  if (!outboxVisible()) throw new NotFoundError();
  const actor = await requireActor(req);
  return json({ emails: await listOutbox(actor.email) });
});
