import { compactResult } from "@/solver";
import type { SolveSuccess } from "@/solver/types";

/**
 * The columns of a run derived from its solve — written by the request that solves it inline
 * (lib/runs.ts) and by the queue's worker (lib/job-runner.ts) alike. The result is stored in its
 * compact form (solver/stored.ts: traces as re/im); `getRun` rebuilds dB and degrees.
 */
export function derivedRunColumns(result: SolveSuccess) {
  return {
    solverVersion: result.solverVersion,
    result: compactResult(result),
    measures: result.measures,
    checks: result.checks,
    checksPassed: result.checks.filter((c) => c.pass).length,
    checksTotal: result.checks.length,
  };
}
