/**
 * Noise measures inside Monte Carlo samples: each sample's noise is solved on that sample's circuit
 * (its resistors' own 4kT/R and its own transfer), not left out.
 *
 * Reference: an RC low-pass with R and C toleranced. Its output noise density is
 *   √(4kTR) / √(1 + (f/fc)²),  fc = 1/(2πRC)   (Johnson–Nyquist, CHECKS §10, through a single pole),
 * and over a band its rms is √(4kTR·fc·(atan(f2/fc) − atan(f1/fc))) (integral of a single-pole
 * response, common practice; also in tests/solver/noise.test.ts). Each sample's R and C are
 * re-drawn here with the engine's own seeded drawSamples, so every sample's value is known in
 * closed form and the statistics can be compared exactly.
 */
import { afterAll, describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { drawSamples, stats } from "@/solver/engine/monte-carlo";
import { compile } from "@/solver/lang";
import { solveNetlistParallel, stopSampleWorkers } from "@/solver/parallel";
import type { MeasureStats, SolveSuccess } from "@/solver/types";

const K = 1.380649e-23; // J/K, exact (SI Brochure, 9th ed., 2019)
const KELVIN = 300.15; // the language's default 27 °C
const SAMPLES = 150;

const net = `
title RC noise spread
V1: vsource   in  gnd 1
R1: resistor  in  out 10k tol=10%
C1: capacitor out gnd 10n tol=5%
sweep 10Hz to 100kHz log 50 per decade
noise N = volts(out) input V1
measure spot = noise(N) at 1kHz
measure band = noise(N) from 20Hz to 20kHz
measure referred = input-noise(N) at 1kHz
check band < 624nV
monte-carlo ${SAMPLES} seed=11
`;

afterAll(async () => {
  await stopSampleWorkers();
});

/** Each sample's closed-form figures, from the same draws the engine makes. */
function expected() {
  const c = compile(net);
  if (!c.ok) throw new Error(JSON.stringify(c.errors));
  const d = drawSamples(c.circuit, c.circuit.monteCarlo!);
  expect(d.names).toEqual(["R1", "C1"]);
  const spot: number[] = [];
  const band: number[] = [];
  const referred: number[] = [];
  for (let s = 0; s < d.samples; s++) {
    const r = d.values[2 * s]!;
    const cap = d.values[2 * s + 1]!;
    const fc = 1 / (2 * Math.PI * r * cap);
    const white = 4 * K * KELVIN * r;
    const h2 = 1 / (1 + (1e3 / fc) ** 2);
    spot.push(Math.sqrt(white * h2));
    band.push(Math.sqrt(white * fc * (Math.atan(20e3 / fc) - Math.atan(20 / fc))));
    // Referred to V1: the output density divided by |H| — √(4kTR) whatever the pole.
    referred.push(Math.sqrt(white));
  }
  return { spot, band, referred };
}

function expectStats(got: MeasureStats | undefined, want: MeasureStats, rel: number) {
  expect(got).toBeDefined();
  for (const key of ["mean", "std", "min", "max"] as const) {
    expect(Math.abs(got![key]! / want[key]! - 1)).toBeLessThan(rel);
  }
  for (const p of ["p1", "p5", "p50", "p95", "p99"] as const) {
    expect(Math.abs(got!.percentiles[p]! / want.percentiles[p]! - 1)).toBeLessThan(rel);
  }
  expect(got!.histogram.counts.reduce((a, b) => a + b, 0)).toBe(SAMPLES);
}

describe("noise measures in Monte Carlo samples", () => {
  const r = solveNetlist(net) as SolveSuccess;
  const want = expected();

  it("are solved for every sample: statistics equal the closed form per sample", () => {
    expect(r.ok).toBe(true);
    const mc = r.monteCarlo!;
    // at 1 kHz: one solve and one adjoint solve per sample (to rounding)
    expectStats(
      mc.measures.find((m) => m.name === "spot"),
      stats("spot", want.spot),
      1e-9,
    );
    // over a band: adaptive quadrature to 1e-9 relative in power
    expectStats(
      mc.measures.find((m) => m.name === "band"),
      stats("band", want.band),
      1e-8,
    );
    expectStats(
      mc.measures.find((m) => m.name === "referred"),
      stats("referred", want.referred),
      1e-9,
    );
    // The spread is real: R alone moves √(4kTR) by about ±5 %.
    const spot = mc.measures.find((m) => m.name === "spot")!;
    expect(spot.max! / spot.min! - 1).toBeGreaterThan(0.05);
  });

  it("a check on a noise measure has the yield of the samples that pass it", () => {
    const pass = want.band.filter((v) => v < 624e-9).length;
    expect(pass).toBeGreaterThan(0);
    expect(pass).toBeLessThan(SAMPLES); // the limit sits inside the spread
    expect(r.monteCarlo!.yield).toBe(pass / SAMPLES);
    expect(r.monteCarlo!.checks?.[0]?.yield).toBe(pass / SAMPLES);
  });

  it("the nominal value is the nominal circuit's (the samples do not disturb it)", () => {
    const band = r.measures.find((m) => m.name === "band")!;
    const fc = 1 / (2 * Math.PI * 10e3 * 10e-9);
    const nominal = Math.sqrt(4 * K * KELVIN * 10e3 * fc * (Math.atan(20e3 / fc) - Math.atan(20 / fc)));
    expect(Math.abs(band.value! / nominal - 1)).toBeLessThan(1e-8);
  });

  it("worker threads give the same result (150 samples × 201 points is above the threads' threshold)", async () => {
    const p = await solveNetlistParallel(net, { threads: 2 });
    expect(JSON.stringify({ ...p, stats: null })).toBe(JSON.stringify({ ...r, stats: null }));
  }, 60_000);
});
