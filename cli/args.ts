/**
 * Arguments of `phasewright check`. Every problem is a message for exit code 3 (the command could
 * not do its job), never a thrown error.
 */
import { availableParallelism } from "node:os";
import { parseTolerance, type Tolerance } from "./tolerance";

export interface CheckArgs {
  patterns: string[];
  reports: { format: "junit" | "json"; file: string }[];
  jobs: number;
  against: string | null;
  tolerances: Tolerance[];
}

/** The value after an option (`--jobs 2`) or after its `=` (`--jobs=2`). */
function takeValue(args: string[], i: number, inline: string | null): { value: string | null; next: number } {
  if (inline !== null) return { value: inline, next: i };
  const v = args[i + 1];
  return v === undefined || v.startsWith("--") ? { value: null, next: i } : { value: v, next: i + 1 };
}

export function parseCheckArgs(args: string[]): CheckArgs | { error: string } {
  const out: CheckArgs = {
    patterns: [],
    reports: [],
    jobs: availableParallelism(),
    against: null,
    tolerances: [],
  };
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (!a.startsWith("--")) {
      out.patterns.push(a);
      continue;
    }
    const eq = a.indexOf("=");
    const name = eq > 0 ? a.slice(0, eq) : a;
    const { value, next } = takeValue(args, i, eq > 0 ? a.slice(eq + 1) : null);
    i = next;
    if (value === null) return { error: `${name} needs a value` };
    if (name === "--report") {
      // --report junit FILE (two values)
      const format = value;
      const file = args[i + 1];
      if (format !== "junit" && format !== "json")
        return { error: `--report ${format}: choose junit or json` };
      if (file === undefined || file.startsWith("--")) return { error: `--report ${format} needs a FILE` };
      out.reports.push({ format, file });
      i++;
    } else if (name === "--jobs") {
      const n = Number(value);
      if (!Number.isInteger(n) || n < 1) return { error: `--jobs ${value}: a whole number of 1 or more` };
      out.jobs = n;
    } else if (name === "--against") {
      if (out.against !== null) return { error: "--against: give one baseline run" };
      out.against = value;
    } else if (name === "--tolerance") {
      const t = parseTolerance(value);
      if ("error" in t) return t;
      out.tolerances.push(t);
    } else return { error: `unknown option ${name}` };
  }
  if (out.patterns.length === 0) return { error: "no netlist files or patterns given" };
  if (out.tolerances.length > 0 && out.against === null)
    return { error: "--tolerance applies to --against only" };
  return out;
}
