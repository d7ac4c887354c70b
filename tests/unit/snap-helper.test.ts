/** Standard R/C pairs for a target frequency (lib/snap-pairs.ts), checked by hand arithmetic. */
import { describe, expect, it } from "vitest";
import {
  freePairNames,
  netlistNumber,
  networkFrequency,
  pairLets,
  rankPairs,
  seriesInRange,
} from "@/lib/snap-pairs";

describe("rankPairs", () => {
  it("1 kHz single RC from E24 R and E12 C: 16 kΩ with 10 nF, −0.528 %", () => {
    // RC = 1/(2π·1 kHz) = 159.155 µs; with C = 10 nF the ideal R is 15.9155 kΩ → E24 16 kΩ.
    // f = 1/(2π·16 kΩ·10 nF) = 1/(2π·160 µs) = 994.718 Hz → (994.718 − 1000)/1000 = −0.5282 %
    // (hand arithmetic; CHECKS.md §1 for f = 1/(2πRC)). 160 k/1 n and 1.6 k/100 n give the same
    // product; 16 k sits nearest the middle of 1 k…1 M on a log scale (√(1k·1M) = 31.6 kΩ).
    const pairs = rankPairs({ targetHz: 1000, network: "rc", rSeries: "E24", cSeries: "E12" });
    expect(pairs[0]).toMatchObject({ r: 16_000, c: 10e-9 });
    expect(pairs[0]!.frequencyHz).toBeCloseTo(994.7184, 3);
    expect(pairs[0]!.errorPct).toBeCloseTo(-0.52816, 4);
    expect(pairs.slice(1, 3).map((p) => [p.r, p.c])).toEqual(
      expect.arrayContaining([
        [160_000, 1e-9],
        [1_600, 100e-9],
      ]),
    );
    // Next best: 13 kΩ · 12 nF = 156 µs → 1020.22 Hz, +2.022 % (hand arithmetic).
    expect(pairs[3]!.errorPct).toBeCloseTo(2.0224, 3);
    for (let i = 1; i < pairs.length; i++) {
      expect(Math.abs(pairs[i]!.errorPct)).toBeGreaterThanOrEqual(Math.abs(pairs[i - 1]!.errorPct) - 1e-9);
    }
  });

  it("the bridge with 10 kΩ and 10 nF hits 1591.5494 Hz exactly (CHECKS.md §2)", () => {
    const pairs = rankPairs({ targetHz: 1591.5494309, network: "bridge", rSeries: "E24", cSeries: "E6" });
    expect(pairs[0]!.r * pairs[0]!.c).toBeCloseTo(1e-4, 12);
    expect(Math.abs(pairs[0]!.errorPct)).toBeLessThan(1e-6);
  });

  it("phase shift uses f = 1/(2π√6·RC): 10 kΩ, 10 nF → 649.747 Hz (CHECKS.md §7)", () => {
    expect(networkFrequency("phase-shift", 10e3, 10e-9)).toBeCloseTo(649.74733436, 6);
    const pairs = rankPairs({
      targetHz: 649.74733436,
      network: "phase-shift",
      rSeries: "E12",
      cSeries: "E6",
    });
    expect(Math.abs(pairs[0]!.errorPct)).toBeLessThan(1e-6);
    expect(pairs[0]!.r * pairs[0]!.c).toBeCloseTo(1e-4, 12);
  });

  it("keeps to the ranges", () => {
    const pairs = rankPairs({
      targetHz: 1000,
      network: "rc",
      rSeries: "E96",
      cSeries: "E6",
      rRange: [10e3, 20e3],
      cRange: [10e-9, 10e-9],
    });
    // Only C = 10 nF: ideal R 15.9155 kΩ → E96 15.8 kΩ: 1/(2π·158 µs) = 1007.310 Hz, +0.7310 %;
    // 16.2 kΩ gives −1.756 % (hand arithmetic).
    expect(pairs[0]).toMatchObject({ r: 15_800, c: 10e-9 });
    expect(pairs[0]!.errorPct).toBeCloseTo(0.731, 3);
    for (const p of pairs) {
      expect(p.r).toBeGreaterThanOrEqual(10e3);
      expect(p.r).toBeLessThanOrEqual(20e3);
      expect(p.c).toBe(10e-9);
    }
  });

  it("returns nothing for a bad target or an empty range", () => {
    expect(rankPairs({ targetHz: 0, network: "rc", rSeries: "E24", cSeries: "E12" })).toEqual([]);
    expect(
      rankPairs({ targetHz: 1000, network: "rc", rSeries: "E24", cSeries: "E12", rRange: [5e3, 1e3] }),
    ).toEqual([]);
  });
});

describe("helpers", () => {
  it("seriesInRange lists one decade of E12 from 1 k to 10 k inclusive", () => {
    expect(seriesInRange("E12", 1e3, 10e3)).toEqual([
      1000, 1200, 1500, 1800, 2200, 2700, 3300, 3900, 4700, 5600, 6800, 8200, 10000,
    ]); // IEC 60063 E12 (CHECKS.md §9)
  });

  it("writes values in the netlist's SI notation and the let lines", () => {
    expect(netlistNumber(16_000)).toBe("16k");
    expect(netlistNumber(10e-9)).toBe("10n");
    expect(netlistNumber(4.7e-9)).toBe("4.7n");
    expect(netlistNumber(1.5e6)).toBe("1.5M");
    expect(netlistNumber(220e-12)).toBe("220p");
    expect(pairLets({ r: 16_000, c: 10e-9 })).toBe("let R = 16k\nlet C = 10n\n");
  });
});

describe("freePairNames", () => {
  it("inserts R and C when free, else names no part, node or let of the netlist uses", () => {
    expect(freePairNames("Vin: vsource in gnd 1\nRs: resistor in out 10k\n")).toEqual({ r: "R", c: "C" });
    expect(freePairNames("let R = 10k\nC1: capacitor a gnd 1n\n")).toEqual({ r: "R_snap", c: "C_snap" });
    expect(freePairNames("let R = 1\nlet C_snap = 2\n")).toEqual({ r: "R_snap2", c: "C_snap2" });
  });
});
