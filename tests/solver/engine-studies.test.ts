/** Analyses beyond one sweep: poles, sensitivity, vary, Monte Carlo (netlist text end to end). */
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import type { SolveSuccess } from "@/solver/types";
import { expectClose } from "./engine-tolerance";

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}

/** A Wien oscillator with an ideal amplifier of gain K (a vcvs), RC = 100 µs. */
const oscillator = (k: number) => `
Rs: resistor  amp_out mid   10k
Cs: capacitor mid     pos   10n
Rp: resistor  pos     gnd   10k
Cp: capacitor pos     gnd   10n
E1: vcvs      amp_out gnd   pos gnd ${k}
sweep 100Hz to 10kHz log 10 per decade
poles
`;

const wienNet = `
V1: vsource   in  gnd 1
Rs: resistor  in  mid 10k tol=1%
Cs: capacitor mid pos 10n tol=1%
Rp: resistor  pos gnd 10k tol=1%
Cp: capacitor pos gnd 10n tol=1%
sweep 100Hz to 10kHz log 50 per decade
show beta = volts(pos) / volts(in)
measure f0 = zero-phase(beta)
measure b0 = mag(beta) at f0
check f0 between 1.58kHz and 1.60kHz
`;

describe("poles (OAFE §15.7.1 characteristic equation; Sedra & Smith, Wien-bridge section)", () => {
  it("K = 3.05: s = 250 ± j9996.874512, growing ×1.17014625 per cycle", () => {
    const r = solve(oscillator(3.05));
    expect(r.poles).toHaveLength(2);
    const p = r.poles![0]!;
    expectClose(p.re, 250, 1e-9); // CHECKS §2: RCs = (K−3)/2 ± j√(1−((K−3)/2)²)
    expectClose(Math.abs(p.im), 9996.874512, 1e-9); // CHECKS §2
    expectClose(p.growthPerCycle, 1.17014625, 1e-8); // CHECKS §2: exp(2πσ/ω)
    expectClose(p.frequencyHz, 1591.5494309, 1e-9); // |s| = 1/RC on the circle (CHECKS §2)
    expect(r.poles![1]!.im).toBeCloseTo(-p.im, 6);
  });

  it("K = 2.90: the same pair in the left half-plane, decaying ×0.73011538 per cycle", () => {
    const r = solve(oscillator(2.9));
    const p = r.poles![0]!;
    expect(p.re).toBeLessThan(0);
    expectClose(p.growthPerCycle, 0.73011538, 1e-8); // CHECKS §2
    expectClose(p.q, 1 / (3 - 2.9), 1e-9); // Q = |s|/(−2σ) = 1/(3−K) (CHECKS §2 derivation)
  });
});

describe("poles of a Sallen–Key low-pass (OAFE §16.3.2.1, Ex. 16-3 second stage)", () => {
  it("one complex pair at f0 = 49 915.524 Hz with Q = 0.618187", () => {
    const r = solve(`
Vin: vsource   in  gnd 1
R1:  resistor  in  a   1.87k
R2:  resistor  a   b   4.42k
Cg:  capacitor b   gnd 820p
Cf:  capacitor a   out 1.5n
U1:  opamp     b   out out
sweep 1kHz to 1MHz log 10 per decade
poles
`);
    expect(r.poles).toHaveLength(2);
    expectClose(r.poles![0]!.frequencyHz, 49915.524, 1e-8); // CHECKS §4: 1/(2π√(R1R2·Cg·Cf))
    expectClose(r.poles![0]!.q, 0.618187, 1e-6); // CHECKS §4: √(R1R2CgCf)/(Cg(R1+R2))
  });
});

describe("sensitivity", () => {
  it("the bridge's f0 = 1/(2π√(R1R2C1C2)) has sensitivity −1/2 to each R and C (OAFE Eq. 15-9)", () => {
    const r = solve(`${wienNet}sensitivity f0\n`);
    expect(r.sensitivity?.map((s) => s.part)).toEqual(["Rs", "Cs", "Rp", "Cp"]);
    for (const s of r.sensitivity!) expectClose(s.value, -0.5, 1e-6); // OAFE Eq. 15-9: f0 ∝ (R1R2C1C2)^(−1/2)
  });
});

describe("vary", () => {
  it("re-solves per value: Rp = 5k gives f0 = 1/(2π√(R1R2C1C2)) and β = 1/(1 + R1/R2 + C2/C1) = 1/4", () => {
    const r = solve(`${wienNet}vary Rp over 5k, 10k, 20k\n`);
    expect(r.variants?.map((v) => [v.name, v.value])).toEqual([
      ["Rp", 5e3],
      ["Rp", 10e3],
      ["Rp", 20e3],
    ]);
    const v0 = r.variants![0]!;
    expectClose(v0.measures[0]!.value, 1 / (2 * Math.PI * Math.sqrt(10e3 * 5e3 * 10e-9 * 10e-9)), 1e-9); // OAFE Eq. 15-9
    expectClose(v0.measures[1]!.value, 0.25, 1e-9); // OAFE Eq. 15-8
    expect(v0.checks[0]!.pass).toBe(false);
    expect(r.variants![1]!.checks[0]!.pass).toBe(true);
    expect(v0.traces[0]!.re).toHaveLength(r.frequencies.length);
  });

  it("varies a let by re-compiling with an override", () => {
    const r = solve(
      `let R = 10k\n${wienNet.replace("Rp: resistor  pos gnd 10k", "Rp: resistor  pos gnd R")}vary R over 20k\n`,
    );
    expectClose(r.variants![0]!.measures[1]!.value, 1 / (1 + 0.5 + 1), 1e-9); // OAFE Eq. 15-8
  });
});

describe("monte-carlo", () => {
  it("is reproducible per seed and its spread matches the sensitivities (σ_f = ½·√4·tol/3)", () => {
    const text = `${wienNet}monte-carlo 300 seed=7 dist=normal\n`;
    const a = solve(text);
    const b = solve(text);
    expect(a.monteCarlo).toEqual(b.monteCarlo);
    const mc = a.monteCarlo!;
    expect(mc.samples).toBe(300);
    expect(mc.seed).toBe(7);
    const f0 = mc.measures.find((m) => m.name === "f0")!;
    expect(f0.histogram.counts.reduce((x, y) => x + y, 0)).toBe(300);
    expect(f0.histogram.edges).toHaveLength(f0.histogram.counts.length + 1);
    const p = f0.percentiles;
    expect(p.p1! <= p.p5! && p.p5! <= p.p50! && p.p50! <= p.p95! && p.p95! <= p.p99!).toBe(true);
    // Four parts, each σ = 1%/3, sensitivity −½: σ_f/f0 = ½·√4·(0.01/3) (propagation of error, common practice).
    expectClose(f0.std! / 1591.5494309, 0.01 / 3, 0.15);
    expectClose(f0.mean!, 1591.5494309, 2e-3);
    expect(mc.yield).toBeGreaterThan(0.9);
    expect(mc.yield).toBeLessThan(1);
  });

  it("uniform samples stay inside the tolerance band", () => {
    const r = solve(`${wienNet}monte-carlo 200 seed=3 dist=uniform\n`);
    const f0 = r.monteCarlo!.measures.find((m) => m.name === "f0")!;
    expect(f0.min!).toBeGreaterThanOrEqual(1591.5494309 / 1.01 ** 2);
    expect(f0.max!).toBeLessThanOrEqual(1591.5494309 / 0.99 ** 2);
  });
});
