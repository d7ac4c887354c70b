import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";
import { fk, timestamps } from "./_columns";

/**
 * Progress of a run solved by the job queue (lib/jobs.ts): one row per queued run. The queue itself
 * (pg-boss) keeps its own tables in the "pgboss" schema; this row is what the run page polls.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      "run_jobs",
      {
        run_id: { ...fk("runs", "CASCADE"), primaryKey: true },
        job_id: { type: DataTypes.STRING(64), allowNull: true },
        state: {
          type: DataTypes.ENUM("queued", "running", "ok", "failed", "cancelled"),
          allowNull: false,
          defaultValue: "queued",
        },
        progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        cancel_requested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        error: { type: DataTypes.TEXT, allowNull: true },
        worker: { type: DataTypes.STRING(200), allowNull: true },
        started_at: { type: DataTypes.DATE, allowNull: true },
        finished_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex("run_jobs", ["state", "updated_at"], {
      name: "run_jobs_state_updated_at",
      transaction,
    });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable("run_jobs", { transaction });
    await qi.sequelize.query('DROP TYPE IF EXISTS "enum_run_jobs_state"', { transaction });
  });
};
