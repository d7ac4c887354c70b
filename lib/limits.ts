/**
 * Size limits of the service, in one place. Routes, the editor and the job queue read them from here.
 */

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
 * Solver work of a run in "sweep points": points × (1 + Monte Carlo samples + vary values).
 * A run above this (or with more than MAX_MC_INLINE_SAMPLES samples) is not solved inside the
 * request: it is saved as 'queued' and solved by `npm run worker` (lib/jobs.ts). 200 000 is about
 * 0.3 s of solver time on one core here (a 400-point oscillator with 500 samples).
 */
export const MAX_INLINE_WORK = 200_000;

/**
 * Price of one steady-oscillation solve (`steady LOOP harmonics=N`) in the same "sweep points":
 * STEADY_BASE_WORK (poles, describing-function search) + STEADY_WORK_PER_HARMONIC·N (the linear
 * solves at each harmonic) + (2N+1)³/STEADY_CUBE_DIVISOR (the dense Newton steps). About 50 000 at
 * 15 harmonics (~0.1 s), 170 000 at 63, 1.9 M at 255 (queued). It is paid again per vary value and,
 * when a steady measure is sampled, per Monte Carlo sample.
 */
export const STEADY_BASE_WORK = 20_000;
export const STEADY_WORK_PER_HARMONIC = 2_000;
export const STEADY_CUBE_DIVISOR = 100;

/**
 * Price of one integrated noise measure (`noise(N) from F1 to F2`, `input-noise(…) from …`) in sweep
 * points: the adaptive quadrature solves at its own nodes, typically a few hundred (15 per panel, one
 * panel per decade and the splits), at most 6 000 (MAX_NOISE_EVALUATIONS in
 * solver/engine/noise-measures.ts). A `noise` statement's densities ride on the sweep's factors
 * (about 1.0× the plain sweep, `npm run bench`) and are not priced.
 */
export const NOISE_BAND_WORK = 1_000;

/** Largest JSON request body read by the API (a 2 MB measurement CSV, JSON-escaped), in bytes. */
export const MAX_JSON_BODY_BYTES = 5_000_000;

/** Most Monte Carlo samples a queued run may ask for. */
export const MAX_QUEUED_SAMPLES = 20_000;

/** How long a queued solve may run before the queue gives up on it, in seconds. */
export const JOB_EXPIRE_SECONDS = 15 * 60;

/** Largest scope capture (PNG or JPEG) attached to a bench reading, in bytes. */
export const MAX_READING_IMAGE_BYTES = 10 * 1024 * 1024;

/** Largest CSV attached to a bench reading, in bytes. */
export const MAX_READING_CSV_BYTES = 5 * 1024 * 1024;

/** Most bench readings one run keeps. */
export const MAX_READINGS_PER_RUN = 200;
