import { sequelize } from "@/lib/db";
import { createMigrator } from "./lib/migrator";

/** `tsx scripts/migrate.ts up|down|status` — apply all pending, undo the last one, or list. */
async function main(): Promise<void> {
  const command = process.argv[2] ?? "up";
  const migrator = createMigrator(sequelize);
  if (command === "up") {
    const done = await migrator.up();
    console.log(done.length ? `migrated: ${done.map((m) => m.name).join(", ")}` : "schema up to date");
  } else if (command === "down") {
    const undone = await migrator.down({ step: 1 });
    console.log(undone.length ? `reverted: ${undone.map((m) => m.name).join(", ")}` : "nothing to revert");
  } else if (command === "status") {
    const [executed, pending] = await Promise.all([migrator.executed(), migrator.pending()]);
    for (const m of executed) console.log(`up       ${m.name}`);
    for (const m of pending) console.log(`pending  ${m.name}`);
  } else {
    throw new Error(`unknown command "${command}" (use up, down or status)`);
  }
}

main()
  .catch((error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exitCode = 1;
  })
  .finally(() => sequelize.close());
