/**
 * Pure helpers of the analyses views (client-safe, no React): the oscillator verdict, ranked
 * sensitivities, histogram bars and pole rows. Unit-tested in tests/unit/analyses-math.test.ts.
 */
import type { DrawnResult } from "@/lib/drawn-result";
import type { MonteCarloCheck, PoleResult, SensitivityResult } from "@/solver/types";
import { oscillatorVerdict } from "./oscillator-grade";

/** Sensitivities of one measure, largest |value| first (nulls last). */
export function rankSensitivities(rows: SensitivityResult[], measure: string): SensitivityResult[] {
  return rows
    .filter((r) => r.measure === measure)
    .sort(
      (a, b) => (b.value === null ? -1 : Math.abs(b.value)) - (a.value === null ? -1 : Math.abs(a.value)),
    );
}

/** Histogram bars: bin centres, widths and counts from the solver's edges/counts. */
export function histogramBars(
  edges: number[],
  counts: number[],
): { x: number[]; width: number[]; y: number[] } {
  const x: number[] = [];
  const width: number[] = [];
  for (let i = 0; i < counts.length; i++) {
    const a = edges[i] ?? 0;
    const b = edges[i + 1] ?? a;
    x.push((a + b) / 2);
    width.push(b - a);
  }
  return { x, width, y: counts };
}

/** Poles sorted by frequency, conjugates kept together (positive ω first). */
export function sortedPoles(poles: PoleResult[]): PoleResult[] {
  return [...poles].sort((a, b) => a.frequencyHz - b.frequencyHz || b.im - a.im);
}

export type AnalysisSection =
  | "job"
  | "verdict"
  | "steady"
  | "poles"
  | "noise"
  | "variants"
  | "monteCarlo"
  | "sensitivity";

/**
 * Which sections the analyses panel shows for a run, in order — one rule for the panel and for the
 * run page that decides whether to frame it (an amplifier's loop without an oscillation verdict and
 * without studies shows none, so the page shows no empty panel).
 */
export function analysisSections(result: DrawnResult | null | undefined, status: string): AnalysisSection[] {
  const out: AnalysisSection[] = [];
  if (status === "queued" || status === "running") out.push("job");
  if (!result?.ok) return out;
  const hasLoop = result.traces.some((t) => t.kind === "loop");
  const growing = (result.poles ?? []).some((p) => p.re > 0);
  // The verdict is about oscillators: shown for a circuit with a loop or a growing pole.
  const verdict = hasLoop || growing ? oscillatorVerdict(result) : null;
  if (verdict && (verdict.pole || verdict.loop?.gain != null)) out.push("verdict");
  if (result.steady) out.push("steady");
  if ((result.poles && result.poles.length > 0) || (result.zeros && result.zeros.length > 0))
    out.push("poles");
  if (result.noise && result.noise.length > 0) out.push("noise");
  if (result.variants && result.variants.length > 0) out.push("variants");
  if (result.monteCarlo) out.push("monteCarlo");
  if (result.sensitivity && result.sensitivity.length > 0) out.push("sensitivity");
  return out;
}

/** The nominal value and each check limit of a measure, as vertical lines on its histogram. */
export function histogramMarks(
  nominal: number | null,
  limits: MonteCarloCheck[],
): { x: number; label: string; limit: boolean }[] {
  const marks: { x: number; label: string; limit: boolean }[] = [];
  if (nominal !== null) marks.push({ x: nominal, label: "nominal", limit: false });
  for (const c of limits) {
    if (c.op === "between") {
      marks.push({ x: Math.min(c.value, c.value2 ?? c.value), label: "limit", limit: true });
      marks.push({ x: Math.max(c.value, c.value2 ?? c.value), label: "limit", limit: true });
    } else {
      marks.push({ x: c.value, label: `limit ${c.op} ${c.value}`, limit: true });
    }
  }
  return marks;
}
