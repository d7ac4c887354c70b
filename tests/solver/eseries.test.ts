import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { E_SERIES, type SeriesName, seriesValues, snap } from "@/solver/lang/eseries";

// Reference: IEC 60063:2015 preferred-number series, as summarised in CHECKS.md §9
// (standard confirmed; the E12/E24 lists there are from memory, matching third-party lists).
const E24_LIST = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8,
  7.5, 8.2, 9.1,
];
const E12_LIST = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];
const NAMES: SeriesName[] = ["E6", "E12", "E24", "E48", "E96", "E192"];

describe("E-series values (IEC 60063, CHECKS.md §9)", () => {
  it("E96 is round(10^(i/96), 2) for every i (CHECKS.md §9, checked)", () => {
    const e96 = seriesValues("E96");
    expect(e96).toHaveLength(96);
    e96.forEach((v, i) => {
      expect(v).toBe(Math.round(10 ** (i / 96) * 100) / 100);
    });
  });

  it("E24 is the listed series (CHECKS.md §9)", () => {
    expect(seriesValues("E24")).toEqual(E24_LIST);
  });

  it("E24 departs from round(10^(i/24), 1) exactly at 2.7 3.0 3.3 3.6 3.9 4.3 4.7 8.2 (CHECKS.md §9)", () => {
    const departures = E24_LIST.filter((v, i) => v !== Math.round(10 ** (i / 24) * 10) / 10);
    expect(departures).toEqual([2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]);
  });

  it("E12 is every second E24 value and equals the listed E12 (CHECKS.md §9)", () => {
    expect(seriesValues("E12")).toEqual(E24_LIST.filter((_, i) => i % 2 === 0));
    expect(seriesValues("E12")).toEqual(E12_LIST);
  });

  it("E6 is every second E12 value (CHECKS.md §9)", () => {
    expect(seriesValues("E6")).toEqual([1.0, 1.5, 2.2, 3.3, 4.7, 6.8]);
  });

  it("E48 is every second E96 value and E192 holds E96 at even places, with 9.20 (three digits; from memory)", () => {
    expect(seriesValues("E48")).toEqual(seriesValues("E96").filter((_, i) => i % 2 === 0));
    const e192 = seriesValues("E192");
    expect(e192).toHaveLength(192);
    expect(e192.filter((_, i) => i % 2 === 0)).toEqual(seriesValues("E96"));
    expect(e192).toContain(9.2);
    expect(e192).not.toContain(9.19);
  });

  it("every series is strictly ascending within one decade", () => {
    for (const name of NAMES) {
      const values = E_SERIES[name];
      for (let i = 1; i < values.length; i++) expect(values[i]!).toBeGreaterThan(values[i - 1]!);
      expect(values[0]).toBe(1);
      expect(values[values.length - 1]!).toBeLessThan(10);
    }
  });

  it("seriesValues returns a copy", () => {
    const copy = seriesValues("E6");
    copy[0] = 99;
    expect(E_SERIES.E6[0]).toBe(1);
  });
});

describe("snap", () => {
  it("picks the nearest value in log distance across decades", () => {
    expect(snap("E24", 9.6)).toBe(10); // |ln(10/9.6)| = 0.0408 < |ln(9.6/9.1)| = 0.0535
    expect(snap("E24", 9.5)).toBe(9.1); // 0.0430 < 0.0513
    expect(snap("E12", 4.5e3)).toBe(4700);
    expect(snap("E6", 0.00039)).toBe(0.00033);
    expect(snap("E96", 1591.55)).toBe(1580);
  });

  it("returns exact decimal values (4.7 × 10³ is 4700, not 4700.000000000001)", () => {
    expect(snap("E24", 4.7e3)).toBe(4700);
    expect(snap("E24", 1.1e-9)).toBe(1.1e-9);
  });

  it("refuses values that are not positive and finite", () => {
    expect(() => snap("E24", 0)).toThrow(RangeError);
    expect(() => snap("E24", -1)).toThrow(RangeError);
    expect(() => snap("E24", Number.NaN)).toThrow(RangeError);
  });

  it("property: the result is a series value and no series value in any nearby decade is nearer", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...NAMES),
        fc.double({ min: -12, max: 12, noNaN: true }),
        (name, exponent) => {
          const x = 10 ** exponent;
          const v = snap(name, x);
          const mantissa = Number((v / 10 ** Math.floor(Math.log10(v) + 1e-12)).toPrecision(6));
          expect(E_SERIES[name]).toContain(mantissa);
          const d = Math.abs(Math.log(v / x));
          for (let k = Math.floor(exponent) - 2; k <= Math.floor(exponent) + 2; k++) {
            for (const m of E_SERIES[name])
              expect(d).toBeLessThanOrEqual(Math.abs(Math.log((m * 10 ** k) / x)) + 1e-9);
          }
        },
      ),
      { seed: 20261202, numRuns: 300 },
    );
  });

  it("property: snapping a series value returns it unchanged", () => {
    fc.assert(
      fc.property(fc.constantFrom(...NAMES), fc.nat(), fc.integer({ min: -9, max: 9 }), (name, i, k) => {
        const values = E_SERIES[name];
        const v = Number((values[i % values.length]! * 10 ** k).toPrecision(12));
        expect(snap(name, v)).toBe(v);
      }),
      { seed: 7, numRuns: 300 },
    );
  });
});
