#!/usr/bin/env node
// The `phasewright` command. The work is in dist-cli/phasewright.mjs, built from cli/*.ts by
// scripts/build-cli.mjs (run by `npm ci`, `npm install` and `npm run build:cli`).
import { existsSync } from "node:fs";
import { setFlagsFromString } from "node:v8";

// Three V8 settings for a short process, set before the bundle is loaded (each is read as the
// process goes; scripts/bench-cli.ts measures the command with them):
// - keep the young generation at the size it starts with instead of doubling it as allocation goes
//   on: each doubling maps fresh memory, and in a short process those first touches (page faults)
//   cost more than the extra minor collections they save (a 1 000-section netlist ~30 ms sooner);
// - no on-stack replacement: the command's heavy loops sit in functions called once per point or
//   per sample, which the optimizing compiler takes up on their next call anyway; compiling a second,
//   on-stack version of each first held up those compiles while the first points ran interpreted
//   (the 1 000-section netlist ~13 ms sooner, a 1 000-sample Monte Carlo and the 10 000-section
//   ladder no slower; since the LU's kernels are WebAssembly it makes no difference to the ladder);
// - a 4× interrupt budget (the bytecode a function runs before V8 weighs optimizing it): code that
//   runs for one netlist — the language, building the system, the first point's analysis — no
//   longer gets optimized just as it finishes (the front end's functions queued ~100 ms of
//   optimizing work that held up the kernels'), while the per-point code still reaches it within
//   a few points (the 1 000-section netlist's solve ~15 ms shorter, the examples 5–50 ms sooner,
//   the 10 000-section ladder unchanged; with the kernels in WebAssembly, the default budget still
//   makes the 1 000-section ladder ~10 ms slower).
setFlagsFromString("--semi-space-growth-factor=1");
setFlagsFromString("--no-use-osr");
setFlagsFromString("--interrupt-budget=270336");

const built = new URL("../dist-cli/phasewright.mjs", import.meta.url);
if (existsSync(built)) {
  await import(built.href);
} else {
  process.stderr.write(
    "phasewright: the command is not built yet — run `npm run build:cli` in the project (npm ci does it too)\n",
  );
  process.exitCode = 3;
}
