import { describe, expect, it } from "vitest";
import { toSi } from "@/components/readings/units";
import { sniffAttachment } from "@/lib/attachments";
import {
  compareReading,
  deriveReading,
  histogramPercentile,
  INSIDE_SPREAD,
  OUTSIDE_SPREAD,
  percentileWords,
} from "@/lib/reading-math";
import { readingCreateSchema } from "@/lib/validations/reading";
import type { MeasureStats } from "@/solver/types";

describe("deriveReading", () => {
  it("turns an oscilloscope period into a frequency and shows the arithmetic", () => {
    // 9.8 div × 10 µs/div = 98 µs; 1/98 µs = 10 204.08 Hz (the worked example of issue 9).
    const d = deriveReading({ quantity: "period", form: "divisions", divisions: 9.8, perDivision: 10e-6 });
    expect(d).toMatchObject({ kind: "frequency", steps: "9.8 div × 10 µs/div = 98 µs → 10.2 kHz" });
    expect(d?.kind === "frequency" && d.hz).toBeCloseTo(10_204.0816, 3);
  });

  it("halves a peak-to-peak span (screen or meter) into the peak the prediction uses", () => {
    // A sine's peak is half its peak-to-peak (common practice): 5.8 div × 1 V/div = 5.8 V → 2.9 V.
    const d = deriveReading({ quantity: "amplitude", form: "divisions", divisions: 5.8, perDivision: 1 });
    expect(d).toMatchObject({
      kind: "amplitude",
      peakV: 2.9,
      steps: "5.8 div × 1 V/div = 5.8 V peak-to-peak ÷ 2 = 2.9 V peak",
    });
    expect(deriveReading({ quantity: "amplitude", form: "peak_to_peak", value: 7 })).toMatchObject({
      peakV: 3.5,
    });
    expect(deriveReading({ quantity: "period", form: "value", value: 1e-3 })).toMatchObject({
      hz: 1000,
      steps: "1 ms → 1 kHz",
    });
  });

  it("gives nothing while a number is missing or not above zero", () => {
    expect(deriveReading({ quantity: "period", form: "divisions", divisions: 9.8 })).toBeNull();
    expect(deriveReading({ quantity: "frequency", form: "value", value: 0 })).toBeNull();
  });
});

describe("compareReading", () => {
  const stats: MeasureStats = {
    name: "f0",
    mean: 1000,
    std: 10,
    min: 970,
    max: 1030,
    percentiles: { p1: 975, p5: 984, p50: 1000, p95: 1016, p99: 1025 },
    histogram: { edges: [970, 990, 1010, 1030], counts: [10, 80, 10] },
  };
  const measures = [{ name: "f0", value: 1000, unit: "Hz", reason: null }];

  it("gives the deviation in % and the place in the Monte Carlo spread", () => {
    const c = compareReading({ kind: "frequency", hz: 1005, seconds: 1 / 1005, steps: "" }, "f0", measures, [
      stats,
    ]);
    expect(c.deviationPct).toBeCloseTo(0.5, 12);
    // 10 samples below 990, then 80 × (15/20) = 60 of the middle bin: 70 of 100.
    expect(c.spread).toMatchObject({ percentile: 70, inside: true, verdict: INSIDE_SPREAD });
    const far = compareReading(
      { kind: "frequency", hz: 1026, seconds: 1 / 1026, steps: "" },
      "f0",
      measures,
      [stats],
    );
    expect(far.spread).toMatchObject({ inside: false, verdict: OUTSIDE_SPREAD });
  });

  it("compares a period with a measure in seconds, and says why when it cannot compare", () => {
    const d = { kind: "frequency" as const, hz: 500, seconds: 2e-3, steps: "" };
    expect(
      compareReading(d, "T", [{ name: "T", value: 2.5e-3, unit: "s", reason: null }], undefined).deviationPct,
    ).toBeCloseTo(-20, 12);
    expect(
      compareReading(d, "gain", [{ name: "gain", value: 3, unit: "", reason: null }], undefined).reason,
    ).toContain("cannot be set beside it");
    expect(compareReading(d, null, measures, undefined).reason).toBe("No predicted measure chosen.");
    const none = compareReading(
      d,
      "f0",
      [{ name: "f0", value: null, unit: "Hz", reason: "it does not start" }],
      undefined,
    );
    expect(none).toMatchObject({ predicted: null, deviationPct: null, reason: "it does not start" });
  });

  it("places values outside the histogram at the ends", () => {
    expect(histogramPercentile(900, [970, 1030], [5])).toBe(0);
    expect(histogramPercentile(2000, [970, 1030], [5])).toBe(100);
    expect(percentileWords(100)).toBe("above every Monte Carlo sample");
    expect(percentileWords(12.4)).toBe("≈12th percentile of the Monte Carlo spread");
    expect(percentileWords(22)).toBe("≈22nd percentile of the Monte Carlo spread");
  });
});

describe("sniffAttachment", () => {
  it("knows PNG and JPEG by their signatures and CSV by its text (PNG spec §5.2; JPEG SOI marker FF D8)", () => {
    expect(sniffAttachment(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))).toBe(
      "image/png",
    );
    expect(sniffAttachment(new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0]))).toBe("image/jpeg");
    expect(sniffAttachment(new TextEncoder().encode("t,v\n0,1\n"))).toBe("text/csv");
    expect(() => sniffAttachment(new TextEncoder().encode("just words"))).toThrow(/PNG or JPEG/);
    expect(() => sniffAttachment(new Uint8Array([0x61, 0x2c, 0x00, 0x62]))).toThrow(/PNG or JPEG/);
  });
});

describe("readingCreateSchema", () => {
  it("treats empty form fields as not given and asks for what the form needs", () => {
    const r = readingCreateSchema.safeParse({
      quantity: "frequency",
      form: "value",
      value: "",
      measureName: "",
    });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join("."))).toEqual(["value"]);
    const ok = readingCreateSchema.parse({
      quantity: "frequency",
      form: "value",
      value: "1.5e3",
      node: " out ",
    });
    expect(ok).toMatchObject({ value: 1500, node: "out" });
    expect(ok.measureName).toBeUndefined();
  });
});

describe("the form's units", () => {
  it("applies the prefix in decimal, so 10 µs is the double nearest 1e-5 (not 10 × 1e-6)", () => {
    expect(toSi("10", "µs", "s")).toBe(1e-5);
    expect(toSi("9,8", "", "s")).toBe(9.8);
    expect(toSi("1.5e1", "kHz", "Hz")).toBe(15_000);
    expect(toSi("abc", "V", "V")).toBeUndefined();
  });
});
