/**
 * Machine-readable reports of `phasewright check`: `--report junit FILE` (the JUnit XML test report
 * CI systems read: one <testsuite> per design, one <testcase> per check and per baseline measure)
 * and `--report json FILE` (everything the command printed, as data).
 */
import type { BaselineComparison } from "./against";
import type { DesignOutcome } from "./design";

export interface CheckedDesign extends DesignOutcome {
  against?: BaselineComparison;
}

export interface CheckRun {
  version: string;
  startedAt: string;
  ms: number;
  designs: CheckedDesign[];
}

export function xmlEscape(s: string): string {
  return s
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .split("")
    .filter((ch) => ch >= " " || ch === "\t" || ch === "\n" || ch === "\r") // XML 1.0 forbids the others
    .join("");
}

const attr = (pairs: Record<string, string | number>) =>
  Object.entries(pairs)
    .map(([k, v]) => ` ${k}="${xmlEscape(String(v))}"`)
    .join("");
const sec = (ms: number) => (ms / 1000).toFixed(3);

interface Case {
  name: string;
  failure?: string;
  error?: string;
}

function casesOf(d: CheckedDesign): Case[] {
  if (d.status === "error") {
    const text = d.errors.map((e) =>
      e.line > 0 ? `${d.file}:${e.line}:${e.column}: ${e.message}` : `${d.file}: ${e.message}`,
    );
    return [{ name: "netlist", error: text.join("\n") }];
  }
  const cases: Case[] = d.checks.map((c) =>
    c.pass
      ? { name: `check ${c.expression}` }
      : { name: `check ${c.expression}`, failure: c.reason ?? "fails" },
  );
  if (cases.length === 0) cases.push({ name: "solves" });
  for (const m of d.against?.measures ?? []) {
    const name = `baseline ${m.name} [limit ${m.limit}]`;
    const moved =
      `${m.name}: ${m.a ?? "none"} → ${m.b ?? "none"} ${m.unit}` +
      (m.deltaPct === null ? "" : ` (${m.deltaPct.toPrecision(3)} %)`);
    cases.push(m.ok ? { name } : { name, failure: moved });
  }
  for (const t of d.against?.traces ?? []) {
    if (t.limit === null) continue;
    const worst = `largest difference ${t.maxDb?.value ?? "—"} dB, ${t.maxDeg?.value ?? "—"}°`;
    cases.push(
      t.ok ? { name: `baseline trace ${t.name}` } : { name: `baseline trace ${t.name}`, failure: worst },
    );
  }
  for (const p of d.against?.problems ?? []) cases.push({ name: "baseline tolerances", failure: p });
  return cases;
}

/** JUnit XML: <testsuites> of one <testsuite> per design. */
export function junitReport(run: CheckRun): string {
  const suites = run.designs.map((d) => ({ d, cases: casesOf(d) }));
  const total = (k: "failure" | "error") =>
    suites.reduce((n, s) => n + s.cases.filter((c) => c[k]).length, 0);
  const out = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<testsuites${attr({ name: "phasewright check", tests: suites.reduce((n, s) => n + s.cases.length, 0), failures: total("failure"), errors: total("error"), time: sec(run.ms) })}>`,
  ];
  for (const { d, cases } of suites) {
    const failures = cases.filter((c) => c.failure).length;
    const errors = cases.filter((c) => c.error).length;
    out.push(
      `  <testsuite${attr({ name: d.file, tests: cases.length, failures, errors, time: sec(d.ms), timestamp: run.startedAt })}>`,
    );
    for (const c of cases) {
      const head = `    <testcase${attr({ classname: d.file, name: c.name, time: sec(cases.length ? d.ms / cases.length : 0) })}`;
      if (c.failure !== undefined)
        out.push(
          `${head}>`,
          `      <failure${attr({ message: c.failure })}>${xmlEscape(c.failure)}</failure>`,
          "    </testcase>",
        );
      else if (c.error !== undefined)
        out.push(
          `${head}>`,
          `      <error${attr({ message: "netlist errors" })}>${xmlEscape(c.error)}</error>`,
          "    </testcase>",
        );
      else out.push(`${head}/>`);
    }
    out.push("  </testsuite>");
  }
  out.push("</testsuites>");
  return `${out.join("\n")}\n`;
}

/** The JSON report: per design its status, measures, checks, errors and baseline comparison. */
export function jsonReport(run: CheckRun): string {
  const count = (s: string) => run.designs.filter((d) => d.status === s).length;
  return `${JSON.stringify(
    {
      tool: "phasewright",
      version: run.version,
      startedAt: run.startedAt,
      ms: Math.round(run.ms),
      summary: {
        designs: run.designs.length,
        pass: count("pass"),
        fail: count("fail"),
        error: count("error"),
      },
      designs: run.designs.map(({ netlist: _n, result: _r, ...d }) => ({ ...d, ms: Math.round(d.ms) })),
    },
    null,
    2,
  )}\n`;
}
