import { type PreviewResult, type PreviewStudy, studiesInWords } from "@/lib/preview-stages";
import type { NetlistError, SolveSuccess } from "@/solver/types";

/** What the live preview knows: the text on screen and the answers it has for some text. */
export interface PreviewInput {
  /** The netlist in the editor now. */
  text: string;
  /**
   * The newest answer and the text it was solved from (may be an older text while typing). It may be
   * the sweep-first answer (lib/preview-stages.ts) whose `pending` studies are still on their way.
   */
  answer: { text: string; result: PreviewResult } | null;
  /** The last answer that solved, with its text. */
  lastGood: { text: string; result: SolveSuccess } | null;
  /** The last answer that solved with all its studies (nothing pending), with its text. */
  lastComplete: { text: string; result: SolveSuccess } | null;
  /** A request for the text on screen is waiting for its debounce or in flight. */
  pending: boolean;
  /** The request for the text on screen failed (network, HTTP) — not a netlist error. */
  failure: string | null;
  /** Errors of a refused save, for the text on screen (they replace the preview's). */
  saveErrors: NetlistError[];
}

/** The studies' panel (verdict, poles, Monte Carlo, vary, sensitivity, steady) beside a result. */
export type AnalysesView = { result: SolveSuccess; stale: boolean } | null;

/**
 * What the preview may show. The rule: a plot, measures and verdicts are shown only for the text on
 * screen — or, while the user is typing and the new answer is on its way, the last good one marked
 * stale. A netlist with errors shows no result at all ("No result — N errors"), and N is the length of
 * the one error list shown, so every count on the page agrees.
 *
 * The plot, measures and checks come from the first answer for the text (the nominal sweep); the
 * studies (`analyses`) only from an answer that holds them all: while they are still being solved,
 * the last complete ones are shown marked stale, and nothing once their request has failed.
 */
export type PreviewView =
  | { kind: "empty" }
  | { kind: "solving" }
  | {
      kind: "result";
      result: SolveSuccess;
      stale: boolean;
      analyses: AnalysesView;
      /** Studies of the text on screen still being solved. */
      pendingStudies: PreviewStudy[];
      /** Why the studies of the text on screen were not solved (their request failed). */
      studiesFailure: string | null;
    }
  | { kind: "errors"; errors: NetlistError[]; checking: boolean }
  | { kind: "failed"; message: string };

export function previewView(input: PreviewInput): PreviewView {
  if (input.text.trim() === "") return { kind: "empty" };
  if (input.saveErrors.length > 0) return { kind: "errors", errors: input.saveErrors, checking: false };
  const answer = input.answer;
  const current = answer && answer.text === input.text ? answer.result : null;
  // The last complete studies, marked stale, while the ones for the text on screen are on their way.
  const staleAnalyses: AnalysesView =
    input.pending && input.lastComplete ? { result: input.lastComplete.result, stale: true } : null;
  if (current) {
    if (!current.ok) return { kind: "errors", errors: current.errors, checking: false };
    const result = current;
    const pendingStudies = current.pending ?? [];
    if (pendingStudies.length === 0) {
      return {
        kind: "result",
        result,
        stale: false,
        analyses: { result, stale: false },
        pendingStudies,
        studiesFailure: null,
      };
    }
    const failed = !input.pending && input.failure ? input.failure : null;
    return {
      kind: "result",
      result,
      stale: false,
      analyses: failed ? null : staleAnalyses,
      pendingStudies: failed ? [] : pendingStudies,
      studiesFailure: failed ? `${studiesInWords(pendingStudies)} could not be solved: ${failed}` : null,
    };
  }
  if (!input.pending && input.failure) return { kind: "failed", message: input.failure };
  // Typing, or waiting for the answer to the text on screen.
  if (answer && !answer.result.ok) return { kind: "errors", errors: answer.result.errors, checking: true };
  if (input.lastGood) {
    return {
      kind: "result",
      result: input.lastGood.result,
      stale: true,
      analyses: staleAnalyses,
      pendingStudies: [],
      studiesFailure: null,
    };
  }
  return { kind: "solving" };
}

/** The words of the preview's status line. */
export function previewStatus(view: PreviewView): string {
  switch (view.kind) {
    case "empty":
      return "No result — type a netlist to see its response.";
    case "solving":
      return "Solving…";
    case "failed":
      return `No result — ${view.message}`;
    case "errors": {
      const n = view.errors.length;
      const head = `No result — ${n} ${n === 1 ? "error" : "errors"}`;
      return view.checking ? `${head} (checking your edit…)` : `${head}.`;
    }
    case "result": {
      if (view.stale) return "Updating… the plot below is from before your last edit.";
      const s = view.result.stats;
      const solved = `Solved ${s.points.toLocaleString("en")} points, ${s.nodes} nodes, in ${s.solveMs.toFixed(1)} ms`;
      if (view.studiesFailure) return `${solved}; ${view.studiesFailure}`;
      if (view.pendingStudies.length > 0)
        return `${solved}; still solving ${studiesInWords(view.pendingStudies)}…`;
      return `${solved}.`;
    }
  }
}
