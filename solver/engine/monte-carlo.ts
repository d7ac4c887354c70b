import type {
  Circuit,
  MeasureStats,
  MonteCarloCheck,
  MonteCarloDef,
  MonteCarloResult,
  SolveSuccess,
  Warning,
} from "../types";
import { evaluateChecks } from "./checks";
import type { SampleBatch } from "./samples";

/** Seeded 32-bit PRNG (mulberry32): the same seed gives the same samples on every platform. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Every sample's values of the toleranced parts, drawn up front (so any thread split gives the same result). */
export interface SampleDraws {
  /** Toleranced part names, in circuit order: the columns of `values`. */
  names: string[];
  samples: number;
  /** values[s·names.length + j]: part names[j] in sample s. */
  values: Float64Array;
}

/**
 * Draw all samples from one mulberry32 stream seeded with `seed`: sample by sample, part by part
 * in netlist order; uniform in ±tol, or normal with σ = tol/3 by Box–Muller (G. E. P. Box &
 * M. E. Muller, Ann. Math. Statist. 29, 1958).
 */
export function drawSamples(circuit: Circuit, def: MonteCarloDef): SampleDraws {
  const rnd = mulberry32(def.seed);
  const gauss = () => {
    const u = 1 - rnd();
    const v = rnd();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
  const toleranced = circuit.parts.filter((p) => p.tol !== undefined && p.tol > 0);
  const w = toleranced.length;
  const values = new Float64Array(def.samples * w);
  for (let s = 0; s < def.samples; s++) {
    for (let j = 0; j < w; j++) {
      const p = toleranced[j]!;
      const t = p.tol!;
      const d = def.dist === "normal" ? (gauss() * t) / 3 : (2 * rnd() - 1) * t;
      values[s * w + j] = p.value * (1 + d);
    }
  }
  return { names: toleranced.map((p) => p.name), samples: def.samples, values };
}

/** Why the run may not start (too many samples), or null. Warns when no part has a tol. */
export function monteCarloPreflight(
  circuit: Circuit,
  warnings: Warning[],
  options: { maxSamples?: number },
): string | null {
  const def = circuit.monteCarlo!;
  if (options.maxSamples !== undefined && def.samples > options.maxSamples) {
    return `monte-carlo asks for ${def.samples} samples; this service allows at most ${options.maxSamples}`;
  }
  if (!circuit.parts.some((p) => p.tol !== undefined && p.tol > 0)) {
    warnings.push({
      line: def.span.line,
      message: "monte-carlo: no part has a tol, so every sample is the nominal circuit",
    });
  }
  return null;
}

/** Statistics and yield from the solved batches (in any order; they must cover every sample). */
export function summarizeSamples(
  circuit: Circuit,
  nominal: SolveSuccess,
  batches: SampleBatch[],
  warnings: Warning[],
): MonteCarloResult {
  const def = circuit.monteCarlo!;
  const m = circuit.measures.length;
  const ordered = [...batches].sort((a, b) => a.from - b.from);
  const columns: (number | null)[][] = Array.from({ length: m }, () => []);
  let passed = 0;
  let failedRuns = 0;
  for (const b of ordered) {
    for (let r = 0; r < b.to - b.from; r++) {
      if (b.failed[r]) failedRuns++;
      if (b.passed[r]) passed++;
      for (let i = 0; i < m; i++) {
        const v = b.values[r * m + i]!;
        columns[i]!.push(Number.isNaN(v) ? null : v);
      }
    }
  }
  if (failedRuns > 0) {
    warnings.push({
      line: def.span.line,
      message: `monte-carlo: ${failedRuns} of ${def.samples} samples could not be solved`,
    });
  }
  const names = nominal.measures.map((x) => x.name);
  return {
    samples: def.samples,
    seed: def.seed,
    yield: def.samples > 0 ? passed / def.samples : 0,
    measures: names.map((name, i) => stats(name, columns[i] ?? [])),
    checks: checkYields(circuit, nominal, columns),
  };
}

/** Percentile by linear interpolation between order statistics (sorted input). */
function percentile(sorted: number[], p: number): number | null {
  if (sorted.length === 0) return null;
  const x = (p / 100) * (sorted.length - 1);
  const lo = Math.floor(x);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo]! + (sorted[hi]! - sorted[lo]!) * (x - lo);
}

/** Statistics of one measure over the samples (nulls left out); histogram with Sturges' bin count. */
export function stats(name: string, list: (number | null)[]): MeasureStats {
  const xs = list.filter((x): x is number => x !== null && Number.isFinite(x)).sort((a, b) => a - b);
  const n = xs.length;
  const empty = { p1: null, p5: null, p50: null, p95: null, p99: null };
  if (n === 0) {
    return {
      name,
      mean: null,
      std: null,
      min: null,
      max: null,
      percentiles: empty,
      histogram: { edges: [], counts: [] },
    };
  }
  const mean = xs.reduce((a, b) => a + b, 0) / n;
  const std = n > 1 ? Math.sqrt(xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (n - 1)) : 0;
  const min = xs[0]!;
  const max = xs[n - 1]!;
  const bins = Math.ceil(Math.log2(n)) + 1;
  const width = (max - min) / bins;
  const edges = Array.from({ length: bins + 1 }, (_, k) => (k === bins ? max : min + k * width));
  const counts = new Array<number>(bins).fill(0);
  for (const x of xs) {
    const k = width > 0 ? Math.min(bins - 1, Math.floor((x - min) / width)) : 0;
    counts[k] = counts[k]! + 1;
  }
  return {
    name,
    mean,
    std,
    min,
    max,
    percentiles: {
      p1: percentile(xs, 1),
      p5: percentile(xs, 5),
      p50: percentile(xs, 50),
      p95: percentile(xs, 95),
      p99: percentile(xs, 99),
    },
    histogram: { edges, counts },
  };
}

/**
 * Each check's own yield: the share of samples whose measure values pass it (a sample that could not
 * be solved, or whose measure has no value, fails it). Read from the measure columns the samples gave.
 */
function checkYields(
  circuit: Circuit,
  nominal: SolveSuccess,
  columns: (number | null)[][],
): MonteCarloCheck[] {
  const samples = columns[0]?.length ?? 0;
  return circuit.checks.map((c) => {
    const i = nominal.measures.findIndex((m) => m.name === c.measure);
    const unit = nominal.measures[i]?.unit ?? "";
    let pass = 0;
    for (let r = 0; r < samples; r++) {
      const value = i >= 0 ? (columns[i]![r] ?? null) : null;
      const [result] = evaluateChecks([c], [{ name: c.measure, value, unit, reason: null }]);
      if (result?.pass) pass++;
    }
    const limits = { op: c.op, value: c.value, ...(c.value2 !== undefined ? { value2: c.value2 } : {}) };
    return { name: c.measure, expression: c.expression, ...limits, yield: samples > 0 ? pass / samples : 0 };
  });
}
