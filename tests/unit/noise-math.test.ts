import { describe, expect, it } from "vitest";
import { bandRms, dominantView, noiseShares } from "@/components/analyses/noise-math";
import type { NoiseResult } from "@/solver/types";

const logGrid = (a: number, b: number, n: number) =>
  Array.from({ length: n + 1 }, (_, k) => a * (b / a) ** (k / n));

describe("bandRms (power-law segments)", () => {
  it("a flat density e over [f1, f2] gives e·√(f2 − f1) (common practice)", () => {
    const f = logGrid(1, 1e5, 50);
    const v = bandRms(
      f,
      f.map(() => 4e-9),
      20,
      20e3,
    );
    expect(v).toBeCloseTo(4e-9 * Math.sqrt(20e3 - 20), 18);
  });

  it("a 1/f density² e²·fc/f integrates to e·√(fc·ln(f2/f1)) exactly on any grid", () => {
    const f = logGrid(1, 1e4, 7);
    const v = bandRms(
      f,
      f.map((x) => 1e-8 * Math.sqrt(100 / x)),
      10,
      1e3,
    )!;
    expect(Math.abs(v / (1e-8 * Math.sqrt(100 * Math.log(100))) - 1)).toBeLessThan(1e-12);
  });

  it("is null for a band outside the samples", () => {
    expect(bandRms([1, 10], [1, 1], 100, 1000)).toBeNull();
  });
});

describe("noiseShares and dominantView", () => {
  it("orders the contributions by share of the band's power", () => {
    const f = [10, 100, 1000];
    const n: NoiseResult = {
      name: "N",
      probe: "volts(out)",
      density: f.map(() => 5),
      inputDensity: null,
      input: null,
      temperature: 300.15,
      contributions: [
        { part: "R1", source: "thermal", density: f.map(() => 3) },
        { part: "U1", source: "en", density: f.map(() => 4) },
      ],
    };
    const s = noiseShares(n, f, 10, 1000);
    expect(s.map((x) => x.label)).toEqual(["U1 en", "R1"]);
    expect(s[0]!.share).toBeCloseTo(16 / 25, 12);
  });

  it("keeps the dominant pair and lists a far op-amp pole apart", () => {
    const v = dominantView(
      [
        { re: -1e3, im: 6e3, frequencyHz: 970, q: 3, growthPerCycle: 0.35 },
        { re: -1e3, im: -6e3, frequencyHz: 970, q: 3, growthPerCycle: 0.35 },
        { re: -6e8, im: 0, frequencyHz: 9.5e7, q: 0.5, growthPerCycle: null },
      ],
      [{ probe: "volts(out)", re: 0, im: 1e4, frequencyHz: 1591, q: null }],
    );
    expect(v.near).toHaveLength(3);
    expect(v.far.map((r) => r.kind)).toEqual(["pole"]);
    expect(v.reach).toBe(1e4);
  });
});
