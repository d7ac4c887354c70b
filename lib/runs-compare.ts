import { compareRuns, type RunComparison } from "@/lib/compare";
import { compareReadings, type ReadingCompareRow } from "@/lib/compare-readings";
import type { Prediction } from "@/lib/reading-math";
import { readingsOfRuns } from "@/lib/readings";
import { getRun, type RunDetail } from "@/lib/runs";
import type { Actor } from "@/lib/session";

export type CompareSideView = Pick<
  RunDetail,
  "id" | "title" | "authorName" | "createdAt" | "reviewState" | "checksPassed" | "checksTotal" | "project"
>;
export type SavedComparison = {
  a: CompareSideView;
  b: CompareSideView;
  comparison: RunComparison;
  /** Bench readings of either run beside both predictions (lib/compare-readings.ts). */
  readings: ReadingCompareRow[];
};

const predictionOf = (r: RunDetail): Prediction => ({
  measures: r.measures,
  monteCarlo: r.result?.monteCarlo?.measures,
});

function side(r: RunDetail): CompareSideView {
  const { id, title, authorName, createdAt, reviewState, checksPassed, checksTotal, project } = r;
  return { id, title, authorName, createdAt, reviewState, checksPassed, checksTotal, project };
}

/** Compares two saved runs the caller may both see (either one hidden → NotFoundError). */
export async function compareSavedRuns(actor: Actor, aId: string, bId: string): Promise<SavedComparison> {
  const [a, b] = await Promise.all([getRun(actor, aId), getRun(actor, bId)]);
  const comparison = compareRuns(
    { netlist: a.netlist, result: a.result },
    { netlist: b.netlist, result: b.result },
  );
  const byRun = await readingsOfRuns([a.id, b.id]);
  const readings = compareReadings(
    { a: byRun.get(a.id) ?? [], b: a.id === b.id ? [] : (byRun.get(b.id) ?? []) },
    { a: predictionOf(a), b: predictionOf(b) },
  );
  return { a: side(a), b: side(b), comparison, readings };
}
