/**
 * The arithmetic of a bench reading, pure and client-safe (the form shows it live, the server
 * stores and compares with it): what was read → the measured quantity, in words with the numbers
 * ("9.8 div × 10 µs/div = 98 µs → 10.2 kHz"), and how it stands against the run's prediction and
 * its Monte Carlo spread. Numbers are written by the one result formatter (solver/format.ts).
 */

import type { ReadingForm, ReadingQuantity } from "@/lib/reading-kinds";
import { formatNumber, formatPercent, formatQuantity } from "@/solver/format";
import type { MeasureResult, MeasureStats } from "@/solver/types";

/** What a run predicted: its measures and, if it has Monte Carlo, their statistics. */
export type Prediction = { measures: MeasureResult[]; monteCarlo: MeasureStats[] | undefined };

export type ReadingNumbers = {
  quantity: ReadingQuantity;
  form: ReadingForm;
  value?: number | null;
  divisions?: number | null;
  perDivision?: number | null;
};

/** A reading as a frequency (Hz) and period (s), or a peak amplitude (V); `steps` shows how. */
export type Derived =
  | { kind: "frequency"; hz: number; seconds: number; steps: string }
  | { kind: "amplitude"; peakV: number; steps: string };

const q = (v: number, unit: string) => formatQuantity(v, unit, 4);
const ok = (v: number | null | undefined): v is number =>
  typeof v === "number" && Number.isFinite(v) && v > 0;

/** The measured quantity and the arithmetic in words, or null while a number is missing or not above 0. */
export function deriveReading(r: ReadingNumbers): Derived | null {
  if (r.form === "divisions") {
    if (!ok(r.divisions) || !ok(r.perDivision)) return null;
    const span = r.divisions * r.perDivision;
    const head = `${formatNumber(r.divisions, 4)} div × ${q(r.perDivision, r.quantity === "period" ? "s" : "V")}/div`;
    if (r.quantity === "period") {
      return {
        kind: "frequency",
        hz: 1 / span,
        seconds: span,
        steps: `${head} = ${q(span, "s")} → ${q(1 / span, "Hz")}`,
      };
    }
    if (r.quantity === "amplitude") {
      const peak = span / 2;
      return {
        kind: "amplitude",
        peakV: peak,
        steps: `${head} = ${q(span, "V")} peak-to-peak ÷ 2 = ${q(peak, "V")} peak`,
      };
    }
    return null;
  }
  if (!ok(r.value)) return null;
  const v = r.value;
  if (r.quantity === "frequency" && r.form === "value")
    return { kind: "frequency", hz: v, seconds: 1 / v, steps: q(v, "Hz") };
  if (r.quantity === "period" && r.form === "value") {
    return { kind: "frequency", hz: 1 / v, seconds: v, steps: `${q(v, "s")} → ${q(1 / v, "Hz")}` };
  }
  if (r.quantity === "amplitude" && r.form === "peak")
    return { kind: "amplitude", peakV: v, steps: `${q(v, "V")} peak` };
  if (r.quantity === "amplitude" && r.form === "peak_to_peak") {
    return {
      kind: "amplitude",
      peakV: v / 2,
      steps: `${q(v, "V")} peak-to-peak ÷ 2 = ${q(v / 2, "V")} peak`,
    };
  }
  return null;
}

/** The reading in a measure's unit: a frequency against Hz or s, an amplitude against V; else null. */
export function inUnitOf(d: Derived, unit: string): number | null {
  if (d.kind === "frequency") return unit === "Hz" ? d.hz : unit === "s" ? d.seconds : null;
  return unit === "V" ? d.peakV : null;
}

/** Measures of a run a reading of this quantity can be set beside. */
export function comparableMeasures(
  measures: readonly MeasureResult[],
  quantity: ReadingQuantity,
): MeasureResult[] {
  const units = quantity === "amplitude" ? ["V"] : ["Hz", "s"];
  return measures.filter((m) => units.includes(m.unit));
}

export const INSIDE_SPREAD = "inside the spread parts tolerances explain";
export const OUTSIDE_SPREAD = "outside: look for a build fault or a wrong part";

export type Spread = {
  /** Where the reading falls among the samples, 0…100 (from the histogram, so approximate). */
  percentile: number;
  p1: number;
  p99: number;
  inside: boolean;
  verdict: string;
};

