// vitest globalSetup for the integration project: make sure the test database exists and is migrated.
import { mkdirSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import S3rver from "s3rver";
import { Sequelize } from "sequelize";
import { createMigrator } from "../../scripts/lib/migrator";
import { testDatabaseUrl } from "./test-db-url";

function answers(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host: "127.0.0.1", port }, () => {
      socket.end();
      resolve(true);
    });
    socket.on("error", () => resolve(false));
  });
}

/** The test object store fake: the one scripts/test.sh started, or one of our own for a hand run. */
async function ensureObjectStore(): Promise<(() => Promise<void>) | undefined> {
  if (process.env.S3_ENDPOINT) return undefined;
  const port = Number(process.env.E2E_S3_PORT || "4527");
  if (await answers(port)) return undefined;
  // The folder must exist when the fake resets it on close, even if no test stored an object.
  const directory = path.resolve(".data/s3-test-vitest");
  mkdirSync(directory, { recursive: true });
  const fake = new S3rver({ address: "127.0.0.1", port, silent: true, directory, resetOnClose: true });
  await fake.run();
  return () => fake.close();
}

export default async function setup(): Promise<(() => Promise<void>) | undefined> {
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
  return ensureObjectStore();
}
