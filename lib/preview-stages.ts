/**
 * The live preview's two answers (client-safe: types and pure functions). A netlist whose preview
 * solves studies beyond its nominal sweep (Monte Carlo, vary, sensitivity, steady oscillation) is
 * asked for twice: first `stage: "sweep"` — the nominal sweep with its measures and checks, which
 * solves in milliseconds and names the studies still to come in `pending` — then the whole preview.
 * The plot is redrawn from the first answer; the studies fill in from the second.
 */
import type { SolveResult, SolveSuccess } from "@/solver/types";

export const PREVIEW_STAGES = ["sweep", "all"] as const;
export type PreviewStage = (typeof PREVIEW_STAGES)[number];

/** The studies a preview solves beyond its nominal sweep, by their statements' keywords (lib/jobs.ts). */
export type PreviewStudy = "vary" | "monte-carlo" | "sensitivity" | "steady";

/** A sweep-stage answer whose studies are still to come says which in `pending`. */
export type PreviewSuccess = SolveSuccess & { pending?: PreviewStudy[] };
export type PreviewResult = PreviewSuccess | Extract<SolveResult, { ok: false }>;

const STUDY_WORDS: Record<PreviewStudy, string> = {
  vary: "the vary family",
  "monte-carlo": "the Monte Carlo samples",
  sensitivity: "the sensitivities",
  steady: "the steady oscillation",
};

/** "the Monte Carlo samples and the steady oscillation" */
export function studiesInWords(studies: readonly PreviewStudy[]): string {
  const words = studies.map((s) => STUDY_WORDS[s]);
  return words.length <= 1 ? (words[0] ?? "") : `${words.slice(0, -1).join(", ")} and ${words.at(-1)}`;
}

const sameNumbers = (a: readonly (number | null)[], b: readonly (number | null)[]) =>
  a === b || (a.length === b.length && a.every((x, i) => x === b[i]));

/**
 * The whole preview with the sweep answer's frequency and trace arrays kept when the sweep is the
 * same number for number (it is the same solve), so a plot drawn from the first answer sees the
 * same data again and is not redrawn when the studies arrive.
 */
export function keepSweepOf(first: SolveSuccess, full: SolveSuccess): SolveSuccess {
  if (!sameNumbers(first.frequencies, full.frequencies)) return full;
  if (first.traces.length !== full.traces.length) return full;
  const same = full.traces.every((t, i) => {
    const f = first.traces[i]!;
    return (
      f.name === t.name &&
      f.kind === t.kind &&
      sameNumbers(f.magnitudeDb, t.magnitudeDb) &&
      sameNumbers(f.phaseDeg, t.phaseDeg) &&
      sameNumbers(f.re, t.re) &&
      sameNumbers(f.im, t.im) &&
      sameNumbers(f.groupDelay ?? [], t.groupDelay ?? [])
    );
  });
  return same ? { ...full, frequencies: first.frequencies, traces: first.traces } : full;
}
