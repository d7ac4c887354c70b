/**
 * Axes of the static chart (static-scene.ts): the range an axis shows and where its ticks go, for the
 * subset of the charting library's axis options our figures use (linear, log and category axes;
 * dtick/tick0, "D1"/"D2" log ticks, tickvals/ticktext). Auto ticks follow the library's published
 * rules (about one label per 80 px across, per 40 px up; steps of 1-2-5 × 10ⁿ), so the drawing
 * before the library loads carries the same ticks as the one after. Labels go through the one
 * number formatter (solver/format.ts). Pure: no DOM.
 */
import { formatNumber } from "@/solver/format";

export type AxisType = "linear" | "log" | "category";

/** The axis options the static chart reads (a subset of the library's `LayoutAxis`). */
export interface AxisSpec {
  type?: string;
  domain?: number[];
  range?: unknown[];
  autorange?: boolean | string;
  rangemode?: string;
  dtick?: number | string;
  tick0?: number | string;
  tickmode?: string;
  tickvals?: unknown[];
  ticktext?: unknown[];
  tickformat?: string;
  exponentformat?: string;
  showticklabels?: boolean;
  showgrid?: boolean;
  zeroline?: boolean;
  side?: string;
  anchor?: string;
  overlaying?: string;
  matches?: string;
  scaleanchor?: string;
}

export interface Tick {
  /** Position on the axis' own scale (log10 of the value on a log axis, the index on a category axis). */
  at: number;
  label: string;
  /** A minor label (a digit between decades, drawn smaller). */
  minor?: boolean;
}

/** 1, 2, 5 × 10ⁿ: the first of 2, 5, 10 × 10^⌊log10 rough⌋ above the rough step. */
export function niceStep(rough: number): number {
  if (!(rough > 0) || !Number.isFinite(rough)) return 1;
  const base = 10 ** Math.floor(Math.log10(rough));
  const r = rough / base;
  const k = [2, 5, 10].find((s) => s > r + 1e-9) ?? 10;
  return k * base;
}

/** How many ticks the library aims for over `lengthPx`: one per 80 px across, per 40 px up, 5…10. */
export function targetTicks(lengthPx: number, letter: "x" | "y"): number {
  const minPx = letter === "y" ? 40 : 80;
  return Math.min(9, Math.max(4, lengthPx / minPx)) + 1;
}

const SI: [number, string][] = [
  [12, "T"],
  [9, "G"],
  [6, "M"],
  [3, "k"],
  [0, ""],
  [-3, "m"],
  [-6, "µ"],
  [-9, "n"],
  [-12, "p"],
  [-15, "f"],
];

/** Round to `decimals` places and write through the one formatter: "−20", "0.5", "1.5". */
function plain(value: number, decimals: number): string {
  const v = Number(value.toFixed(Math.max(0, Math.min(15, decimals))));
  return Object.is(v, -0) || v === 0 ? "0" : formatNumber(v, 12);
}

/** A value with an SI prefix, like the library's "~s": 100, 1k, 20k, 1M, 500m, 2µ. */
export function siLabel(value: number): string {
  if (value === 0) return "0";
  const exp = Math.floor(Math.log10(Math.abs(value)) + 1e-9);
  const [e, prefix] = SI.find(([s]) => exp >= s) ?? [0, ""];
  return `${plain(value / 10 ** e, 6)}${prefix}`;
}

/**
 * Labels of linear ticks `step` apart: plain up to 9999 ("1500", "−0.25"), an SI prefix from 10 000
 * and below 0.001 ("20k", "100µ"), as the library writes them by default.
 */
export function linearLabels(values: readonly number[], step: number): string[] {
  const biggest = Math.max(...values.map((v) => Math.abs(v)));
  let exp = biggest > 0 ? Math.floor(Math.log10(biggest) + 0.01) : 0;
  exp = Math.abs(exp) > 3 ? 3 * Math.round((exp - 1) / 3) : 0;
  exp = Math.max(-15, Math.min(12, exp));
  const prefix = SI.find(([s]) => s === exp)?.[1] ?? "";
  // As many decimals as the step needs (0.0025 → 4), so every label is exact.
  const scaledStep = String(Number((step / 10 ** exp).toPrecision(6)));
  const decimals = scaledStep.includes("e-")
    ? Number(scaledStep.split("e-")[1])
    : (scaledStep.split(".")[1]?.length ?? 0);
  return values.map((v) => `${plain(v / 10 ** exp, decimals)}${v === 0 ? "" : prefix}`);
}

