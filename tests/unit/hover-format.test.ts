import { describe, expect, it } from "vitest";
import { formatDb, formatDeg, formatHz, formatSigned, hoverTexts } from "@/components/plot/hover-format";

describe("plot number formatting", () => {
  it("writes a space before an SI-prefixed unit", () => {
    expect(formatHz(1698.2436)).toBe("1.6982 kHz");
    expect(formatHz(20)).toBe("20 Hz");
    expect(formatHz(1e6)).toBe("1 MHz");
    expect(formatHz(0.5)).toBe("500 mHz");
  });

  it("writes dB with two decimals and degrees with one, with a true minus sign", () => {
    // 20·log10(1/√2) = −3.0103 dB: the half-power point (common practice).
    expect(formatDb(20 * Math.log10(Math.SQRT1_2))).toBe("−3.01 dB");
    expect(formatDb(-0.001)).toBe("0.00 dB");
    expect(formatDb(null)).toBe("—");
    expect(formatDeg(45)).toBe("45.0°");
    expect(formatDeg(-179.94)).toBe("−179.9°");
    expect(formatDeg(-0.01)).toBe("0.0°");
  });

  it("signs differences", () => {
    expect(formatSigned(1250, formatHz)).toBe("+1.25 kHz");
    expect(formatSigned(-6.0206, formatDb)).toBe("−6.02 dB");
    expect(formatSigned(null, formatDeg)).toBe("—");
  });

  it("builds one hover label per point for each row", () => {
    expect(hoverTexts([100, 1000], [-0.04, -3.0103], 1)).toEqual([
      "100 Hz  ·  −0.04 dB",
      "1 kHz  ·  −3.01 dB",
    ]);
    expect(hoverTexts([1000], [null], 2)).toEqual(["1 kHz  ·  —"]);
  });
});
