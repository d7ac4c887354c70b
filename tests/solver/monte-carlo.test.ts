/**
 * Monte Carlo against a closed form, seeded determinism, and the worker-thread path.
 *
 * One toleranced part: R uniform in R0·(1 ± t) in a first-order RC low-pass, fc = 1/(2πRC)
 * (CHECKS.md §1, OAFE §16.2: |H(fc)| = 1/√2, so the half-power crossing is fc exactly).
 * With u = R/R0 uniform on (1−t, 1+t) (density 1/(2t)) and f0 = 1/(2πR0C), fc = f0/u and
 *   E[fc]   = f0·(1/2t)·∫ du/u  = f0·ln((1+t)/(1−t))/(2t)
 *   E[fc²]  = f0²·(1/2t)·∫ du/u² = f0²·(1/2t)·(1/(1−t) − 1/(1+t)) = f0²/(1−t²)
 *   Var[fc] = f0²·(1/(1−t²) − (ln((1+t)/(1−t))/(2t))²)
 *   fc ∈ [f0/(1+t), f0/(1−t)]; P(fc ≤ x) = P(u ≥ f0/x) = (1 + t − f0/x)/(2t), so the median is f0.
 * (Derived here from the uniform density; the tolerances below follow from N.)
 */
import { afterAll, describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { drawSamples, mulberry32 } from "@/solver/engine/monte-carlo";
import { solveNetlistParallel, stopSampleWorkers, workersUnavailableReason } from "@/solver/parallel";
import type { SolveSuccess } from "@/solver/types";

const R0 = 10e3;
const C = 10e-9;
const T = 0.1; // ±10 %
const F0 = 1 / (2 * Math.PI * R0 * C); // 1591.5494309190 Hz (CHECKS.md §1)
const N = 2000;

const rcNet = (samples: number, seed: number, dist = "uniform") => `
title RC corner spread
V1: vsource   in  gnd 1
R1: resistor  in  out 10k tol=10%
C1: capacitor out gnd 10n
sweep 10Hz to 100kHz log 50 per decade
show H = volts(out) / volts(in)
measure fc = crossing(H, half-power)
check fc between 1.5kHz and 1.7kHz
monte-carlo ${samples} seed=${seed} dist=${dist}
`;

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}

afterAll(async () => {
  await stopSampleWorkers();
});

describe("one uniform resistor in an RC corner: fc statistics against the closed form", () => {
  const r = solve(rcNet(N, 42));
  const fc = r.monteCarlo!.measures.find((m) => m.name === "fc")!;
  const lnRatio = Math.log((1 + T) / (1 - T));
  const mean = (F0 * lnRatio) / (2 * T); // 1596.88666 Hz (derived above)
  const std = F0 * Math.sqrt(1 / (1 - T * T) - (lnRatio / (2 * T)) ** 2); // 92.5676 Hz

  it("uses the derived values", () => {
    expect(F0).toBeCloseTo(1591.549430919, 6); // CHECKS.md §1
    expect(mean / F0).toBeCloseTo(1.0033535, 6); // ln(1.1/0.9)/0.2 = 1.00335348 (hand arithmetic)
    expect(std / F0).toBeCloseTo(0.0581619, 6); // √(1/0.99 − 1.0033535²) = 0.05816193
  });

  it("mean within 4 standard errors (σ/√N ≈ 2.1 Hz for N = 2000)", () => {
    expect(Math.abs(fc.mean! - mean)).toBeLessThan((4 * std) / Math.sqrt(N));
  });

  it("std within 5 % (standard error of s for a near-uniform law ≈ σ·√(0.8/4N) ≈ 1 %)", () => {
    expect(Math.abs(fc.std! / std - 1)).toBeLessThan(0.05);
  });

  it("min and max inside [f0/(1+t), f0/(1−t)] and close to them (expected gap ≈ 2t/N)", () => {
    const lo = F0 / (1 + T); // 1446.863 Hz
    const hi = F0 / (1 - T); // 1768.388 Hz
    expect(fc.min!).toBeGreaterThanOrEqual(lo * (1 - 1e-9));
    expect(fc.max!).toBeLessThanOrEqual(hi * (1 + 1e-9));
    expect(fc.min! / lo - 1).toBeLessThan(0.01);
    expect(1 - fc.max! / hi).toBeLessThan(0.01);
  });

  it("median at f0 and p5/p95 on the derived CDF (quantile x_p = f0/(1 + t − 2t·p))", () => {
    const q = (p: number) => F0 / (1 + T - 2 * T * p);
    // Standard error of a quantile in u: √(p(1−p)/N)/density, density 1/(2t) → ≤ 0.0045 at N = 2000.
    expect(Math.abs(fc.percentiles.p50! / q(0.5) - 1)).toBeLessThan(0.01);
    expect(Math.abs(fc.percentiles.p5! / q(0.05) - 1)).toBeLessThan(0.01);
    expect(Math.abs(fc.percentiles.p95! / q(0.95) - 1)).toBeLessThan(0.01);
  });

  it("yield matches P(1.5 kHz ≤ fc ≤ 1.7 kHz) = P(f0/1.7k ≤ u ≤ f0/1.5k)/(2t)", () => {
    const p = (Math.min(1 + T, F0 / 1500) - Math.max(1 - T, F0 / 1700)) / (2 * T); // 0.624137
    const se = Math.sqrt((p * (1 - p)) / N);
    expect(Math.abs(r.monteCarlo!.yield - p)).toBeLessThan(4 * se);
  });

  it("the histogram holds every sample in Sturges' ⌈log2 N⌉ + 1 bins", () => {
    expect(fc.histogram.counts).toHaveLength(Math.ceil(Math.log2(N)) + 1);
    expect(fc.histogram.counts.reduce((a, b) => a + b, 0)).toBe(N);
    expect(fc.histogram.edges[0]).toBe(fc.min);
    expect(fc.histogram.edges.at(-1)).toBe(fc.max);
  });
});

