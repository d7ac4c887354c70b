import type { Circuit, MeasureStats, MonteCarloResult, SolveSuccess, Warning } from "../types";
import { rerun, withValues } from "./rerun";
import type { StudyOptions } from "./studies";

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

export function monteCarlo(
  circuit: Circuit,
  freqs: number[],
  nominal: SolveSuccess,
  warnings: Warning[],
  options: StudyOptions,
): MonteCarloResult | string {
  const def = circuit.monteCarlo!;
  if (options.maxSamples !== undefined && def.samples > options.maxSamples) {
    return `monte-carlo asks for ${def.samples} samples; this service allows at most ${options.maxSamples}`;
  }
  const rnd = mulberry32(def.seed);
  // Box–Muller (G. E. P. Box & M. E. Muller, Ann. Math. Statist. 29, 1958) for the normal case.
  const gauss = () => {
    const u = 1 - rnd();
    const v = rnd();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
  const toleranced = circuit.parts.filter((p) => p.tol !== undefined && p.tol > 0);
  if (toleranced.length === 0) {
    warnings.push({
      line: def.span.line,
      message: "monte-carlo: no part has a tol, so every sample is the nominal circuit",
    });
  }
  const values = new Map<string, (number | null)[]>(nominal.measures.map((m) => [m.name, []]));
  let passed = 0;
  let failedRuns = 0;
  for (let s = 0; s < def.samples; s++) {
    const vals = new Map<string, number>();
    for (const p of toleranced) {
      const t = p.tol!;
      const d = def.dist === "normal" ? (gauss() * t) / 3 : (2 * rnd() - 1) * t;
      vals.set(p.name, p.value * (1 + d));
    }
    const o = rerun(withValues(circuit, vals), freqs);
    if (typeof o === "string") {
      failedRuns++;
      for (const list of values.values()) list.push(null);
      continue;
    }
    for (const m of o.measures) values.get(m.name)?.push(m.value);
    if (o.checks.every((c) => c.pass)) passed++;
  }
  if (failedRuns > 0) {
    warnings.push({
      line: def.span.line,
      message: `monte-carlo: ${failedRuns} of ${def.samples} samples could not be solved`,
    });
  }
  return {
    samples: def.samples,
    seed: def.seed,
    yield: def.samples > 0 ? passed / def.samples : 0,
    measures: [...values.entries()].map(([name, list]) => stats(name, list)),
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
