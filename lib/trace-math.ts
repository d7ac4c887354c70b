/**
 * Small numeric helpers on sampled traces, safe for the browser (no database imports; the angle
 * wrap is the solver's pure one).
 */

import { wrapDeg } from "@/solver/angles";

// One wrap for every phase (solver/angles.ts); lib/compare.ts reads it through here.
export { wrapDeg };

/**
 * Samples a trace (dB and degrees) at frequency f by linear interpolation in log10(f).
 * Phase is interpolated along the shorter way round, so a wrap between two points does not smear.
 * Returns null outside the sweep. `freqs` must be ascending and positive.
 */
export function sampleTrace(
  freqs: number[],
  db: number[],
  deg: number[],
  f: number,
): { db: number; deg: number } | null {
  const n = freqs.length;
  if (n === 0 || !(f > 0)) return null;
  const first = freqs[0]!;
  const last = freqs[n - 1]!;
  const tol = 1e-12 * f;
  if (f < first - tol || f > last + tol) return null;
  // Binary search for the bracket freqs[lo] <= f <= freqs[hi].
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (freqs[mid]! <= f) lo = mid;
    else hi = mid;
  }
  const f0 = freqs[lo]!;
  const f1 = freqs[hi]!;
  if (Math.abs(f - f0) <= tol || lo === hi) return { db: db[lo]!, deg: deg[lo]! };
  if (Math.abs(f - f1) <= tol) return { db: db[hi]!, deg: deg[hi]! };
  const t = (Math.log10(f) - Math.log10(f0)) / (Math.log10(f1) - Math.log10(f0));
  const d0 = deg[lo]!;
  const step = wrapDeg(deg[hi]! - d0);
  return { db: db[lo]! + t * (db[hi]! - db[lo]!), deg: wrapDeg(d0 + t * step) };
}
