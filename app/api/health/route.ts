import { pingDatabase } from "@/lib/db";

export const dynamic = "force-dynamic";

/** Process and database status: 200 when the database answers within 2 s, else 503. */
export async function GET(): Promise<Response> {
  const dbUp = await pingDatabase(2_000);
  return Response.json(
    { status: dbUp ? "ok" : "degraded", db: dbUp ? "up" : "down" },
    { status: dbUp ? 200 : 503, headers: { "cache-control": "no-store" } },
  );
}
