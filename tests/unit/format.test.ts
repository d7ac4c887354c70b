import { describe, expect, it } from "vitest";
import { formatDelta, formatNumber, formatPercent, formatQuantity, formatSiCompact } from "@/solver/format";

describe("formatQuantity", () => {
  it("puts an SI prefix on physical units and none on dB, degrees or ratios", () => {
    // fc of R = 10 kΩ, C = 10 nF: 1591.5494309190 Hz (OAFE §16.2 — CHECKS.md §1).
    expect(formatQuantity(1591.549430919, "Hz")).toBe("1.5915 kHz");
    expect(formatQuantity(994.72, "Hz")).toBe("994.72 Hz");
    expect(formatQuantity(100010, "Hz")).toBe("100.01 kHz");
    expect(formatQuantity(4.7e-9, "F")).toBe("4.7 nF");
    expect(formatQuantity(2.2e-6, "F")).toBe("2.2 µF");
    expect(formatQuantity(4700, "ohm")).toBe("4.7 kΩ");
    // Wien network β at f0 is 1/3: −9.542425 dB (OAFE §15.7.1 — CHECKS.md §2).
    expect(formatQuantity(-9.542425094, "dB")).toBe("−9.5424 dB");
    expect(formatQuantity(-1000, "dB")).toBe("−1000 dB");
    expect(formatQuantity(45.000012, "deg")).toBe("45°");
    expect(formatQuantity(0.618187, "")).toBe("0.61819");
    expect(formatQuantity(null, "Hz")).toBe("—");
    expect(formatQuantity(0, "Hz")).toBe("0 Hz");
  });

  it("writes signed differences and tiny numbers readably", () => {
    expect(formatDelta(12.5, "Hz")).toBe("+12.5 Hz");
    expect(formatDelta(-0.31, "dB")).toBe("−0.31 dB");
    expect(formatPercent(-54.6379)).toBe("−54.64 %");
    expect(formatPercent(null)).toBe("—");
    expect(formatNumber(-5.4624e-5, 4)).toBe("−5.462×10⁻⁵");
    expect(formatNumber(3.2e12, 3)).toBe("3.2×10¹²");
    expect(formatQuantity(2.5e-18, "F")).toBe("2.5×10⁻¹⁸ F");
  });

  it("writes bare values the way a netlist would", () => {
    expect(formatSiCompact(4.7e-9)).toBe("4.7n");
    expect(formatSiCompact(22000)).toBe("22k");
    expect(formatSiCompact(1e6)).toBe("1M");
    expect(formatSiCompact(2.2e-6)).toBe("2.2u");
    expect(formatSiCompact(0.5)).toBe("500m");
    expect(formatSiCompact(3.05)).toBe("3.05");
    // Below the smallest prefix it stays a number the netlist reads (ASCII exponent).
    expect(formatSiCompact(2.5e-19)).toBe("2.5e-19");
  });
});
