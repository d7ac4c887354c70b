/**
 * One design of `phasewright check`: read a netlist file, solve it, and keep what the output, the
 * reports and a baseline comparison need. Runs in the main thread or in a worker (cli/pool.ts), so
 * the outcome is plain data (structured-clone safe).
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { solveNetlist } from "@/solver";
import type { CheckResult, MeasureResult, NetlistError, SolveSuccess, Warning } from "@/solver/types";

export type DesignStatus = "pass" | "fail" | "error";

export interface DesignOutcome {
  /** The path as given (relative to the working folder when it came from a pattern). */
  file: string;
  status: DesignStatus;
  title: string | null;
  /** Wall time of read + solve, ms. */
  ms: number;
  measures: MeasureResult[];
  checks: CheckResult[];
  warnings: Warning[];
  /** Netlist errors (line and column), or a file or internal fault with line 0. */
  errors: NetlistError[];
  /** The netlist text and the full result, kept only when a baseline comparison needs them. */
  netlist?: string;
  result?: SolveSuccess;
}

/** A fault that is not in the netlist (unreadable file, engine fault): reported like an error at 0:0. */
function fault(message: string): NetlistError {
  return { line: 0, column: 0, endColumn: 0, message };
}

export function statusOf(checks: CheckResult[], errors: NetlistError[]): DesignStatus {
  if (errors.length > 0) return "error";
  return checks.every((c) => c.pass) ? "pass" : "fail";
}

/** Read and solve one design. Never throws. `keep`: also return the netlist and the full result. */
export function solveDesign(file: string, cwd: string, keep = false): DesignOutcome {
  const t0 = performance.now();
  const base = { file, title: null, measures: [], checks: [], warnings: [] };
  let text: string;
  try {
    text = readFileSync(path.resolve(cwd, file), "utf8");
  } catch (error) {
    const why = error instanceof Error ? error.message : String(error);
    return { ...base, status: "error", ms: performance.now() - t0, errors: [fault(`cannot read: ${why}`)] };
  }
  try {
    const r = solveNetlist(text);
    const ms = performance.now() - t0;
    if (!r.ok) return { ...base, status: "error", ms, warnings: r.warnings ?? [], errors: r.errors };
    return {
      file,
      status: statusOf(r.checks, []),
      title: r.title,
      ms,
      measures: r.measures,
      checks: r.checks,
      warnings: r.warnings,
      errors: [],
      ...(keep ? { netlist: text, result: r } : {}),
    };
  } catch (error) {
    const why = error instanceof Error ? error.message : String(error);
    return {
      ...base,
      status: "error",
      ms: performance.now() - t0,
      errors: [fault(`internal fault: ${why}`)],
    };
  }
}
