import { json, withActor } from "@/lib/api";
import { readJsonBody } from "@/lib/body";
import { RateLimitError, TooLargeError } from "@/lib/errors";
import { previewOptions } from "@/lib/jobs";
import { MAX_NETLIST_BYTES, MAX_PREVIEW_POINTS, SOLVE_RATE_PER_MINUTE } from "@/lib/limits";
import { solvePreview } from "@/lib/preview-pool";
import { createRateLimiter } from "@/lib/rate-limit";
import { solveRequestSchema } from "@/lib/validations/solve";

// The solver runs on the preview pool's worker threads (lib/preview-pool.ts); never cached.
export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const limiter = createRateLimiter({ limit: SOLVE_RATE_PER_MINUTE, windowMs: 60_000 });

/** JSON escapes can make the body larger than the netlist itself; allow for that before reading it. */
const MAX_BODY_BYTES = MAX_NETLIST_BYTES * 2 + 1024;

/**
 * POST /api/solve `{netlist}` → the solver's JSON result (NETLIST.md), nothing saved.
 * A netlist with errors is a normal preview state: 200 with `{ok: false, errors}` (line and column each).
 * 400 malformed body, 401 signed out, 413 netlist over MAX_NETLIST_BYTES (counted while the body
 * streams in), 429 over the per-user rate, 503 when the preview pool is full or a preview runs too long.
 * Over the work budget (lib/jobs.ts `solveWork`) the answer is the nominal sweep with `deferred` saying why.
 */
export const POST = withActor(async (actor, _params, req) => {
  const hit = limiter.hit(actor.userId);
  if (!hit.ok) {
    throw new RateLimitError("Too many previews in a minute. Wait a moment and try again.", {
      retryAfterSeconds: hit.retryAfterMs / 1000,
    });
  }

  const body = await readJsonBody(req, MAX_BODY_BYTES, "The netlist").catch((err) => {
    throw err instanceof TooLargeError ? tooLarge() : err;
  });
  const { netlist } = solveRequestSchema.parse(body);
  if (Buffer.byteLength(netlist, "utf8") > MAX_NETLIST_BYTES) throw tooLarge();

  // Priced before solving (compiling is linear in the text; the solve is what costs): over the inline
  // budget the preview solves the nominal sweep only and says so in `deferred` (lib/jobs.ts).
  return json(await solvePreview(netlist, previewOptions(netlist, MAX_PREVIEW_POINTS)));
});

function tooLarge(): TooLargeError {
  return new TooLargeError(`The netlist is larger than ${MAX_NETLIST_BYTES / 1000} kB.`, {
    field: "netlist",
    limitBytes: MAX_NETLIST_BYTES,
  });
}