export type Comparison = {
  measured: number | null;
  unit: string | null;
  predicted: number | null;
  /** (measured − predicted) / |predicted| × 100 */
  deviationPct: number | null;
  spread: Spread | null;
  /** Why there is no comparison (no measure chosen, the measure has no value, units differ). */
  reason: string | null;
};

/**
 * Percentile of x among Monte Carlo samples summarised by a histogram: the share of samples below
 * x, counting a bin's samples as spread evenly across it. 0 below the smallest, 100 above the largest.
 */
export function histogramPercentile(
  x: number,
  edges: readonly number[],
  counts: readonly number[],
): number | null {
  const total = counts.reduce((a, b) => a + b, 0);
  const first = edges[0];
  const last = edges[edges.length - 1];
  if (total === 0 || first === undefined || last === undefined || edges.length !== counts.length + 1)
    return null;
  if (x <= first) return 0;
  if (x >= last) return 100;
  let below = 0;
  for (let i = 0; i < counts.length; i++) {
    const lo = edges[i] as number;
    const hi = edges[i + 1] as number;
    const n = counts[i] as number;
    if (x < hi) return (100 * (below + (hi > lo ? (n * (x - lo)) / (hi - lo) : 0))) / total;
    below += n;
  }
  return 100;
}

function spreadOf(x: number, stats: MeasureStats | undefined): Spread | null {
  const p1 = stats?.percentiles.p1;
  const p99 = stats?.percentiles.p99;
  if (!stats || p1 == null || p99 == null) return null;
  const percentile = histogramPercentile(x, stats.histogram.edges, stats.histogram.counts);
  if (percentile === null) return null;
  const inside = x >= p1 && x <= p99;
  return { percentile, p1, p99, inside, verdict: inside ? INSIDE_SPREAD : OUTSIDE_SPREAD };
}

/** The reading beside the run's prediction of `measureName` and, when the run has one, its Monte Carlo spread. */
export function compareReading(
  d: Derived,
  measureName: string | null,
  measures: readonly MeasureResult[],
  monteCarlo: readonly MeasureStats[] | undefined,
): Comparison {
  const none = (reason: string): Comparison => ({
    measured: d.kind === "frequency" ? d.hz : d.peakV,
    unit: d.kind === "frequency" ? "Hz" : "V",
    predicted: null,
    deviationPct: null,
    spread: null,
    reason,
  });
  if (!measureName) return none("No predicted measure chosen.");
  const m = measures.find((x) => x.name === measureName);
  if (!m) return none(`The run has no measure “${measureName}”.`);
  const measured = inUnitOf(d, m.unit);
  if (measured === null)
    return none(`“${measureName}” is in ${m.unit || "no unit"}; this reading cannot be set beside it.`);
  if (m.value === null)
    return { ...none(m.reason ?? `The run has no value for “${measureName}”.`), measured, unit: m.unit };
  const deviationPct = m.value !== 0 ? ((measured - m.value) / Math.abs(m.value)) * 100 : null;
  const spread = spreadOf(
    measured,
    monteCarlo?.find((s) => s.name === measureName),
  );
  return { measured, unit: m.unit, predicted: m.value, deviationPct, spread, reason: null };
}

/** One line for lists and e-mails: "f0: measured 10.2 kHz, predicted 10.61 kHz (−3.85 %); ≈12th percentile of the Monte Carlo spread, inside …". */
export function comparisonLine(measureName: string | null, c: Comparison): string {
  const measured = c.measured === null || c.unit === null ? "—" : q(c.measured, c.unit);
  if (c.predicted === null || c.unit === null)
    return `measured ${measured}${c.reason ? ` (${c.reason})` : ""}`;
  const head = `${measureName}: measured ${measured}, predicted ${q(c.predicted, c.unit)} (${formatPercent(c.deviationPct, 3)})`;
  if (!c.spread) return head;
  return `${head}; ${percentileWords(c.spread.percentile)}, ${c.spread.verdict}`;
}

/** "≈12th percentile of the Monte Carlo spread"; "below every Monte Carlo sample" at the ends. */
export function percentileWords(p: number): string {
  if (p <= 0) return "below every Monte Carlo sample";
  if (p >= 100) return "above every Monte Carlo sample";
  const n = Math.min(99, Math.max(1, Math.round(p)));
  const s = n % 100 >= 11 && n % 100 <= 13 ? "th" : (["th", "st", "nd", "rd"][n % 10] ?? "th");
  return `≈${n}${s} percentile of the Monte Carlo spread`;
}
