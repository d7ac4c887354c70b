/**
 * `npm run worker`: works the run-solve job queue (lib/jobs.ts) on DATABASE_URL until SIGTERM or
 * SIGINT, then stops cleanly (the running job may finish within 30 s; the queue expires it
 * otherwise). Start as many as you like, on as many machines as reach the database.
 * Env: WORKER_THREADS (Monte Carlo threads per job; default the cores, at most 4).
 */

import { startRunSolveWorker } from "../lib/job-runner";
import { stopBoss } from "../lib/jobs";
import { startOutboxPump, stopOutboxPump } from "../lib/mail/outbox";
import { startSampleWorkers, stopSampleWorkers } from "../solver/parallel";

async function main(): Promise<void> {
  const threads = process.env.WORKER_THREADS ? Number(process.env.WORKER_THREADS) : undefined;
  // Start the sample threads now, so the first job does not wait for them.
  await startSampleWorkers(threads).catch((error) => console.warn("[worker] sample threads:", error));
  await startRunSolveWorker({ threads });
  // Workers also send the e-mail outbox, so mail goes out even when no web server is running.
  startOutboxPump();
  console.log(`[worker] pid ${process.pid} working the run-solve queue`);
  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`[worker] ${signal}: stopping`);
    try {
      stopOutboxPump();
      await stopBoss({ graceful: true, timeout: 30_000 });
      await stopSampleWorkers();
      const { sequelize } = await import("../lib/db");
      await sequelize.close();
    } finally {
      process.exit(0);
    }
  };
  process.on("SIGTERM", () => void stop("SIGTERM"));
  process.on("SIGINT", () => void stop("SIGINT"));
}

main().catch((error) => {
  console.error("[worker] failed to start:", error);
  process.exit(1);
});
