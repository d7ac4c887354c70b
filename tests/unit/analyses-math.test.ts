/** The analyses views' pure logic (components/analyses/analysis-math.ts) on real solver output. */
import { describe, expect, it } from "vitest";
import {
  analysisSections,
  dominantOscillatoryPole,
  histogramBars,
  oscillatorVerdict,
  rankSensitivities,
  shortHz,
} from "@/components/analyses/analysis-math";
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

describe("oscillatorVerdict", () => {
  it("K = 3.05 grows ×1.17 per cycle at 1.59 kHz (CHECKS.md §2: ×1.17014625; |s| = 1/RC)", () => {
    const v = oscillatorVerdict(solve(oscillator(3.05)))!;
    expect(v.kind).toBe("grows");
    expect(v.headline).toBe("grows ×1.17 per cycle at 1.59 kHz");
    expect(v.pole!.growthPerCycle!).toBeCloseTo(1.17014625, 6);
    // |T| = K·β(ω0) = K/3 at the zero-phase frequency (OAFE Eq. 15-9), read off the sweep.
    expect(v.loop!.magnitude).toBeCloseTo(3.05 / 3, 3);
    expect(Math.abs(v.loop!.frequencyHz / 1591.5494309 - 1)).toBeLessThan(1e-3);
    expect(v.detail).toContain("Barkhausen criterion is met");
  });

  it("K = 3.10 grows ×1.37 per cycle (CHECKS.md §2: ×1.36964653)", () => {
    expect(oscillatorVerdict(solve(oscillator(3.1)))!.headline).toBe("grows ×1.37 per cycle at 1.59 kHz");
  });

  it("K = 2.90 decays ×0.73 per cycle — will not start (CHECKS.md §2: ×0.73011538)", () => {
    const v = oscillatorVerdict(solve(oscillator(2.9)))!;
    expect(v.kind).toBe("decays");
    expect(v.headline).toBe("decays ×0.73 per cycle at 1.59 kHz — will not start");
    expect(v.detail).toContain("not met");
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

  it("short frequencies", () => {
    expect(shortHz(1591.549)).toBe("1.59 kHz");
    expect(shortHz(2.5e6)).toBe("2.5 MHz");
    expect(shortHz(50)).toBe("50 Hz");
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
