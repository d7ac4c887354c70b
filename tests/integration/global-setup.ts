// vitest globalSetup for the integration project: make sure the test database exists and is migrated.
import { Sequelize } from "sequelize";
import { createMigrator } from "../../scripts/lib/migrator";
import { testDatabaseUrl } from "./test-db-url";

export default async function setup(): Promise<void> {
  const url = testDatabaseUrl();
  process.env.DATABASE_URL = url;
  const target = new URL(url);
  const dbName = target.pathname.slice(1);

  const admin = new URL(url);
  admin.pathname = "/postgres";
  const maintenance = new Sequelize(admin.toString(), { logging: false });
  try {
    const [rows] = await maintenance.query("SELECT 1 FROM pg_database WHERE datname = :dbName", {
      replacements: { dbName },
    });
    if (rows.length === 0) await maintenance.query(`CREATE DATABASE "${dbName}"`);
  } catch (error) {
    throw new Error(
      `Cannot reach the test database at ${target.host} (${(error as Error).message}). ` +
        "Start PostgreSQL with `npm start` or `npm test` first.",
    );
  } finally {
    await maintenance.close();
  }

  const db = new Sequelize(url, { logging: false });
  try {
    await createMigrator(db).up();
  } finally {
    await db.close();
  }
}
