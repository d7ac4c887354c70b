import { withActor } from "@/lib/api";
import { contentDisposition } from "@/lib/attachments";
import { readAttachment } from "@/lib/readings";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/runs/:id/readings/:readingId/attachment → the stored file, for members of the run's team only. */
export const GET = withActor<{ params: Promise<{ id: string; readingId: string }> }>(
  async (actor, { id, readingId }) => {
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
