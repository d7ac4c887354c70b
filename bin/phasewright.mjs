#!/usr/bin/env node
// The `phasewright` command. The work is in dist-cli/phasewright.mjs, built from cli/*.ts by
// scripts/build-cli.mjs (run by `npm ci`, `npm install` and `npm run build:cli`).
import { existsSync } from "node:fs";

const built = new URL("../dist-cli/phasewright.mjs", import.meta.url);
if (existsSync(built)) {
  await import(built.href);
} else {
  process.stderr.write(
    "phasewright: the command is not built yet — run `npm run build:cli` in the project (npm ci does it too)\n",
  );
  process.exitCode = 3;
}
