import type { TraceResult } from "../types";
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
 * dX/dω = j·X', so d∠X/dω = Im(j·X'/X) = Re(X'/X) and τ = −Re(X'/X). Null where |X| = 0
 * (the phase is undefined there).
 */
export function groupDelayOf(x: Dual): number | null {
  const m2 = x.re * x.re + x.im * x.im;
  if (!(m2 > 0) || !Number.isFinite(m2)) return null;
  const t = -(x.dRe * x.re + x.dIm * x.im) / m2;
  return Number.isFinite(t) ? t : null;
}
