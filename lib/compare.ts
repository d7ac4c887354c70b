import { diffArrays } from "diff";
import { type NetlistDiffStats, type NetlistRow, netlistDiffStats, netlistRows } from "@/lib/netlist-diff";
import { sampleTrace, wrapDeg } from "@/lib/trace-math";
import { makeTrace } from "@/solver/engine/trace";
import { compile } from "@/solver/lang";
import type {
  CheckResult,
  MeasureResult,
  NetlistError,
  Part,
  SolveResult,
  SolveSuccess,
  TraceResult,
} from "@/solver/types";

/** One side of a comparison: a saved run's netlist text and its solver result (null when it has none). */
export interface CompareSide {
  netlist: string;
  result: SolveResult | null;
}

export { sampleTrace, wrapDeg };

export interface DiffLine {
  kind: "same" | "added" | "removed";
  text: string;
  /** 1-based line in the first netlist (null for an added line). */
  oldLine: number | null;
  /** 1-based line in the second netlist (null for a removed line). */
  newLine: number | null;
}

/** A part as the comparison shows it: kind, nodes, value in SI units and its options. */
export interface PartSummary {
  kind: Part["kind"];
  nodes: string[];
  value: number;
  /** Options as written in text, e.g. `tol=1%`, `gbw=1000000`. */
  options: string[];
}

export interface PartChange {
  name: string;
  change: "added" | "removed" | "changed";
  before: PartSummary | null;
  after: PartSummary | null;
  /** What differs for a changed part: "kind", "nodes", "value" and/or "options". */
  fields: ("kind" | "nodes" | "value" | "options")[];
}

export interface MeasureComparison {
  name: string;
  unit: string;
  a: number | null;
  b: number | null;
  /** b − a, or null when either side has no value. */
  delta: number | null;
  /** (b − a) / |a| × 100, or null when a is 0 or either side has no value. */
  deltaPct: number | null;
  reasonA: string | null;
  reasonB: string | null;
  /** Which runs report the measure at all. */
  presentIn: "both" | "a" | "b";
}

export interface CheckComparison {
  name: string;
  expression: string;
  a: boolean | null;
  b: boolean | null;
  reasonA: string | null;
  reasonB: string | null;
  flipped: boolean;
}

/** A trace of both runs on the second run's grid, with the difference b − a. */
export interface TraceComparison {
  name: string;
  frequencies: number[];
  aDb: (number | null)[];
  aDeg: (number | null)[];
  bDb: number[];
  bDeg: number[];
  /** b − a in dB; null where the frequency lies outside the first run's sweep. */
  diffDb: (number | null)[];
  /** b − a in degrees, wrapped to (−180, 180]. */
  diffDeg: (number | null)[];
  /** True when the first run's trace had to be interpolated (the grids differ). */
  interpolated: boolean;
  /** Group delay (s) of both runs and b − a, when both traces carry it (same grid only). */
  delay?: { a: (number | null)[]; b: (number | null)[]; diff: (number | null)[] };
}

export interface RunComparison {
  diff: DiffLine[];
  diffStats: { added: number; removed: number; same: number };
  /** The same diff by statement: a part, sweep, measure… edited in place is one "changed" row. */
  rows: NetlistRow[];
  rowStats: NetlistDiffStats;
  parts: PartChange[];
  /** Compile errors of either netlist (parts cannot be compared then). */
  partErrors: { a: NetlistError[]; b: NetlistError[] };
  measures: MeasureComparison[];
  checks: CheckComparison[];
  flippedChecks: CheckComparison[];
  traces: TraceComparison[];
}

function splitLines(text: string): string[] {
  const lines = text.replace(/\r\n?/g, "\n").split("\n");
  if (lines.length > 1 && lines[lines.length - 1] === "") lines.pop();
  return lines;
}

/** Line-based diff of two netlists, each line numbered in the text it comes from. */
export function diffNetlists(a: string, b: string): DiffLine[] {
  const out: DiffLine[] = [];
  let oldLine = 1;
  let newLine = 1;
  for (const change of diffArrays(splitLines(a), splitLines(b))) {
    for (const text of change.value) {
      if (change.added) out.push({ kind: "added", text, oldLine: null, newLine: newLine++ });
      else if (change.removed) out.push({ kind: "removed", text, oldLine: oldLine++, newLine: null });
      else out.push({ kind: "same", text, oldLine: oldLine++, newLine: newLine++ });
    }
  }
  return out;
}

