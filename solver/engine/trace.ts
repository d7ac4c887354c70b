import type { TraceResult } from "../types";
import { resolvable } from "./extrema";
import type { Dual } from "./probes";
import { deg } from "./refine";

/** |X| below this is reported as this (−600 dB), so the JSON never holds −Infinity. */
export const MAG_FLOOR = 1e-30;

/**
 * A trace from its complex samples: the derived columns (dB, degrees in (−180, 180]) are computed
 * here and only here, so a trace rebuilt from stored re/im is identical to the one first solved.
 */
export function makeTrace(
  name: string,
  kind: TraceResult["kind"],
  re: number[],
  im: number[],
  groupDelay?: (number | null)[],
): TraceResult {
  return {
    name,
    kind,
    re,
    im,
    magnitudeDb: re.map((x, k) => 20 * Math.log10(Math.max(Math.hypot(x, im[k]!), MAG_FLOOR))),
    phaseDeg: re.map((x, k) => deg(x, im[k]!)),
    ...(groupDelay ? { groupDelay } : {}),
  };
}

/**
 * Group delay τ = −d∠X/dω from X and its exact derivative X' = dX/ds at s = jω:
 * dX/dω = j·X', so d∠X/dω = Im(j·X'/X) = Re(X'/X) and τ = −Re(X'/X). Computed on X and X' divided by
 * max(|Re X|, |Im X|), so |X|² cannot underflow deep in a stop band (a ladder's far end reaches 1e−160).
 * Null where X = 0 (the phase is undefined there) and where X is subnormal (below 2.2e−308 a double keeps
 * too few digits for a derivative ratio to mean anything).
 * 0 where |τ| is within the rounding of X′'s own arithmetic: X′ is a sum of terms of total size
 * `x.dAbs`, rounded to a few ε of it, so |τ| ≤ 32·ε·dAbs/|X| cannot be told from 0 — a divider
 * behind a buffer, flat by design, read ±2e−21 s of cancellation noise before.
 */
export function groupDelayOf(x: Dual): number | null {
  if (!resolvable(x.re, x.im)) return null;
  const scale = Math.max(Math.abs(x.re), Math.abs(x.im));
  const re = x.re / scale;
  const im = x.im / scale;
  const m2 = re * re + im * im;
  const t = -((x.dRe / scale) * re + (x.dIm / scale) * im) / m2;
  if (!Number.isFinite(t)) return null;
  const floor = (32 * Number.EPSILON * ((x.dAbs ?? 0) / scale)) / Math.sqrt(m2);
  return Math.abs(t) <= floor ? 0 : t;
}
