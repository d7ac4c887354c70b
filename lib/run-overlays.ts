/**
 * Bench data overlaid on a run's plot: chosen per run from its project's measurements (none by
 * default). The table `run_bench_overlays` is read and written only here.
 */

import type { Transaction } from "sequelize";
import { authorizeRun } from "@/lib/authz";
import { Measurement, type MeasurementData, sequelize } from "@/lib/db";
import { BadRequestError, withDb } from "@/lib/errors";
import type { Actor } from "@/lib/session";

/** At most this many data sets on one plot (each gets its own symbol). */
export const MAX_OVERLAYS = 6;

/** The ids of the measurements a run overlays, in the order they were attached. */
export async function overlayIds(runId: string): Promise<string[]> {
  const rows = (await withDb(() =>
    sequelize.query(
      "SELECT measurement_id AS id FROM run_bench_overlays WHERE run_id = :runId ORDER BY position",
      { replacements: { runId }, type: "SELECT" },
    ),
  )) as { id: string }[];
  return rows.map((r) => r.id);
}

/** The data sets a run overlays, with their points, in the order they were attached. */
export async function overlaidData(
  runId: string,
): Promise<{ id: string; name: string; data: MeasurementData }[]> {
  const ids = await overlayIds(runId);
  if (ids.length === 0) return [];
  const rows = await withDb(() =>
    Measurement.findAll({ where: { id: ids }, attributes: ["id", "name", "data"] }),
  );
  const byId = new Map(rows.map((m) => [m.id, { id: m.id, name: m.name, data: m.data }]));
  return ids.flatMap((id) => byId.get(id) ?? []);
}

/**
 * Sets which measurements a run overlays (designers and owners: the right to upload bench data).
 * Every id must be a measurement of the run's project; the list replaces the old one atomically.
 */
export async function setOverlays(actor: Actor, runId: string, ids: readonly string[]): Promise<string[]> {
  const { run } = await authorizeRun(actor.userId, runId, "measurement:upload");
  const unique = [...new Set(ids)];
  if (unique.length > MAX_OVERLAYS) {
    throw new BadRequestError(`At most ${MAX_OVERLAYS} bench data sets on one plot.`, {
      fields: { measurementIds: [`Choose at most ${MAX_OVERLAYS}.`] },
    });
  }
  await withDb(() =>
    sequelize.transaction(async (transaction) => {
      const found = unique.length
        ? await Measurement.count({ where: { id: unique, projectId: run.projectId }, transaction })
        : 0;
      if (found !== unique.length) {
        throw new BadRequestError("Only bench data of this run's project can be overlaid.", {
          fields: { measurementIds: ["Not a measurement of this project."] },
        });
      }
      await writeOverlays(runId, unique, transaction);
    }),
  );
  return unique;
}

/**
 * Replaces a run's overlay list in the caller's transaction (no checks: `setOverlays` checks; the demo
 * seed writes its own). The list's order is kept as `position`, which each set's symbol follows.
 */
export async function writeOverlays(
  runId: string,
  ids: readonly string[],
  transaction: Transaction,
): Promise<void> {
  await sequelize.query("DELETE FROM run_bench_overlays WHERE run_id = :runId", {
    replacements: { runId },
    transaction,
  });
  if (ids.length === 0) return;
  await sequelize.query(
    `INSERT INTO run_bench_overlays (run_id, measurement_id, position)
     SELECT :runId, t.id, t.n FROM unnest(ARRAY[:ids]::uuid[]) WITH ORDINALITY AS t(id, n)`,
    { replacements: { runId, ids: [...ids] }, transaction },
  );
}