function summarize(p: Part): PartSummary {
  const options: string[] = [];
  if (p.tol !== undefined) options.push(`tol=${+(p.tol * 100).toPrecision(12)}%`);
  if (p.phaseDeg !== undefined) options.push(`phase=${p.phaseDeg}`);
  if (p.sense !== undefined) options.push(`sense=${p.sense}`);
  if (p.opamp?.gain !== undefined) options.push(`gain=${p.opamp.gain}`);
  if (p.opamp?.gbw !== undefined) options.push(`gbw=${p.opamp.gbw}`);
  if (p.opamp?.swing !== undefined) options.push(`swing=${p.opamp.swing}`);
  if (p.diode !== undefined) options.push(`is=${p.diode.is}`, `n=${p.diode.n}`);
  if (p.opamp?.rout !== undefined) options.push(`rout=${p.opamp.rout}`);
  return { kind: p.kind, nodes: [...p.nodes], value: p.value, options };
}

function sameValue(x: number, y: number): boolean {
  return x === y || Math.abs(x - y) <= 1e-12 * Math.max(Math.abs(x), Math.abs(y));
}

/** Parts added, removed or changed between two netlists, by full part name (block parts as `X1.R1`). */
export function compareParts(
  a: string,
  b: string,
): { parts: PartChange[]; errors: { a: NetlistError[]; b: NetlistError[] } } {
  const ca = compile(a);
  const cb = compile(b);
  const errors = { a: ca.ok ? [] : ca.errors, b: cb.ok ? [] : cb.errors };
  if (!ca.ok || !cb.ok) return { parts: [], errors };
  const before = new Map(ca.circuit.parts.map((p) => [p.name, summarize(p)]));
  const after = new Map(cb.circuit.parts.map((p) => [p.name, summarize(p)]));
  const parts: PartChange[] = [];
  for (const [name, old] of before) {
    const now = after.get(name);
    if (!now) {
      parts.push({ name, change: "removed", before: old, after: null, fields: [] });
      continue;
    }
    const fields: PartChange["fields"] = [];
    if (old.kind !== now.kind) fields.push("kind");
    if (old.nodes.join(" ") !== now.nodes.join(" ")) fields.push("nodes");
    if (!sameValue(old.value, now.value)) fields.push("value");
    if (old.options.join(" ") !== now.options.join(" ")) fields.push("options");
    if (fields.length > 0) parts.push({ name, change: "changed", before: old, after: now, fields });
  }
  for (const [name, now] of after) {
    if (!before.has(name)) parts.push({ name, change: "added", before: null, after: now, fields: [] });
  }
  return { parts, errors };
}

function measuresOf(r: SolveResult | null): MeasureResult[] {
  return r?.ok ? r.measures : [];
}

function checksOf(r: SolveResult | null): CheckResult[] {
  return r?.ok ? r.checks : [];
}

/** Every measure of either run side by side, in the first run's order then the second's new ones. */
export function compareMeasures(a: MeasureResult[], b: MeasureResult[]): MeasureComparison[] {
  const names = [...new Set([...a.map((m) => m.name), ...b.map((m) => m.name)])];
  return names.map((name) => {
    const ma = a.find((m) => m.name === name);
    const mb = b.find((m) => m.name === name);
    const va = ma?.value ?? null;
    const vb = mb?.value ?? null;
    const delta = va !== null && vb !== null ? vb - va : null;
    const deltaPct = delta !== null && va !== null && va !== 0 ? (delta / Math.abs(va)) * 100 : null;
    return {
      name,
      unit: mb?.unit ?? ma?.unit ?? "",
      a: va,
      b: vb,
      delta,
      deltaPct,
      reasonA: ma ? ma.reason : "not measured in this run",
      reasonB: mb ? mb.reason : "not measured in this run",
      presentIn: ma && mb ? "both" : ma ? "a" : "b",
    };
  });
}

