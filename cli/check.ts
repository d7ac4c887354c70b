/**
 * `phasewright check PATTERN… [--report junit|json FILE]… [--jobs N] [--against RUN [--tolerance NAME=LIMIT]…]`
 *
 * Solves every design the patterns name (in parallel, cli/pool.ts), prints a line per design and per
 * failed check, writes the reports, and returns the exit code: 0 every check passes (and every
 * measure is within its limit of the baseline), 1 a check fails or a measure moved too far,
 * 2 a design has netlist errors, 3 the command could not do its job (arguments, no files, baseline).
 */
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { type Baseline, fetchBaseline, judgeAgainst } from "./against";
import { parseCheckArgs } from "./args";
import { expandPattern } from "./glob";
import { againstLines, designLines, summaryLine } from "./output";
import { solveAll } from "./pool";
import { type CheckedDesign, type CheckRun, jsonReport, junitReport } from "./report";

export interface Io {
  out: (s: string) => void;
  err: (s: string) => void;
  cwd: string;
  env: Record<string, string | undefined>;
  version: string;
}

export const EXIT = { pass: 0, fail: 1, netlist: 2, usage: 3 } as const;

function exitCode(designs: CheckedDesign[]): number {
  if (designs.some((d) => d.status === "error")) return EXIT.netlist;
  return designs.some((d) => d.status === "fail") ? EXIT.fail : EXIT.pass;
}

export async function check(args: string[], io: Io): Promise<number> {
  const t0 = performance.now();
  const startedAt = new Date().toISOString();
  const parsed = parseCheckArgs(args);
  if ("error" in parsed) {
    io.err(`phasewright check: ${parsed.error}\n(see phasewright help)\n`);
    return EXIT.usage;
  }
  const files: string[] = [];
  for (const p of parsed.patterns) {
    const found = expandPattern(p, io.cwd);
    if (found.length === 0) {
      io.err(`phasewright check: no file matches ${p}\n`);
      return EXIT.usage;
    }
    for (const f of found) if (!files.includes(f)) files.push(f);
  }
  let baseline: Baseline | null = null;
  if (parsed.against !== null) {
    if (files.length !== 1) {
      io.err(
        `phasewright check: --against compares one design with one run; ${files.length} designs given\n`,
      );
      return EXIT.usage;
    }
    const b = await fetchBaseline(parsed.against, io.env);
    if ("error" in b) {
      io.err(`phasewright check: ${b.error}\n`);
      return EXIT.usage;
    }
    baseline = b;
  }
  const outcomes = await solveAll(files, io.cwd, { jobs: parsed.jobs, keep: baseline !== null });
  const designs: CheckedDesign[] = outcomes.map((o) => {
    if (!baseline || !o.result || !o.netlist) return o;
    const against = judgeAgainst(baseline, o.netlist, o.result, parsed.tolerances);
    return { ...o, against, status: o.status === "pass" && !against.ok ? "fail" : o.status };
  });
  for (const d of designs) {
    io.out(`${designLines(d).join("\n")}\n`);
    if (d.against) io.out(`${againstLines(d.against).join("\n")}\n`);
  }
  const ms = performance.now() - t0;
  io.out(`${summaryLine(designs, ms)}\n`);
  const run: CheckRun = { version: io.version, startedAt, ms, designs };
  for (const r of parsed.reports) {
    try {
      const file = path.resolve(io.cwd, r.file);
      mkdirSync(path.dirname(file), { recursive: true });
      writeFileSync(file, r.format === "junit" ? junitReport(run) : jsonReport(run));
    } catch (error) {
      io.err(
        `phasewright check: cannot write ${r.file}: ${error instanceof Error ? error.message : error}\n`,
      );
      return EXIT.usage;
    }
  }
  return exitCode(designs);
}
