/**
 * How a run's solve is stored, known here only. The columns derived from a solve are written by the
 * request that solves it inline (lib/runs.ts), by the queue's worker (lib/job-runner.ts) and by the
 * seed alike; the result is kept in its compact form (solver/stored.ts: traces as re/im) and rebuilt
 * on read. The two reads that stay inside PostgreSQL (a result can be megabytes) are here too, so no
 * other module names a key of the stored result.
 */
import { QueryTypes } from "sequelize";
import { sequelize } from "@/lib/db";
import type { Prediction } from "@/lib/reading-math";
import { compactResult, expandResult, type StoredResult } from "@/solver";
import type { MeasureResult, MeasureStats, SolveSuccess } from "@/solver/types";

/** The run columns a solve fills. */
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

/** The solve as stored in `runs.result`, rebuilt (dB and degrees from re/im); null before a solve. */
export function storedResult(column: unknown): SolveSuccess | null {
  return column ? expandResult(column as StoredResult) : null;
}

/** The sweep's range and trace names of a saved run (what a comment pin is checked against). */
export type SweepFacts = { lo: number | null; hi: number | null; traces: string[] };

/** A run's sweep facts, read inside PostgreSQL; null when the run has no result (yet). */
export async function sweepFacts(runId: string): Promise<SweepFacts | null> {
  const rows = await sequelize.query<SweepFacts>(
    `SELECT (SELECT min(f::float8) FROM json_array_elements_text(result->'frequencies') f) AS lo,
            (SELECT max(f::float8) FROM json_array_elements_text(result->'frequencies') f) AS hi,
            ARRAY(SELECT t->>'name' FROM json_array_elements(result->'traces') t) AS traces
       FROM runs WHERE id = :runId AND result IS NOT NULL`,
    { replacements: { runId }, type: QueryTypes.SELECT },
  );
  return rows[0] ?? null;
}

/** A run's measures and Monte Carlo statistics (what a bench reading is compared with), read inside PostgreSQL. */
export async function storedPrediction(runId: string): Promise<Prediction> {
  const rows = await sequelize.query<{ measures: unknown; mc: unknown }>(
    `SELECT measures, result->'monteCarlo'->'measures' AS mc FROM runs WHERE id = :runId`,
    { replacements: { runId }, type: QueryTypes.SELECT },
  );
  const row = rows[0];
  return {
    measures: Array.isArray(row?.measures) ? (row.measures as MeasureResult[]) : [],
    monteCarlo: Array.isArray(row?.mc) ? (row.mc as MeasureStats[]) : undefined,
  };
}
