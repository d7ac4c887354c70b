import { sequelize } from "@/lib/db";
import { seedDemo } from "../seed";
import { createMigrator } from "./migrator";

/** Used by start.sh: migrate up, then seed the demo data if missing, in one process. */
async function main(): Promise<void> {
  const done = await createMigrator(sequelize).up();
  console.log(done.length ? `migrated: ${done.map((m) => m.name).join(", ")}` : "schema up to date");
  console.log((await seedDemo()) ? "demo data seeded" : "demo data already present");
}

main()
  .catch((error: unknown) => {
    console.error("database preparation failed:", error instanceof Error ? error.message : error);
    process.exitCode = 1;
  })
  .finally(() => sequelize.close());
