/** The analyses views' pure logic (components/analyses/analysis-math.ts) on real solver output. */
import { describe, expect, it } from "vitest";
import {
  analysisSections,
  histogramBars,
  histogramMarks,
  rankSensitivities,
} from "@/components/analyses/analysis-math";
import {
  dominantOscillatoryPole,
  MARGIN_DB,
  oscillatorVerdict,
} from "@/components/analyses/oscillator-grade";
import { solveNetlist } from "@/solver";
import type { SolveSuccess } from "@/solver/types";

/** Bridge oscillator with an ideal amplifier of gain K, RC = 100 µs (CHECKS.md §2). */
const oscillator = (k: number) => `
Rs: resistor  amp_out mid   10k
Cs: capacitor mid     pos   10n
Rp: resistor  pos     gnd   10k
Cp: capacitor pos     gnd   10n
E1: vcvs      amp_out gnd   pos gnd ${k}
sweep 100Hz to 10kHz log 200 per decade
loop T cut amp_out before Rs
poles
`;

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}

/** The bridge with a loop cut, its start measured and checked, and optionally Monte Carlo on the gain. */
const graded = (k: number, extra = "") => `
Rs: resistor  amp_out mid   10k${extra ? " tol=5%" : ""}
Cs: capacitor mid     pos   10n
Rp: resistor  pos     gnd   10k
Cp: capacitor pos     gnd   10n
E1: vcvs      amp_out gnd   pos gnd ${k}
sweep 100Hz to 10kHz log 20 per decade
loop T cut amp_out before Rs
measure f0 = zero-phase(T)
measure gain = mag(T) at f0
check gain >= 1
${extra}
`;

describe("oscillatorVerdict", () => {
  it("K = 3.05 grows ×1.17 per cycle at 1.5915 kHz (CHECKS.md §2: ×1.17014625; |s| = 1/RC), only 0.14 dB of loop gain: marginal", () => {
    const v = oscillatorVerdict(solve(oscillator(3.05)))!;
    expect(v.kind).toBe("marginal");
    expect(v.headline).toBe("grows ×1.17 per cycle at 1.5915 kHz — marginal");
    expect(v.pole!.growthPerCycle!).toBeCloseTo(1.17014625, 6);
    // |T| = K·β(ω0) = K/3 at the zero-phase frequency f0 = 1/(2πRC) (OAFE Eq. 15-9), refined on the
    // circuit: exact to rounding, not interpolated between the 200-per-decade sweep points.
    expect(v.loop!.gain!).toBeCloseTo(3.05 / 3, 10);
    expect(v.loop!.frequencyHz! / 1591.5494309189535).toBeCloseTo(1, 9);
    expect(v.detail).toContain("Barkhausen criterion is met");
  });

  it("K = 3.10 grows ×1.37 per cycle (CHECKS.md §2: ×1.36964653), 0.28 dB: still marginal", () => {
    expect(oscillatorVerdict(solve(oscillator(3.1)))!.headline).toBe(
      "grows ×1.37 per cycle at 1.5915 kHz — marginal",
    );
  });

  it("K = 3.2 starts with margin: ×e^(2πσ/ω) = ×1.88 per cycle (σ = (K−3)/(2RC), ω = √(1/(RC)² − σ²), CHECKS.md §2), 0.56 dB", () => {
    const v = oscillatorVerdict(solve(oscillator(3.2)))!;
    expect(v.kind).toBe("starts");
    expect(v.headline).toBe("grows ×1.88 per cycle at 1.5915 kHz");
  });

  it("K = 2.90 decays ×0.73 per cycle — will not start (CHECKS.md §2: ×0.73011538)", () => {
    const v = oscillatorVerdict(solve(oscillator(2.9)))!;
    expect(v.kind).toBe("decays");
    expect(v.headline).toBe("decays ×0.73 per cycle at 1.5915 kHz — will not start");
    expect(v.detail).toContain("not met");
  });

  it("|T| = 1.013 (0.11 dB) at zero phase is marginal, not 'starts', and the margin is named", () => {
    // K = 3.039: |T| = K/3 = 1.013 → 20·log10(1.013) = 0.112 dB < MARGIN_DB.
    const v = oscillatorVerdict(solve(graded(3.039)))!;
    expect(20 * Math.log10(v.loop!.gain!)).toBeLessThan(MARGIN_DB);
    expect(v.kind).toBe("marginal");
    expect(v.headline).toMatch(/^loop gain 1\.013 \(0\.11 dB\) at 1\.5915 kHz — marginal$/);
    expect(v.detail).toContain(`less than ${MARGIN_DB} dB to spare`);
  });

  it("a clear margin whose Monte Carlo fails the start check in some samples is marginal, with the yield named", () => {
    // K = 3.2: |T| = 1.0667, 0.56 dB above 0 dB — starts with margin.
    const clear = oscillatorVerdict(solve(graded(3.2)))!;
    expect(clear.kind).toBe("starts");
    // K = 3.04 with Rs ±5 %: β at zero phase is 1/(1 + Rs/Rp + Cp/Cs) ∈ [1/3.05, 1/2.95], so |T| = K·β
    // spreads over [0.997, 1.031]: some samples fall below 1.
    const r = solve(graded(3.04, "monte-carlo 200 seed=4"));
    const row = r.monteCarlo!.checks!.find((c) => c.expression === "gain >= 1")!;
    expect(row.yield).toBeGreaterThan(0);
    expect(row.yield).toBeLessThan(1);
    expect(row).toMatchObject({ name: "gain", op: ">=", value: 1 });
    // The histogram of `gain` draws its nominal value and the check's limit.
    const nominal = r.measures.find((m) => m.name === "gain")!.value;
    expect(histogramMarks(nominal, [row])).toEqual([
      { x: nominal, label: "nominal", limit: false },
      { x: 1, label: "limit >= 1", limit: true },
    ]);
    const v = oscillatorVerdict(r)!;
    expect(v.kind).toBe("marginal");
    expect(v.detail).toMatch(/Monte Carlo: only \d+(\.\d+)? % of 200 samples pass `gain >= 1`/);
  });

  it("is null without a loop or complex poles", () => {
    const rc = solve(
      "V1: vsource in gnd 1\nR1: resistor in out 10k\nC1: capacitor out gnd 10n\nshow H = volts(out)\npoles\n",
    );
    expect(oscillatorVerdict(rc)).toBeNull();
  });
});

