/**
 * Start-up and fresh-process figures of the `phasewright` command (part of `npm run bench`; not a
 * test). Measured in one run, side by side:
 *  - a small netlist's summary through the built command and through today's tsx path
 *    (`tsx solver/cli.ts`): goal < 300 ms for the command;
 *  - the 1 000-section RC ladder × 1 000 points through the command in a fresh process, minus the
 *    same command on a 10-section ladder (start-up, a cold JIT), over the hand-specialized
 *    tridiagonal solve of the same ladder (scripts/bench.ts `tridiagonalMs`, timed before, between
 *    and after the rounds, the best kept): goal within 6×. Judged, like the limit and every engine row of
 *    scripts/bench.ts, on the best round of each (a shared machine's load only adds time, so the
 *    best is the closest reading of the work itself, and a ratio compares like with like); the
 *    medians are printed beside it to show the spread;
 *  - the 10 000-section ladder through the command (no goal; a check that nothing grows faster
 *    than the sweep).
 * Needs the built command (scripts/bench.sh builds it).
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { sweepFrequencies } from "../solver/engine/sweep";
import { tridiagonalMs } from "./bench";
import { ladderNetlist } from "./bench-ladder";

const ROOT = path.resolve(__dirname, "..");
const SMALL = path.join(ROOT, "solver/examples/lowpass-2nd-order.pwn");

/** Wall time (ms) of one fresh process; throws when it fails. */
function once(argv: string[]): number {
  const t0 = performance.now();
  const r = spawnSync(argv[0]!, argv.slice(1), { cwd: ROOT, encoding: "utf8" });
  const ms = performance.now() - t0;
  if (r.status !== 0) throw new Error(`${argv.join(" ")} exited ${r.status}: ${r.stderr}`);
  return ms;
}

/**
 * Rounds of the two ladders (taking turns). This machine's load moves a fresh process's wall time by
 * ±30 % within seconds: with 15 rounds the difference of the two medians still moved by ±15 % from
 * one run of the bench to the next (3.4–6.5× within an hour); 40 rounds (~20 s) halve that spread.
 */
const ROUNDS = 40;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

/**
 * Wall times (ms) of `runs` fresh processes of each command, the commands taking turns (one of
 * each per round): a shared machine's load drifts within seconds, and taking turns lets the drift
 * fall on every command alike rather than on whichever ran last. Each command's median, and its
 * best (the statistic of the limit and of the engine's rows in scripts/bench.ts: load only adds).
 */
function timings(
  commands: string[][],
  runs: number,
  eachRound?: () => void,
): { median: number; best: number }[] {
  const times = commands.map(() => [] as number[]);
  for (let r = 0; r < runs; r++) {
    for (const [i, argv] of commands.entries()) times[i]!.push(once(argv));
    eachRound?.();
  }
  return times.map((t) => ({ median: median(t), best: Math.min(...t) }));
}

/** Median wall times (ms), as `timings`. */
const walls = (commands: string[][], runs: number) => timings(commands, runs).map((t) => t.median);

function main(): void {
  const node = process.execPath;
  const bin = path.join(ROOT, "bin/phasewright.mjs");
  const tsx = path.join(ROOT, "node_modules/.bin/tsx");
  const dir = mkdtempSync(path.join(tmpdir(), "pw-bench-cli-"));
  const ladder = (n: number) => {
    const file = path.join(dir, `ladder-${n}.pwn`);
    writeFileSync(file, ladderNetlist(n));
    return file;
  };
  const [small] = walls([[node, bin, "solve", SMALL]], 7);
  const [viaTsx] = walls([[tsx, "solver/cli.ts", SMALL]], 3);
  const freqs = sweepFrequencies({ kind: "log", start: 10, stop: 10e3, perDecade: 333 });
  if (typeof freqs === "string" || freqs.length !== 1000)
    throw new Error("the ladder's sweep is not 1 000 points");
  // The limit is timed in the same window as the ladders — before the rounds (its JIT warm-up),
  // once after every round and after them — and its best kept: a busy spell on this shared machine
  // slows the limit's CPU time as well (up to ~20 %), and a best taken over fewer or other minutes
  // than the ladders' would make the ratio read the machine rather than the command.
  const limits = [tridiagonalMs(1000, freqs, 7).ms];
  const [t10, t1000] = timings(
    [
      [node, bin, "solve", ladder(10)],
      [node, bin, "solve", ladder(1000)],
    ],
    ROUNDS,
    () => limits.push(tridiagonalMs(1000, freqs, 1).ms),
  );
  const l10 = t10!.median;
  const l1000 = t1000!.median;
  limits.push(tridiagonalMs(1000, freqs, 7).ms);
  const limit = Math.min(...limits);
  const [l10000] = walls([[node, bin, "solve", ladder(10_000)]], 3);
  const sweep = l1000 - l10;
  const bestSweep = t1000!.best - t10!.best;
  console.log("case | ms (medians unless the row says otherwise) | goal");
  console.log("--- | --- | ---");
  console.log(`small netlist summary, \`phasewright solve\` (fresh process) | ${small!.toFixed(0)} | < 300`);
  console.log(
    `the same through tsx (\`tsx solver/cli.ts\`, the old \`npm run solve\`) | ${viaTsx!.toFixed(0)} | —`,
  );
  console.log(`RC ladder 10 sections × 1 000 points, \`phasewright solve\` | ${l10.toFixed(0)} | —`);
  console.log(`RC ladder 1 000 sections × 1 000 points, \`phasewright solve\` | ${l1000.toFixed(0)} | —`);
  console.log(`RC ladder 10 000 sections × 1 000 points, \`phasewright solve\` | ${l10000!.toFixed(0)} | —`);
  console.log(
    `1 000 − 10 sections (the sweep without start-up), each ladder's best of ${ROUNDS} rounds, over the ` +
      `tridiagonal limit (${limit.toFixed(1)} ms, its best in the same minutes) | ${bestSweep.toFixed(0)} = ` +
      `${(bestSweep / limit).toFixed(1)}× | ≤ 6×`,
  );
  console.log(
    `the same from the ladders' medians (the spread a shared machine adds) | ` +
      `${sweep.toFixed(0)} = ${(sweep / limit).toFixed(1)}× | —`,
  );
}

main();
