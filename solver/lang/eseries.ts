/**
 * IEC 60063:2015 preferred-number series E6 … E192 (one decade, mantissas in [1, 10)).
 *
 * E6/E12/E24 are two significant digits; E48/E96/E192 three. E96 equals round(10^(i/96), 2) for every i;
 * E48 is every second E96 value; E192 follows round(10^(i/192), 2) except 9.20 where the formula gives
 * 9.19 (the standard's Table 2; lists from memory, matching third-party lists — see CHECKS.md §9).
 * E24 is listed, not computed: it departs from round(10^(i/24), 1) at eight places.
 */

export type SeriesName = "E6" | "E12" | "E24" | "E48" | "E96" | "E192";

const E24 = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8,
  7.5, 8.2, 9.1,
];

function roundedGeometric(count: number): number[] {
  return Array.from({ length: count }, (_, i) => Math.round(10 ** (i / count) * 100) / 100);
}

const E192 = roundedGeometric(192).map((v) => (v === 9.19 ? 9.2 : v));
const E96 = roundedGeometric(96);

/** Every series, one decade each, ascending. */
export const E_SERIES: Readonly<Record<SeriesName, readonly number[]>> = {
  E6: E24.filter((_, i) => i % 4 === 0),
  E12: E24.filter((_, i) => i % 2 === 0),
  E24,
  E48: E96.filter((_, i) => i % 2 === 0),
  E96,
  E192,
};

/** True when `name` is one of the series names (exact spelling, e.g. "E24"). */
export function isSeriesName(name: string): name is SeriesName {
  return Object.hasOwn(E_SERIES, name);
}

/** The mantissas of one decade of `series`, ascending (a copy). */
export function seriesValues(series: SeriesName): number[] {
  return [...E_SERIES[series]];
}

/**
 * The value of `series` nearest to `x` in log distance |ln(v/x)|, across decades
 * (snap("E24", 9.6) = 10, not 9.1). Ties go to the smaller value. Cost: O(series length).
 * Throws RangeError when x is not a positive finite number (the language turns it into an error).
 */
export function snap(series: SeriesName, x: number): number {
  if (!Number.isFinite(x) || x <= 0) {
    throw new RangeError(`snap needs a positive number, got ${x}`);
  }
  const decade = Math.floor(Math.log10(x));
  let best = Number.NaN;
  let bestDistance = Number.POSITIVE_INFINITY;
  for (const k of [decade - 1, decade, decade + 1]) {
    for (const m of E_SERIES[series]) {
      // toPrecision(12) removes the binary noise of m * 10^k (4.7 * 10^3 → 4700, not 4700.000000000001).
      const v = Number((m * 10 ** k).toPrecision(12));
      const distance = Math.abs(Math.log(v / x));
      if (distance < bestDistance - 1e-15) {
        best = v;
        bestDistance = distance;
      }
    }
  }
  return best;
}
