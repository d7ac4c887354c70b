import type { QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";

/**
 * A run's result is written once and read whole, never queried inside: store it as `json` (the
 * text as sent, checked but not converted to jsonb's binary form) and compress it with lz4 rather
 * than PostgreSQL's default pglz. For a 10 000-point × 8-trace result this takes the insert from
 * about 230 ms to about 75 ms and a read-and-parse from about 145 ms to about 60 ms on the
 * development machine (DEVELOPERS.md, "Benchmarks"). A server built without lz4 keeps its default
 * compression; everything else works the same.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.sequelize.query("ALTER TABLE runs ALTER COLUMN result TYPE json USING result::json", {
      transaction,
    });
    await qi.sequelize.query(
      `DO $$ BEGIN
         ALTER TABLE runs ALTER COLUMN result SET COMPRESSION lz4;
       EXCEPTION WHEN feature_not_supported OR invalid_parameter_value THEN
         RAISE NOTICE 'lz4 is not available on this server: the result keeps the default compression';
       END $$`,
      { transaction },
    );
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.sequelize.query("ALTER TABLE runs ALTER COLUMN result SET COMPRESSION default", { transaction });
    await qi.sequelize.query("ALTER TABLE runs ALTER COLUMN result TYPE jsonb USING result::jsonb", {
      transaction,
    });
  });
};
