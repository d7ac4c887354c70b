import type { LayoutAxis } from "plotly.js";

/** The smallest 1, 2, 2.5 or 5 × 10ⁿ step that is at least `raw`. */
function niceStep(raw: number): number {
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 2.5 ? 2.5 : m <= 5 ? 5 : 10) * p;
}

/**
 * Ticks of a Δ axis at round numbers: multiples of a 1-2-2.5-5 step from 0 (about four over the
 * values' span, zero always among them). Without them the library spaces the right-hand ticks to match
 * the left axis' grid, labelling values such as 0.173 and −0.477.
 */
export function deltaTicks(values: readonly (number | null)[]): Partial<LayoutAxis> {
  let lo = 0;
  let hi = 0;
  for (const v of values) {
    if (v === null || !Number.isFinite(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const span = hi - lo;
  if (!(span > 0)) return { tickmode: "auto" };
  return { tickmode: "linear", tick0: 0, dtick: niceStep(span / 4) };
}
