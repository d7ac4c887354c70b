import { compareParts, type PartChange, sameValue } from "@/lib/compare-parts";
import {
  type DiffLine,
  diffNetlists,
  type NetlistDiffStats,
  type NetlistRow,
  netlistDiffStats,
  netlistRows,
} from "@/lib/netlist-diff";
import { sampleTrace, wrapDeg } from "@/lib/trace-math";
import { makeTrace } from "@/solver/engine/trace";
import type {
  CheckResult,
  MeasureResult,
  NetlistError,
  SolveResult,
  SolveSuccess,
  TraceResult,
} from "@/solver/types";

/** One side of a comparison: a saved run's netlist text and its solver result (null when it has none). */
export interface CompareSide {
  netlist: string;
  result: SolveResult | null;
}

// The netlist halves of a comparison live beside it; their types are part of RunComparison.
export type { PartChange, PartSummary } from "@/lib/compare-parts";
export type { DiffLine } from "@/lib/netlist-diff";
export { compareParts, diffNetlists, sampleTrace, wrapDeg };

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
