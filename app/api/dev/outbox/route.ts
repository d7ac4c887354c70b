import { json, withApi } from "@/lib/api";
import { NotFoundError } from "@/lib/errors";
import { listOutbox, outboxVisible } from "@/lib/mail/outbox";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/dev/outbox → the latest e-mails (development and tests only; 404 in production). */
export const GET = withApi(async () => {
  if (!outboxVisible()) throw new NotFoundError();
  return json({ emails: await listOutbox() });
});
