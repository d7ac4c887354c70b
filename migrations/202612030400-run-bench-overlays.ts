import type { QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";

/**
 * Which of a project's bench data sets a run overlays on its plot, chosen on the run page. Until now
 * every data set of the project was drawn on every run; now none is until someone attaches it.
 * Deleting a run or a data set removes its rows.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE run_bench_overlays (
      run_id UUID NOT NULL REFERENCES runs(id) ON DELETE CASCADE,
      measurement_id UUID NOT NULL REFERENCES measurements(id) ON DELETE CASCADE,
      position INTEGER NOT NULL,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      PRIMARY KEY (run_id, measurement_id)
    )`);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query("DROP TABLE IF EXISTS run_bench_overlays");
};