/** A decade's label without a tickformat: plain from 0.001 to 1000, SI-prefixed beyond ("10k", "100µ"). */
function decadeLabel(value: number): string {
  const exp = Math.floor(Math.log10(value) + 1e-9);
  return Math.abs(exp) > 3 ? siLabel(value) : plain(value, Math.max(0, -exp));
}

const LOG_DIGITS: Record<string, number[]> = {
  D1: [1, 2, 3, 4, 5, 6, 7, 8, 9],
  D2: [1, 2, 5],
};

/**
 * Ticks of a log axis over [lo, hi] (decades, log10 Hz): at every `dtick` decades when it is a
 * number, at 1-2-5 (D2) or every digit (D1) of each decade otherwise. With a `tickformat` every
 * label is SI-prefixed; without one the digits between decades are small ("2", "5").
 */
export function logTicks(
  lo: number,
  hi: number,
  spec: Pick<AxisSpec, "dtick" | "tickformat">,
  lengthPx: number,
  letter: "x" | "y",
): Tick[] {
  let dtick = spec.dtick;
  if (dtick === undefined) {
    const rough = (hi - lo) / targetTicks(lengthPx, letter);
    dtick = rough > 0.7 ? Math.ceil(rough) : hi - lo < 1 ? "L" : rough > 0.3 ? "D2" : "D1";
  }
  const ticks: Tick[] = [];
  const label = spec.tickformat ? siLabel : decadeLabel;
  if (typeof dtick === "number" || (typeof dtick === "string" && /^\d+(\.\d+)?$/.test(dtick))) {
    const step = Math.max(1, Math.round(Number(dtick)));
    for (let d = Math.ceil(lo / step - 1e-9) * step; d <= hi + 1e-9; d += step) {
      ticks.push({ at: d, label: label(Number((10 ** d).toPrecision(12))) });
    }
    return ticks;
  }
  if (dtick === "L") {
    const a = 10 ** lo;
    const b = 10 ** hi;
    const step = niceStep((b - a) / (1.5 * targetTicks(lengthPx, letter)));
    for (let v = Math.ceil(a / step) * step; v <= b * (1 + 1e-9); v += step) {
      ticks.push({ at: Math.log10(v), label: siLabel(Number(v.toPrecision(12))) });
    }
    return ticks;
  }
  const digits = LOG_DIGITS[String(dtick)] ?? LOG_DIGITS.D2!;
  for (let d = Math.floor(lo); d <= Math.ceil(hi); d++) {
    for (const k of digits) {
      const at = d + Math.log10(k);
      // No slack at the far end, as in the library: a range ending a hair below a decade leaves it out.
      if (at < lo - 1e-9 || at > hi) continue;
      const value = Number((k * 10 ** d).toPrecision(12));
      if (k === 1 || spec.tickformat) ticks.push({ at, label: label(value) });
      else ticks.push({ at, label: String(k), minor: true });
    }
  }
  return ticks;
}

/** Ticks of a linear axis over [lo, hi]: `tick0 + k·dtick` when given, else a 1-2-5 step. */
export function linearTicks(
  lo: number,
  hi: number,
  spec: Pick<AxisSpec, "dtick" | "tick0" | "tickmode">,
  lengthPx: number,
  letter: "x" | "y",
): Tick[] {
  const a = Math.min(lo, hi);
  const b = Math.max(lo, hi);
  const given = spec.tickmode !== "auto" && Number(spec.dtick) > 0 ? Number(spec.dtick) : null;
  const step = given ?? niceStep((b - a) / targetTicks(lengthPx, letter));
  const tick0 = Number(spec.tick0 ?? 0) || 0;
  const values: number[] = [];
  const first = Math.ceil((a - tick0) / step - 1e-9);
  for (let k = first; tick0 + k * step <= b + step * 1e-9 && values.length < 500; k++) {
    values.push(Number((tick0 + k * step).toPrecision(12)));
  }
  const labels = linearLabels(values, step);
  return values.map((v, i) => ({ at: v, label: labels[i]! }));
}

/** Ticks given as `tickvals` (on the value scale) and `ticktext`. */
export function givenTicks(
  type: AxisType,
  vals: readonly unknown[],
  text: readonly unknown[] | undefined,
): Tick[] {
  const ticks: Tick[] = [];
  vals.forEach((v, i) => {
    const n = Number(v);
    if (!Number.isFinite(n) || (type === "log" && !(n > 0))) return;
    ticks.push({
      at: type === "log" ? Math.log10(n) : n,
      label: text?.[i] !== undefined ? String(text[i]) : type === "log" ? siLabel(n) : formatNumber(n),
    });
  });
  return ticks;
}
