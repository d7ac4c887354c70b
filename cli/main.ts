/**
 * Entry of the `phasewright` command, bundled to dist-cli/phasewright.mjs by scripts/build-cli.mjs
 * and started by bin/phasewright.mjs. A worker thread of `check` runs this same file (cli/pool.ts).
 */
import { isMainThread } from "node:worker_threads";
import { runCommand } from "./command";
import { serveWorker } from "./pool";

const VERSION = process.env.PHASEWRIGHT_CLI_VERSION ?? "dev";

if (!isMainThread) {
  serveWorker();
} else {
  // A reader that stops early (`| head`) is not an error.
  process.stdout.on("error", (error: NodeJS.ErrnoException) => {
    if (error.code === "EPIPE") process.exit(process.exitCode ?? 0);
    throw error;
  });
  // `npm run solve -- FILE` starts in the package folder; INIT_CWD is where the user typed it.
  const cwd =
    process.env.npm_lifecycle_event === "solve" ? (process.env.INIT_CWD ?? process.cwd()) : process.cwd();
  runCommand(process.argv.slice(2), {
    out: (s) => process.stdout.write(s),
    err: (s) => process.stderr.write(s),
    cwd,
    env: process.env,
    version: VERSION,
  }).then(
    (code) => {
      process.exitCode = code;
    },
    (error) => {
      process.stderr.write(`phasewright: internal fault: ${error instanceof Error ? error.stack : error}\n`);
      process.exitCode = 3;
    },
  );
}
