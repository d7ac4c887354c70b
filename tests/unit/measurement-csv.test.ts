// Bench data files as instruments and spreadsheets write them (lib/measurements.ts).
import { describe, expect, it } from "vitest";
import { parseMeasurementCsv, readCell } from "@/lib/measurements";

describe("readCell", () => {
  it("reads plain numbers, SI-prefixed frequencies and cells with their units", () => {
    expect(readCell("1591.5", 0)).toBe(1591.5);
    expect(readCell("1k", 0)).toBe(1000);
    expect(readCell("1.5 kHz", 0)).toBe(1500);
    expect(readCell("2MHz", 0)).toBe(2e6);
    expect(readCell("100mHz", 0)).toBeCloseTo(0.1, 15);
    expect(readCell("-3.01 dB", 1)).toBe(-3.01);
    expect(readCell("−3.01dB", 1)).toBe(-3.01); // a typographic minus
    expect(readCell("45°", 2)).toBe(45);
    expect(readCell("-90 deg", 2)).toBe(-90);
  });

  it("refuses a prefix on dB or degrees, and words that are not units", () => {
    expect(readCell("3k", 1)).toBeNull();
    expect(readCell("45 rad", 2)).toBeNull();
    expect(readCell("x", 0)).toBeNull();
    expect(readCell("1 kV", 0)).toBeNull();
  });
});

describe("parseMeasurementCsv", () => {
  it("takes a header, prefixed frequencies and units; reports a bad cell by line and column", () => {
    const ok = parseMeasurementCsv("f,mag,phase\n100,-0.1 dB,-5°\n1k,-3 dB,-45°\n10 kHz,-20dB,-84 deg\n");
    expect(ok).toEqual({
      ok: true,
      data: { frequencies: [100, 1000, 10000], magnitudeDb: [-0.1, -3, -20], phaseDeg: [-5, -45, -84] },
    });
    const bad = parseMeasurementCsv("f,mag,phase\n100,-0.1,-5\n1k,loud,-45\n");
    expect(bad).toEqual({
      ok: false,
      errors: [{ line: 3, message: 'Column 2 is not a magnitude in dB: "loud".' }],
    });
  });
});
