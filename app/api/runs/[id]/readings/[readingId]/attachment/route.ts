import { withApi } from "@/lib/api";
import { contentDisposition } from "@/lib/attachments";
import { readAttachment } from "@/lib/readings";
import { requireActor } from "@/lib/session";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/runs/:id/readings/:readingId/attachment → the stored file, for members of the run's team only. */
export const GET = withApi(
  async (req: Request, { params }: { params: Promise<{ id: string; readingId: string }> }) => {
    const actor = await requireActor(req);
    const { id, readingId } = await params;
    const file = await readAttachment(actor, id, readingId);
    return new Response(Buffer.from(file.body), {
      status: 200,
      headers: {
        "Content-Type": file.type,
        "Content-Length": String(file.body.byteLength),
        "Content-Disposition": contentDisposition(file.name, file.type),
        "X-Content-Type-Options": "nosniff",
        "Cache-Control": "private, no-store",
      },
    });
  },
);
