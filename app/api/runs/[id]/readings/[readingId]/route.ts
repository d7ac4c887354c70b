import { withApi } from "@/lib/api";
import { deleteReading } from "@/lib/readings";
import { requireActor } from "@/lib/session";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** DELETE /api/runs/:id/readings/:readingId → 204; the attachment goes with it. */
export const DELETE = withApi(
  async (req: Request, { params }: { params: Promise<{ id: string; readingId: string }> }) => {
    const actor = await requireActor(req);
    const { id, readingId } = await params;
    await deleteReading(actor, id, readingId);
    return new Response(null, { status: 204 });
  },
);
