#!/usr/bin/env node
// The `phasewright` command. The work is in dist-cli/phasewright.mjs, built from cli/*.ts by
// scripts/build-cli.mjs (run by `npm ci`, `npm install` and `npm run build:cli`).
import { existsSync } from "node:fs";
import { setFlagsFromString } from "node:v8";

// A command lives for one solve or one batch: keep the young generation at the size it starts
// with instead of doubling it as allocation goes on. Each doubling maps fresh memory, and in a
// short process those first touches (page faults) cost more than the extra minor collections
// they save: a 1 000-section netlist solved ~30 ms sooner, a 1 000-sample Monte Carlo no slower
// (scripts/bench-cli.ts). Set before the bundle is loaded; the flag is read at each collection.
setFlagsFromString("--semi-space-growth-factor=1");

const built = new URL("../dist-cli/phasewright.mjs", import.meta.url);
if (existsSync(built)) {
  await import(built.href);
} else {
  process.stderr.write(
    "phasewright: the command is not built yet — run `npm run build:cli` in the project (npm ci does it too)\n",
  );
  process.exitCode = 3;
}
