import path from "node:path";
import type { QueryInterface, Sequelize } from "sequelize";
import { SequelizeStorage, Umzug } from "umzug";

const MIGRATIONS_DIR = path.resolve(__dirname, "../../migrations");

interface MigrationModule {
  up: (params: { context: QueryInterface }) => Promise<void>;
  down?: (params: { context: QueryInterface }) => Promise<void>;
}

/**
 * The umzug migrator for `migrations/<YYYYMMDDHHMM>-<change>.ts` (files starting with "_" are helpers).
 * Modules are loaded with `import()` so the same code runs under tsx and under vitest.
 * Applied names (without extension) are stored in the "SequelizeMeta" table.
 */
export function createMigrator(sequelize: Sequelize, logger: Console | undefined = undefined) {
  return new Umzug<QueryInterface>({
    migrations: {
      glob: ["[0-9]*.ts", { cwd: MIGRATIONS_DIR }],
      resolve: ({ name, path: file, context }) => {
        const load = async (): Promise<MigrationModule> => import(file!) as Promise<MigrationModule>;
        return {
          name: name.replace(/\.ts$/, ""),
          up: async () => (await load()).up({ context }),
          down: async () => {
            const mod = await load();
            if (!mod.down) throw new Error(`Migration ${name} has no down step`);
            await mod.down({ context });
          },
        };
      },
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "SequelizeMeta" }),
    logger,
  });
}
