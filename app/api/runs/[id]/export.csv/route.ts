import { withActor } from "@/lib/api";
import { NotFoundError } from "@/lib/errors";
import { getRun } from "@/lib/runs";
import { resultToCsv } from "@/solver/csv";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/runs/:id/export.csv → frequency, then re/im/dB/deg per trace (RFC 4180). */
export const GET = withActor<{ params: Promise<{ id: string }> }>(async (actor, { id }) => {
  const run = await getRun(actor, id);
  if (!run.result) throw new NotFoundError("This run has no result to export.");
  const slug = run.title.replace(/[^A-Za-z0-9._-]+/g, "-").replace(/^-+|-+$/g, "") || "run";
  return new Response(resultToCsv(run.result), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="${slug}.csv"`,
      "Cache-Control": "private, no-store",
    },
  });
});