/** Checks of both runs matched by measure name and expression; `flipped` when pass/fail changed. */
export function compareChecks(a: CheckResult[], b: CheckResult[]): CheckComparison[] {
  const key = (c: CheckResult) => `${c.name}\u0000${c.expression}`;
  const keys = [...new Set([...a.map(key), ...b.map(key)])];
  return keys.map((k) => {
    const ca = a.find((c) => key(c) === k);
    const cb = b.find((c) => key(c) === k);
    const first = (ca ?? cb)!;
    return {
      name: first.name,
      expression: first.expression,
      a: ca ? ca.pass : null,
      b: cb ? cb.pass : null,
      reasonA: ca?.reason ?? null,
      reasonB: cb?.reason ?? null,
      flipped: ca !== undefined && cb !== undefined && ca.pass !== cb.pass,
    };
  });
}

function sameGrid(x: number[], y: number[]): boolean {
  return x.length === y.length && x.every((v, i) => sameValue(v, y[i]!));
}

/** Traces present in both runs (by name), on the second run's grid, with b − a in dB and degrees. */
export function compareTraces(
  fa: number[],
  ta: TraceResult[],
  fb: number[],
  tb: TraceResult[],
): TraceComparison[] {
  const out: TraceComparison[] = [];
  const same = sameGrid(fa, fb);
  for (const b of tb) {
    const a = ta.find((t) => t.name === b.name);
    if (!a) continue;
    const aDb: (number | null)[] = [];
    const aDeg: (number | null)[] = [];
    fb.forEach((f, k) => {
      const s = same
        ? { db: a.magnitudeDb[k]!, deg: a.phaseDeg[k]! }
        : sampleTrace(fa, a.magnitudeDb, a.phaseDeg, f);
      aDb.push(s ? s.db : null);
      aDeg.push(s ? s.deg : null);
    });
    out.push({
      name: b.name,
      frequencies: fb,
      aDb,
      aDeg,
      bDb: b.magnitudeDb,
      bDeg: b.phaseDeg,
      diffDb: aDb.map((v, k) => (v === null ? null : b.magnitudeDb[k]! - v)),
      diffDeg: aDeg.map((v, k) => (v === null ? null : wrapDeg(b.phaseDeg[k]! - v))),
      interpolated: !same,
      ...(same && a.groupDelay && b.groupDelay
        ? {
            delay: {
              a: a.groupDelay,
              b: b.groupDelay,
              diff: b.groupDelay.map((v, k) => {
                const u = a.groupDelay![k];
                return v === null || u == null ? null : v - u;
              }),
            },
          }
        : {}),
    });
  }
  return out;
}

/**
 * Each noise density of a result as a trace named "noise N" (dB = dBV/√Hz, phase 0), so compare
 * overlays and differences it like any trace.
 */
export function noiseTraces(r: SolveSuccess): TraceResult[] {
  return (r.noise ?? []).map((n) =>
    makeTrace(
      `noise ${n.name}`,
      "probe",
      n.density.map((d) => d ?? 0),
      n.density.map(() => 0),
    ),
  );
}

/**
 * Compares two runs (a = the earlier or reference run, b = the later one): netlist text diff with line
 * numbers, parts added/removed/changed, measures side by side with Δ and Δ%, checks (and those that
 * flipped), and the traces both runs share overlaid on b's frequency grid with a difference trace.
 * Pure: the only work beyond the inputs is compiling both netlists to list their parts.
 */
export function compareRuns(a: CompareSide, b: CompareSide): RunComparison {
  const diff = diffNetlists(a.netlist, b.netlist);
  const diffStats = { added: 0, removed: 0, same: 0 };
  for (const d of diff) diffStats[d.kind]++;
  const rows = netlistRows(diff);
  const { parts, errors } = compareParts(a.netlist, b.netlist);
  const checks = compareChecks(checksOf(a.result), checksOf(b.result));
  const ra = a.result?.ok ? a.result : null;
  const rb = b.result?.ok ? b.result : null;
  return {
    diff,
    diffStats,
    rows,
    rowStats: netlistDiffStats(rows),
    parts,
    partErrors: errors,
    measures: compareMeasures(measuresOf(a.result), measuresOf(b.result)),
    checks,
    flippedChecks: checks.filter((c) => c.flipped),
    traces:
      ra && rb
        ? compareTraces(ra.frequencies, [...ra.traces, ...noiseTraces(ra)], rb.frequencies, [
            ...rb.traces,
            ...noiseTraces(rb),
          ])
        : [],
  };
}
