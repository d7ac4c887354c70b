import type { TraceResult } from "../types";
import { deg } from "./refine";

/** |X| below this is reported as this (−600 dB), so the JSON never holds −Infinity. */
export const MAG_FLOOR = 1e-30;

/**
 * A trace from its complex samples: the derived columns (dB, degrees in (−180, 180]) are computed
 * here and only here, so a trace rebuilt from stored re/im is identical to the one first solved.
 */
export function makeTrace(name: string, kind: TraceResult["kind"], re: number[], im: number[]): TraceResult {
  return {
    name,
    kind,
    re,
    im,
    magnitudeDb: re.map((x, k) => 20 * Math.log10(Math.max(Math.hypot(x, im[k]!), MAG_FLOOR))),
    phaseDeg: re.map((x, k) => deg(x, im[k]!)),
  };
}
