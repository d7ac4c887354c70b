/**
 * Size limits of the service, in one place. Routes, the editor and the job queue read them from here.
 */
import { sweepLength } from "@/solver/engine/sweep";
import type { Circuit } from "@/solver/types";

/** Largest netlist accepted by the solve and save endpoints, in UTF-8 bytes. */
export const MAX_NETLIST_BYTES = 200_000;

/** Most frequency points a live preview (`POST /api/solve`) may sweep. */
export const MAX_PREVIEW_POINTS = 20_000;

/** Most frequency points a saved run may sweep (NETLIST.md allows 100 000 per sweep). */
export const MAX_SAVED_POINTS = 100_000;

/** Most Monte Carlo samples solved inline in a request; larger runs go to the job queue. */
export const MAX_MC_INLINE_SAMPLES = 200;

/** Live preview requests allowed per signed-in user per minute. */
export const SOLVE_RATE_PER_MINUTE = 120;

/**
 * Solver work of a compiled netlist in "sweep points", the one price every limit below uses:
 * points × (1 + Monte Carlo samples + vary values + 2 × sensitivity parts). A sensitivity study
 * re-solves the sweep twice per part value (central differences); parts with a value of 0 are
 * counted too (a slight overestimate, so the price stays an upper bound).
 */
export function solveWork(
  circuit: Pick<Circuit, "sweep" | "monteCarlo" | "vary" | "sensitivity" | "parts">,
): number {
  const points = sweepLength(circuit.sweep);
  const samples = circuit.monteCarlo?.samples ?? 0;
  const variants = circuit.vary?.values.length ?? 0;
  const sensitivityParts = (circuit.sensitivity?.length ?? 0) > 0 ? circuit.parts.length : 0;
  return (Number.isFinite(points) ? points : 0) * (1 + samples + variants + 2 * sensitivityParts);
}

/**
 * The work budget of one request. A preview (`POST /api/solve`) over it answers 422 ("save it as a
 * run: it will be queued"); a saved run over it (or with more than MAX_MC_INLINE_SAMPLES samples) is
 * not solved inside the request: it is saved as 'queued' and solved by `npm run worker`
 * (lib/jobs.ts). 200 000 is about 0.3 s of solver time on one core here (a 400-point oscillator
 * with 500 samples).
 */
export const MAX_INLINE_WORK = 200_000;

/** Largest JSON request body read by the API (a 2 MB measurement CSV, JSON-escaped), in bytes. */
export const MAX_JSON_BODY_BYTES = 5_000_000;

/** Most Monte Carlo samples a queued run may ask for. */
export const MAX_QUEUED_SAMPLES = 20_000;

/** How long a queued solve may run before the queue gives up on it, in seconds. */
export const JOB_EXPIRE_SECONDS = 15 * 60;