describe("helpers", () => {
  it("dominant pole: largest σ among complex poles with ω > 0", () => {
    const p = dominantOscillatoryPole([
      { re: -5, im: 10, frequencyHz: 1, q: 1, growthPerCycle: 0.04 },
      { re: 2, im: 0, frequencyHz: 1, q: null, growthPerCycle: null },
      { re: -1, im: 20, frequencyHz: 3, q: 10, growthPerCycle: 0.73 },
      { re: -1, im: -20, frequencyHz: 3, q: 10, growthPerCycle: 0.73 },
    ]);
    expect(p).toMatchObject({ re: -1, im: 20 });
  });

  it("ranks sensitivities by size, nulls last", () => {
    const rows = rankSensitivities(
      [
        { measure: "f0", part: "Rf", value: 0.001 },
        { measure: "f0", part: "Rs", value: -0.5 },
        { measure: "f0", part: "Cx", value: null },
        { measure: "q", part: "Rs", value: 9 },
        { measure: "f0", part: "Cs", value: 0.6 },
      ],
      "f0",
    );
    expect(rows.map((r) => r.part)).toEqual(["Cs", "Rs", "Rf", "Cx"]);
  });

  it("histogram bars sit at bin centres with the bin widths", () => {
    expect(histogramBars([0, 1, 3], [4, 6])).toEqual({ x: [0.5, 2], width: [1, 2], y: [4, 6] });
  });
});

describe("analysisSections", () => {
  it("an oscillator's loop gets a verdict and its poles a map; the order is fixed", () => {
    expect(analysisSections(solve(oscillator(3.05)), "ok")).toEqual(["verdict", "poles"]);
  });

  it("an amplifier's loop with no zero-phase crossing and no studies shows no panel at all", () => {
    // Gain-of-10 stage whose loop phase stays between +90° and 0° in the sweep: no oscillation verdict.
    const amp = solve(`
Vin: vsource in gnd 1
U1:  opamp   in neg amp gain=100k gbw=1M rout=50
Cl:  capacitor amp gnd 47n
Rf:  resistor amp neg 9k
Rg:  resistor neg gnd 1k
sweep 100Hz to 1MHz log 20 per decade
loop T cut amp before Cl,Rf method=injection
`);
    expect(analysisSections(amp, "ok")).toEqual([]);
    expect(analysisSections(null, "queued")).toEqual(["job"]);
    expect(analysisSections(null, "ok")).toEqual([]);
  });
});
