import { json, withActor } from "@/lib/api";
import { readJsonBody } from "@/lib/body";
import { RateLimitError, TooLargeError } from "@/lib/errors";
import { MAX_NETLIST_BYTES, SOLVE_RATE_PER_MINUTE } from "@/lib/limits";
import { solveLivePreview } from "@/lib/live-preview";
import { createRateLimiter } from "@/lib/rate-limit";
import { solveRequestSchema } from "@/lib/validations/solve";

// The solver runs on the preview pool's worker threads (lib/preview-pool.ts); never cached.
export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const limiter = createRateLimiter({ limit: SOLVE_RATE_PER_MINUTE, windowMs: 60_000 });

/** JSON escapes can make the body larger than the netlist itself; allow for that before reading it. */
const MAX_BODY_BYTES = MAX_NETLIST_BYTES * 2 + 1024;

/**
 * POST /api/solve `{netlist, stage?}` → the solver's JSON result (NETLIST.md), nothing saved.
 * A netlist with errors is a normal preview state: 200 with `{ok: false, errors}` (line and column each).
 * 400 malformed body, 401 signed out, 413 netlist over MAX_NETLIST_BYTES (counted while the body
 * streams in), 429 over the per-user rate, 503 when the preview pool is full or a preview runs too long
 * (or, `cancelled`, when the request ended while its preview waited for a thread).
 * Over the work budget (lib/jobs.ts `solveWork`) the answer is the nominal sweep with `deferred` saying why.
 * `stage: "sweep"` answers the nominal sweep first, naming the studies still to come in `pending`
 * (lib/live-preview.ts). `Server-Timing` says where the time went: reading the body, pricing and
 * solving (the pool's wait and thread included; `engine` is the solver's own time).
 */
export const POST = withActor(async (actor, _params, req) => {
  const hit = limiter.hit(actor.userId);
  if (!hit.ok) {
    throw new RateLimitError("Too many previews in a minute. Wait a moment and try again.", {
      retryAfterSeconds: hit.retryAfterMs / 1000,
    });
  }

  const t0 = performance.now();
  const body = await readJsonBody(req, MAX_BODY_BYTES, "The netlist").catch((err) => {
    throw err instanceof TooLargeError ? tooLarge() : err;
  });
  const { netlist, stage } = solveRequestSchema.parse(body);
  if (Buffer.byteLength(netlist, "utf8") > MAX_NETLIST_BYTES) throw tooLarge();

  const t1 = performance.now();
  const result = await solveLivePreview(netlist, stage, req.signal);
  const t2 = performance.now();
  const engine = result.ok ? `, engine;dur=${result.stats.solveMs.toFixed(1)}` : "";
  return json(result, 200, {
    "Server-Timing": `read;dur=${(t1 - t0).toFixed(1)}, solve;dur=${(t2 - t1).toFixed(1)}${engine}`,
  });
});

function tooLarge(): TooLargeError {
  return new TooLargeError(`The netlist is larger than ${MAX_NETLIST_BYTES / 1000} kB.`, {
    field: "netlist",
    limitBytes: MAX_NETLIST_BYTES,
  });
}
