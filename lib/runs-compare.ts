import { compareRuns, type RunComparison } from "@/lib/compare";
import { getRun, type RunDetail } from "@/lib/runs";
import type { Actor } from "@/lib/session";

export type CompareSideView = Pick<
  RunDetail,
  "id" | "title" | "authorName" | "createdAt" | "reviewState" | "checksPassed" | "checksTotal" | "project"
>;
export type SavedComparison = { a: CompareSideView; b: CompareSideView; comparison: RunComparison };

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
  return { a: side(a), b: side(b), comparison };
}
