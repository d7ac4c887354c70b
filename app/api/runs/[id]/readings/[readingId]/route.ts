import { withActor } from "@/lib/api";
import { deleteReading } from "@/lib/readings";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** DELETE /api/runs/:id/readings/:readingId → 204; the attachment goes with it. */
export const DELETE = withActor<{ params: Promise<{ id: string; readingId: string }> }>(
  async (actor, { id, readingId }) => {
    await deleteReading(actor, id, readingId);
    return new Response(null, { status: 204 });
  },
);
