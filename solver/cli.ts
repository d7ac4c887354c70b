/**
 * Command line: `npm run --silent solve -- FILE [--json | --csv]`.
 * Prints a readable summary, the JSON result, or the traces as CSV.
 * Exit codes: 0 solved, 2 netlist errors (printed as FILE:line:col: message (hint)), 1 anything else.
 */

import { readFileSync } from "node:fs";
import path from "node:path";
import { resultToCsv } from "./csv";
import { formatQuantity } from "./format";
import { solveNetlist } from "./index";
import type { NoiseResult, SolveResult, SolveSuccess } from "./types";

const USAGE = "usage: npm run --silent solve -- FILE [--json | --csv]";

type Mode = "summary" | "json" | "csv";

/** Parsed arguments, or a message for exit code 1. */
export function parseArgs(args: string[]): { file: string; mode: Mode } | { error: string } {
  const files: string[] = [];
  const modes: Mode[] = [];
  for (const a of args) {
    if (a === "--json") modes.push("json");
    else if (a === "--csv") modes.push("csv");
    else if (a.startsWith("-")) return { error: `unknown option ${a}\n${USAGE}` };
    else files.push(a);
  }
  if (files.length !== 1)
    return {
      error:
        files.length === 0
          ? `no netlist file given\n${USAGE}`
          : `give one netlist file, not ${files.length}\n${USAGE}`,
    };
  if (modes.length > 1) return { error: `choose one of --json and --csv\n${USAGE}` };
  return { file: files[0]!, mode: modes[0] ?? "summary" };
}

/**
 * A value with its unit for the summary: the one formatter of the screens and e-mails
 * (solver/format.ts), so a frequency reads the same everywhere ("1.5915 kHz").
 */
export function formatSi(value: number, unit: string): string {
  return formatQuantity(value, unit);
}

/** A noise statement in a few lines: density at the sweep's ends, the largest contributions at its middle. */
function noiseSummary(n: NoiseResult, freqs: number[]): string[] {
  const k = Math.floor(freqs.length / 2);
  const d = (x: number | null | undefined) => (x == null ? "none" : formatSi(x, "V/√Hz"));
  const out = [`Noise ${n.name} at ${n.probe} (${Number(n.temperature.toPrecision(6))} K)`];
  out.push(
    `  ${formatSi(freqs[0] ?? 0, "Hz")}: ${d(n.density[0])}; ${formatSi(freqs[k] ?? 0, "Hz")}: ${d(n.density[k])}; ${formatSi(freqs[freqs.length - 1] ?? 0, "Hz")}: ${d(n.density[freqs.length - 1])}`,
  );
  if (n.inputDensity)
    out.push(`  referred to ${n.input} at ${formatSi(freqs[k] ?? 0, "Hz")}: ${d(n.inputDensity[k])}`);
  const total = n.density[k] ?? 0;
  const top = n.contributions
    .map((c) => ({ label: c.source === "thermal" ? c.part : `${c.part} ${c.source}`, v: c.density[k] ?? 0 }))
    .sort((a, b) => b.v - a.v)
    .slice(0, 5);
  for (const c of top) {
    const share = total > 0 ? ` (${((c.v * c.v * 100) / (total * total)).toFixed(1)} %)` : "";
    out.push(`  ${c.label}: ${d(c.v)}${share}`);
  }
  return out;
}

/** The readable summary: title, measures, checks, studies, warnings, stats. */
export function toSummary(r: SolveSuccess): string {
  const out: string[] = [r.title ?? "(untitled netlist)"];
  const width = Math.max(0, ...r.measures.map((m) => m.name.length));
  if (r.measures.length > 0) out.push("", "Measures");
  for (const m of r.measures) {
    out.push(
      `  ${m.name.padEnd(width)}  ${m.value === null ? `none — ${m.reason ?? "no value"}` : formatSi(m.value, m.unit)}`,
    );
  }
  if (r.checks.length > 0) out.push("", "Checks");
  for (const c of r.checks)
    out.push(`  ${c.pass ? "PASS" : "FAIL"}  ${c.expression}${c.reason ? ` — ${c.reason}` : ""}`);
  out.push(...studiesSummary(r), ...readingsSummary(r));
  if (r.warnings.length > 0) out.push("", "Warnings");
  for (const w of r.warnings) out.push(`  ${w.line === null ? "" : `line ${w.line}: `}${w.message}`);
  const s = r.stats;
  out.push(
    "",
    `${s.nodes} nodes, ${s.unknowns} unknowns, ${s.points} points, ${s.solveMs} ms (solver ${r.solverVersion})`,
  );
  return `${out.join("\n")}\n`;
}

/** A pole or zero: s = re ± j·im rad/s, with its frequency and Q. */
function rootText(p: { re: number; im: number; frequencyHz: number; q: number | null }): string {
  const im = `${p.im < 0 ? "-" : "+"} j${Number(Math.abs(p.im).toPrecision(6))}`;
  const q = p.q === null ? "none" : Number(p.q.toPrecision(4));
  return `s = ${Number(p.re.toPrecision(6))} ${im} rad/s (${formatSi(p.frequencyHz, "Hz")}, Q ${q}`;
}

