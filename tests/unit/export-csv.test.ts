import { describe, expect, it } from "vitest";
import { csvField, csvHeader, resultToCsv } from "@/solver/csv";
import type { TraceResult } from "@/solver/types";

/** A trace from complex samples, with dB and degrees derived the usual way (common practice). */
function trace(name: string, values: [number, number][]): TraceResult {
  return {
    name,
    kind: "probe",
    re: values.map((v) => v[0]),
    im: values.map((v) => v[1]),
    magnitudeDb: values.map(([re, im]) => 20 * Math.log10(Math.hypot(re, im))),
    phaseDeg: values.map(([re, im]) => (Math.atan2(im, re) * 180) / Math.PI),
  };
}

describe("resultToCsv", () => {
  it("writes the header and one row per frequency with re, im, dB and degrees per trace", () => {
    // First-order RC low-pass at fc and 10·fc, R = 10 kΩ, C = 10 nF: fc = 1591.5494309190 Hz,
    // H(fc) = 0.5 − j0.5 (−3.0103 dB, −45°) — OAFE §16.2, Fig. 16-2 (CHECKS.md §1).
    const fc = 1591.549430919;
    const h10 = { re: 1 / 101, im: -10 / 101 };
    const csv = resultToCsv({
      frequencies: [fc, 10 * fc],
      traces: [
        trace("lp", [
          [0.5, -0.5],
          [h10.re, h10.im],
        ]),
      ],
    });
    const lines = csv.split("\r\n");
    expect(lines[0]).toBe("frequency_hz,lp_re,lp_im,lp_db,lp_deg");
    expect(lines).toHaveLength(4); // header, two rows, the empty string after the final CRLF
    expect(lines[3]).toBe("");
    const row1 = lines[1]!.split(",").map(Number);
    expect(row1[0]).toBe(fc);
    expect(row1[1]).toBe(0.5);
    expect(row1[2]).toBe(-0.5);
    expect(row1[3]).toBeCloseTo(-3.0102999566, 9);
    expect(row1[4]).toBeCloseTo(-45, 9);
    const row2 = lines[2]!.split(",").map(Number);
    expect(row2[0]).toBeCloseTo(15915.49430919, 6);
    // At 10·fc: |H| = 0.0995037190 (−20.043214 dB), −84.289407° (CHECKS.md §1).
    expect(row2[3]).toBeCloseTo(-20.043214, 6);
    expect(row2[4]).toBeCloseTo(-84.289407, 6);
  });

  it("keeps full precision so the CSV reads back to the same doubles", () => {
    const x = 0.1 + 0.2;
    const csv = resultToCsv({ frequencies: [x], traces: [trace("t", [[x, -x]])] });
    const cells = csv.split("\r\n")[1]!.split(",");
    expect(Number(cells[0])).toBe(x);
    expect(Number(cells[2])).toBe(-x);
  });

  it("quotes trace names with commas or quotes (RFC 4180) and leaves plain ones bare", () => {
    expect(csvField('volts(a, b) "diff"_re')).toBe('"volts(a, b) ""diff""_re"');
    expect(csvField("bridge_re")).toBe("bridge_re");
    expect(csvField("line\nbreak")).toBe('"line\nbreak"');
    expect(csvHeader([{ name: "volts(a, b)" }, { name: "T" }])).toBe(
      'frequency_hz,"volts(a, b)_re","volts(a, b)_im","volts(a, b)_db","volts(a, b)_deg",T_re,T_im,T_db,T_deg',
    );
  });

  // OWASP "CSV Injection": cells starting with = + - @ tab or CR get a leading apostrophe.
  it("neutralizes text cells a spreadsheet would run as formulas, in the header of every export", () => {
    expect(csvField('=HYPERLINK("http://evil.test","x")')).toBe(`"'=HYPERLINK(""http://evil.test"",""x"")"`);
    for (const lead of ["=", "+", "-", "@", "\t", "\r"]) {
      expect(csvField(`${lead}cmd`).replace(/^"/, "").startsWith(`'${lead}`)).toBe(true);
    }
    expect(csvField("gain_re")).toBe("gain_re");
    expect(csvHeader([{ name: "@SUM(A1)" }])).toBe(
      "frequency_hz,'@SUM(A1)_re,'@SUM(A1)_im,'@SUM(A1)_db,'@SUM(A1)_deg",
    );
    // Numbers keep their sign: a negative value is data, not a formula.
    const csv = resultToCsv({ frequencies: [100], traces: [trace("-x", [[-0.5, -1]])] });
    expect(csv.split("\r\n")[0]).toBe("frequency_hz,'-x_re,'-x_im,'-x_db,'-x_deg");
    expect(csv.split("\r\n")[1]?.split(",").slice(0, 3)).toEqual(["100", "-0.5", "-1"]);
  });

  it("writes an empty cell for a non-finite value (a zero magnitude is −∞ dB)", () => {
    const csv = resultToCsv({ frequencies: [100], traces: [trace("z", [[0, 0]])] });
    expect(csv.split("\r\n")[1]).toBe("100,0,0,,0");
  });

  it("writes traces in the result's order, two traces side by side", () => {
    const csv = resultToCsv({
      frequencies: [1, 2],
      traces: [
        trace("a", [
          [1, 0],
          [2, 0],
        ]),
        trace("b", [
          [0, 1],
          [0, 2],
        ]),
      ],
    });
    const [header, r1, r2] = csv.split("\r\n");
    expect(header).toBe("frequency_hz,a_re,a_im,a_db,a_deg,b_re,b_im,b_db,b_deg");
    expect(r1!.split(",").map(Number)).toEqual([1, 1, 0, 0, 0, 0, 1, 0, 90]);
    const r2n = r2!.split(",").map(Number);
    expect(r2n[3]).toBeCloseTo(6.0205999, 6); // 20·log10(2), common practice
    expect(r2n[8]).toBe(90);
  });
});
