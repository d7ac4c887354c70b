import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";
import { createdAtOnly, fk, uuidPk } from "./_columns";

/**
 * Bench readings of a run: what the bench measured (a frequency, an oscilloscope period, an
 * amplitude), how it was read, and an optional attachment kept in the object store (only its key,
 * type, size and original name are here). A reading goes with its run; its author is kept.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      "bench_readings",
      {
        id: uuidPk,
        run_id: fk("runs", "CASCADE"),
        author_id: fk("users", "RESTRICT"),
        measure_name: { type: DataTypes.STRING(100), allowNull: true },
        quantity: { type: DataTypes.ENUM("frequency", "period", "amplitude"), allowNull: false },
        input_form: { type: DataTypes.ENUM("value", "divisions", "peak", "peak_to_peak"), allowNull: false },
        value: { type: DataTypes.DOUBLE, allowNull: true },
        divisions: { type: DataTypes.DOUBLE, allowNull: true },
        per_division: { type: DataTypes.DOUBLE, allowNull: true },
        node: { type: DataTypes.STRING(100), allowNull: true },
        note: { type: DataTypes.TEXT, allowNull: true },
        attachment_key: { type: DataTypes.STRING(300), allowNull: true },
        attachment_type: { type: DataTypes.STRING(100), allowNull: true },
        attachment_size: { type: DataTypes.INTEGER, allowNull: true },
        attachment_name: { type: DataTypes.STRING(255), allowNull: true },
        ...createdAtOnly,
      },
      { transaction },
    );
    await qi.addIndex("bench_readings", ["run_id", "created_at"], {
      name: "bench_readings_run_id_created_at",
      transaction,
    });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable("bench_readings", { transaction });
    await qi.sequelize.query('DROP TYPE IF EXISTS "enum_bench_readings_quantity"', { transaction });
    await qi.sequelize.query('DROP TYPE IF EXISTS "enum_bench_readings_input_form"', { transaction });
  });
};
