import { json, withApi } from "@/lib/api";
import { BadRequestError, RateLimitError, TooLargeError } from "@/lib/errors";
import { previewOptions } from "@/lib/jobs";
import { MAX_NETLIST_BYTES, MAX_PREVIEW_POINTS, SOLVE_RATE_PER_MINUTE } from "@/lib/limits";
import { createRateLimiter } from "@/lib/rate-limit";
import { requireActor } from "@/lib/session";
import { solveRequestSchema } from "@/lib/validations/solve";
import { solveNetlist } from "@/solver";

// The solver is CPU work in this process: keep it on the Node.js runtime, never cached.
export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const limiter = createRateLimiter({ limit: SOLVE_RATE_PER_MINUTE, windowMs: 60_000 });

/** JSON escapes can make the body larger than the netlist itself; allow for that before reading it. */
const MAX_BODY_BYTES = MAX_NETLIST_BYTES * 2 + 1024;

/**
 * POST /api/solve `{netlist}` → the solver's JSON result (NETLIST.md), nothing saved.
 * A netlist with errors is a normal preview state: 200 with `{ok: false, errors}` (line and column each).
 * 400 malformed body, 401 signed out, 413 netlist over MAX_NETLIST_BYTES, 429 over the per-user rate.
 */
export const POST = withApi(async (req: Request) => {
  const actor = await requireActor(req);

  const hit = limiter.hit(actor.userId);
  if (!hit.ok) {
    throw new RateLimitError("Too many previews in a minute. Wait a moment and try again.", {
      retryAfterSeconds: hit.retryAfterMs / 1000,
    });
  }

  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > MAX_BODY_BYTES) throw tooLarge();
  const raw = await req.text();
  if (Buffer.byteLength(raw, "utf8") > MAX_BODY_BYTES) throw tooLarge();

  let body: unknown;
  try {
    body = JSON.parse(raw);
  } catch {
    throw new BadRequestError("The request body is not valid JSON.");
  }
  const { netlist } = solveRequestSchema.parse(body);
  if (Buffer.byteLength(netlist, "utf8") > MAX_NETLIST_BYTES) throw tooLarge();

  return json(solveNetlist(netlist, previewOptions(netlist, MAX_PREVIEW_POINTS)));
});

function tooLarge(): TooLargeError {
  return new TooLargeError(`The netlist is larger than ${MAX_NETLIST_BYTES / 1000} kB.`, {
    field: "netlist",
    limitBytes: MAX_NETLIST_BYTES,
  });
}