/** The studies beyond the sweep: variants, Monte Carlo, poles and zeros. */
function studiesSummary(r: SolveSuccess): string[] {
  const out: string[] = [];
  if (r.variants?.length) {
    out.push("", "Variants");
    for (const v of r.variants) {
      const ms = v.measures
        .map((m) => `${m.name}=${m.value === null ? "none" : formatSi(m.value, m.unit)}`)
        .join(", ");
      out.push(`  ${v.name} = ${Number(v.value.toPrecision(6))}: ${ms}`);
    }
  }
  if (r.monteCarlo) {
    const mc = r.monteCarlo;
    out.push(
      "",
      `Monte Carlo: ${mc.samples} samples, seed ${mc.seed}, ${(mc.yield * 100).toFixed(1)} % pass every check`,
    );
    for (const m of mc.measures) {
      const unit = r.measures.find((x) => x.name === m.name)?.unit ?? "";
      const f = (v: number | null) => (v === null ? "none" : formatSi(v, unit));
      out.push(`  ${m.name}: mean ${f(m.mean)}, std ${f(m.std)}, min ${f(m.min)}, max ${f(m.max)}`);
    }
  }
  if (r.poles) {
    out.push("", "Poles");
    for (const p of r.poles) {
      const grow = p.growthPerCycle === null ? "" : `, ×${Number(p.growthPerCycle.toPrecision(6))} per cycle`;
      out.push(`  ${rootText(p)}${grow})`);
    }
  }
  if (r.zeros?.length) {
    out.push("", "Zeros");
    for (const z of r.zeros) out.push(`  ${z.probe}: ${rootText(z)})`);
  }
  return out;
}

/** Noise, group delay, the steady oscillation and the sensitivities. */
function readingsSummary(r: SolveSuccess): string[] {
  const out: string[] = [];
  for (const n of r.noise ?? []) out.push("", ...noiseSummary(n, r.frequencies));
  const delays = r.traces.filter((t) => t.groupDelay?.some((d) => d !== null));
  if (delays.length > 0) {
    out.push("", "Group delay (over the sweep)");
    for (const t of delays) {
      const d = t.groupDelay!.filter((x): x is number => x !== null);
      out.push(`  ${t.name}: ${formatSi(Math.min(...d), "s")} … ${formatSi(Math.max(...d), "s")}`);
    }
  }
  if (r.steady) {
    const st = r.steady;
    out.push("", `Steady oscillation of loop ${st.loop}: ${st.summary}`);
    for (const p of st.probes)
      out.push(
        `  ${p.probe}: ${formatSi(p.amplitudes[0] ?? 0, p.probe.startsWith("amps") ? "A" : "V")} peak, THD ${Number(p.thdPercent.toPrecision(3))} %`,
      );
    for (const n of st.notes) out.push(`  note: ${n}`);
  }
  if (r.sensitivity?.length) {
    out.push("", "Sensitivity");
    for (const s of r.sensitivity)
      out.push(`  ${s.measure} to ${s.part}: ${s.value === null ? "none" : Number(s.value.toPrecision(4))}`);
  }
  return out;
}

/**
 * Run the command; returns the exit code. Output goes through the given writers (for tests).
 * FILE is read relative to `cwd` (default: where the user typed `npm run solve`, else this process's).
 */
export function run(
  args: string[],
  stdout: (s: string) => void,
  stderr: (s: string) => void,
  cwd: string = process.env.INIT_CWD ?? process.cwd(),
): number {
  const parsed = parseArgs(args);
  if ("error" in parsed) {
    stderr(`${parsed.error}\n`);
    return 1;
  }
  let text: string;
  try {
    // `npm run` starts scripts in the package folder; INIT_CWD is where the user typed the command.
    text = readFileSync(path.resolve(cwd, parsed.file), "utf8");
  } catch (error) {
    stderr(`cannot read ${parsed.file}: ${error instanceof Error ? error.message : String(error)}\n`);
    return 1;
  }
  let result: SolveResult;
  try {
    result = solveNetlist(text);
  } catch (error) {
    stderr(
      `internal fault while solving ${parsed.file}: ${error instanceof Error ? error.message : String(error)}\n`,
    );
    return 1;
  }
  if (!result.ok) {
    if (parsed.mode === "json") stdout(`${JSON.stringify(result, null, 2)}\n`);
    else
      for (const e of result.errors)
        stderr(`${parsed.file}:${e.line}:${e.column}: ${e.message}${e.hint ? ` (${e.hint})` : ""}\n`);
    return 2;
  }
  stdout(
    parsed.mode === "json"
      ? `${JSON.stringify(result, null, 2)}\n`
      : parsed.mode === "csv"
        ? resultToCsv(result)
        : toSummary(result),
  );
  return 0;
}

if (process.argv[1] && /cli\.[cm]?[tj]s$/.test(process.argv[1])) {
  // A reader that stops early (`| head`) is not an error.
  process.stdout.on("error", (error: NodeJS.ErrnoException) => {
    if (error.code === "EPIPE") process.exit(process.exitCode ?? 0);
    throw error;
  });
  process.exitCode = run(
    process.argv.slice(2),
    (s) => process.stdout.write(s),
    (s) => process.stderr.write(s),
  );
}
