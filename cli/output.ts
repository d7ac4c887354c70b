/**
 * What `phasewright check` prints: one line per design, one per failed check (and per netlist
 * error, as FILE:LINE:COL: message so editors can jump to it), the baseline comparison when asked,
 * then one summary line.
 */
import { formatSi } from "@/solver/cli";
import type { BaselineComparison, MeasureVerdict } from "./against";
import type { DesignOutcome } from "./design";

const LABEL = { pass: "PASS ", fail: "FAIL ", error: "ERROR" } as const;

const ms = (x: number) => `${Math.round(x)} ms`;

function checksText(o: DesignOutcome): string {
  const failed = o.checks.filter((c) => !c.pass).length;
  if (o.checks.length === 0) return "solved, no checks";
  if (failed === 0) return `${o.checks.length} check${o.checks.length === 1 ? "" : "s"} pass`;
  return `${failed} of ${o.checks.length} check${o.checks.length === 1 ? "" : "s"} fail`;
}

/** The lines for one design (the baseline's own lines come from `againstLines`). */
export function designLines(o: DesignOutcome & { against?: BaselineComparison }): string[] {
  if (o.status === "error") {
    const n = o.errors.length;
    return [
      `${LABEL.error} ${o.file} — ${n} netlist error${n === 1 ? "" : "s"} (${ms(o.ms)})`,
      ...o.errors.map((e) =>
        e.line > 0
          ? `        ${o.file}:${e.line}:${e.column}: ${e.message}${e.hint ? ` (${e.hint})` : ""}`
          : `        ${o.file}: ${e.message}`,
      ),
    ];
  }
  const moved = o.against
    ? o.against.measures.filter((m) => !m.ok).length + o.against.traces.filter((t) => !t.ok).length
    : 0;
  const drift =
    moved > 0
      ? `, ${moved} moved from the baseline`
      : o.against && !o.against.ok
        ? ", baseline limits not met"
        : "";
  const lines = [`${LABEL[o.status]} ${o.file} — ${checksText(o)}${drift} (${ms(o.ms)})`];
  for (const c of o.checks)
    if (!c.pass) lines.push(`        check ${c.expression} fails${c.reason ? `: ${c.reason}` : ""}`);
  return lines;
}

function value(v: number | null, unit: string): string {
  return v === null ? "none" : formatSi(v, unit);
}

function signed(v: number, unit: string): string {
  return `${v >= 0 ? "+" : "−"}${formatSi(Math.abs(v), unit)}`;
}

/** 3 significant digits with a real minus sign. */
const signed3 = (v: number) => `${v < 0 ? "−" : ""}${Number(Math.abs(v).toPrecision(3))}`;

function measureLine(m: MeasureVerdict, width: number): string {
  const verdict = m.ok ? "ok   " : "MOVED";
  const from = `${value(m.a, m.unit)} → ${value(m.b, m.unit)}`;
  const delta =
    m.delta === null
      ? ""
      : `  Δ ${signed(m.delta, m.unit)}${m.deltaPct === null ? "" : ` (${m.deltaPct >= 0 ? "+" : "−"}${Number(Math.abs(m.deltaPct).toPrecision(3))} %)`}`;
  return `        ${verdict} ${m.name.padEnd(width)}  ${from}${delta}  [limit ${m.limit}]`;
}

/** The lines of a baseline comparison (indented under its design). */
export function againstLines(c: BaselineComparison): string[] {
  const moved = c.measures.filter((m) => !m.ok).length;
  const lines = [
    `        against run ${c.baseline.id} "${c.baseline.title}" (${c.baseline.url}): ` +
      `${moved === 0 ? "every measure within its limit" : `${moved} measure${moved === 1 ? "" : "s"} moved too far`}` +
      `${c.partsChanged > 0 ? `, ${c.partsChanged} part${c.partsChanged === 1 ? "" : "s"} changed` : ""}`,
  ];
  const width = Math.max(0, ...c.measures.map((m) => m.name.length));
  for (const m of c.measures) lines.push(measureLine(m, width));
  for (const f of c.flippedChecks)
    lines.push(
      `        check ${f.expression}: ${f.before ? "passed" : "failed"} in the baseline, ${f.after ? "passes" : "fails"} now`,
    );
  for (const t of c.traces) {
    const db = t.maxDb ? `${signed3(t.maxDb.value)} dB at ${formatSi(t.maxDb.at, "Hz")}` : "—";
    const deg = t.maxDeg ? `${signed3(t.maxDeg.value)}° at ${formatSi(t.maxDeg.at, "Hz")}` : "—";
    const judged = t.limit === null ? "" : ` [limit ${t.limit}] ${t.ok ? "ok" : "MOVED"}`;
    lines.push(`        trace ${t.name}: largest difference ${db}, ${deg}${judged}`);
  }
  for (const p of c.problems) lines.push(`        ${p}`);
  return lines;
}

/** "3 designs: 2 pass, 1 fails, 0 with netlist errors (412 ms)". */
export function summaryLine(outcomes: { status: string }[], totalMs: number): string {
  const count = (s: string) => outcomes.filter((o) => o.status === s).length;
  const n = outcomes.length;
  return `${n} design${n === 1 ? "" : "s"}: ${count("pass")} pass, ${count("fail")} fail, ${count("error")} with netlist errors (${ms(totalMs)})`;
}