describe("seeded determinism", () => {
  it("the same seed gives the same JSON; another seed does not", () => {
    const a = solve(rcNet(300, 5));
    const b = solve(rcNet(300, 5));
    const c = solve(rcNet(300, 6));
    expect(JSON.stringify(a.monteCarlo)).toBe(JSON.stringify(b.monteCarlo));
    expect(JSON.stringify(a.monteCarlo)).not.toBe(JSON.stringify(c.monteCarlo));
  });

  it("mulberry32 is a fixed sequence (first outputs of seed 1, from the algorithm itself)", () => {
    const r1 = mulberry32(1);
    const r2 = mulberry32(1);
    const xs = [r1(), r1(), r1()];
    expect([r2(), r2(), r2()]).toEqual(xs);
    for (const x of xs) expect(x >= 0 && x < 1).toBe(true);
  });

  it("draws every sample up front, part by part in netlist order, inside ±tol", () => {
    const compiled = solveNetlist(rcNet(50, 9));
    expect(compiled.ok).toBe(true);
    const circuit = {
      parts: [
        { name: "R1", kind: "resistor" as const, nodes: ["in", "out"], value: R0, tol: T, span: SPAN },
        { name: "C1", kind: "capacitor" as const, nodes: ["out", "gnd"], value: C, span: SPAN },
      ],
    };
    const d = drawSamples(circuit as never, { samples: 50, seed: 9, dist: "uniform", span: SPAN });
    expect(d.names).toEqual(["R1"]);
    expect(d.values).toHaveLength(50);
    const rnd = mulberry32(9);
    for (const v of d.values) {
      expect(v).toBeCloseTo(R0 * (1 + (2 * rnd() - 1) * T), 9);
      expect(Math.abs(v / R0 - 1)).toBeLessThanOrEqual(T);
    }
  });
});

const SPAN = { line: 1, column: 1, endColumn: 2 };

describe("worker threads", () => {
  it("give the same JSON as the in-thread path for 1, 2 and 3 threads", async () => {
    const text = rcNet(400, 77, "normal");
    const base = solve(text);
    for (const threads of [1, 2, 3]) {
      const r = await solveNetlistParallel(text, { threads });
      expect(workersUnavailableReason()).toBeNull();
      expect(r.ok).toBe(true);
      if (!r.ok) continue;
      expect(JSON.stringify({ ...r, stats: null })).toBe(JSON.stringify({ ...base, stats: null }));
    }
  }, 60_000);

  it("reports progress up to the sample count and stops when aborted", async () => {
    const seen: number[] = [];
    const r = await solveNetlistParallel(rcNet(400, 1), { threads: 2, onProgress: (d) => seen.push(d) });
    expect(r.ok).toBe(true);
    expect(seen.at(-1)).toBe(400);
    expect([...seen].sort((a, b) => a - b)).toEqual(seen);
    const ac = new AbortController();
    ac.abort(new Error("stop"));
    await expect(solveNetlistParallel(rcNet(400, 1), { threads: 2, signal: ac.signal })).rejects.toThrow(
      "stop",
    );
  }, 60_000);

  it("in-thread fallback (threads: 0) gives the same result too", async () => {
    const text = rcNet(120, 3);
    const r = await solveNetlistParallel(text, { threads: 0 });
    expect(JSON.stringify({ ...r, stats: null })).toBe(JSON.stringify({ ...solve(text), stats: null }));
  });
});
