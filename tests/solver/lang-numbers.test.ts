import { describe, expect, it } from "vitest";
import { compile } from "@/solver/lang";
import { parseNumberText } from "@/solver/lang/numbers";
import { lex } from "@/solver/lang/tokens";

// SI prefixes and units: common practice (SI Brochure, 9th ed.); IEC 60062 letter codes: common practice.
describe("number literals", () => {
  it.each([
    ["12", 12, null],
    ["1.5e-3", 0.0015, null],
    ["2E3", 2000, null],
    [".5", 0.5, null],
    ["10k", 10_000, null],
    ["1m", 0.001, null],
    ["1M", 1e6, null],
    ["1f", 1e-15, null],
    ["1F", 1, "F"],
    ["1T", 1e12, null],
    ["3p3", 3.3e-12, null],
    ["100nF", 1e-7, "F"],
    ["2.2uF", 2.2e-6, "F"],
    ["2.2\u00B5F", 2.2e-6, "F"],
    ["2.2\u03BCF", 2.2e-6, "F"],
    ["10k\u03A9", 10_000, "ohm"],
    ["10k\u2126", 10_000, "ohm"],
    ["4.7kohm", 4700, "ohm"],
    ["10H", 10, "H"],
    ["1MHz", 1e6, "Hz"],
    ["5%", 0.05, "%"],
    ["45deg", 45, "deg"],
    ["45\u00B0", 45, "deg"],
    ["3dB", 3, "dB"],
    ["2mS", 0.002, "S"],
    ["4k7", 4700, null],
    ["2R2", 2.2, null],
    ["1n5", 1.5e-9, null],
    ["R47", 0.47, null],
    ["10R", 10, null],
    ["4M7", 4.7e6, null],
    ["4k7\u03A9", 4700, "ohm"],
  ])("%s reads as %d (%s)", (text, value, unit) => {
    const r = parseNumberText(text);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.value).toBeCloseTo(value, 12 - Math.max(0, Math.ceil(Math.log10(Math.abs(value)))));
      expect(r.value / value).toBeCloseTo(1, 12);
      expect(r.unit).toBe(unit);
    }
  });

  it.each([
    ["1meg", "write 1M for mega"],
    ["1MEG", "write 1M for mega"],
    ["5mil", "write m for milli"],
    ["10K", "write k for kilo"],
    ["10hz", "write Hz"],
    ["3db", "write dB"],
    ["1Kohm", "write k for kilo"],
  ])("%s is refused with a hint (%s)", (text, hint) => {
    const r = parseNumberText(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.hint).toContain(hint);
  });

  it("refuses a prefix before %, dB or degrees and a letter code with a percent", () => {
    expect(parseNumberText("1k%").ok).toBe(false);
    expect(parseNumberText("3mdB").ok).toBe(false);
    expect(parseNumberText("4k7%").ok).toBe(false);
  });

  it("a whole number with a prefix is the product rounded to 15 significant digits, the same double as by the rounding pass", () => {
    // The reader skips the rounding pass (toPrecision and back) for whole numbers below 10^15; it must
    // give exactly the double the pass gives. Reference: Number((n * scale).toPrecision(15)).
    const scales: [string, number][] = [
      ["f", 1e-15],
      ["p", 1e-12],
      ["n", 1e-9],
      ["u", 1e-6],
      ["\u00B5", 1e-6],
      ["m", 1e-3],
      ["k", 1e3],
      ["M", 1e6],
      ["G", 1e9],
      ["T", 1e12],
    ];
    const wholes: number[] = [];
    for (let n = 0; n <= 3000; n++) wholes.push(n);
    let seed = 12345;
    for (let i = 0; i < 3000; i++) {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      const digits = 4 + (i % 12); // 4 to 15 digits
      wholes.push(Math.floor((seed / 2147483648) * 10 ** digits));
    }
    wholes.push(999_999_999_999_999, 123_456_789_012_345, 100_000_000_000_000);
    let mismatches = 0;
    for (const [letter, scale] of scales) {
      for (const n of wholes) {
        const r = parseNumberText(`${n}${letter}`);
        if (!r.ok || !Object.is(r.value, Number((n * scale).toPrecision(15)))) mismatches++;
      }
    }
    expect(mismatches).toBe(0);
    expect(parseNumberText("10n")).toEqual({ ok: true, value: 1e-8, unit: null });
    expect(parseNumberText("3300p")).toEqual({ ok: true, value: 3.3e-9, unit: null });
    expect(parseNumberText("47k")).toEqual({ ok: true, value: 47_000, unit: null });
    // A fraction or a number of 16 digits still takes the rounding pass.
    expect(parseNumberText("4.7k")).toEqual({ ok: true, value: 4700, unit: null });
    expect(parseNumberText("1234567890123456k")).toEqual({
      ok: true,
      value: 1.23456789012346e18,
      unit: null,
    });
  });

  it("suggests the nearest spelling for an unknown unit", () => {
    const r = parseNumberText("10kHzz");
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.hint).toBe("did you mean `kHz`?");
  });
});

describe("units must fit the place", () => {
  it("a capacitor written 10kΩ is an error at the value", () => {
    const r = compile("C1: capacitor a gnd 10k\u03A9\nR1: resistor a gnd 1k\n");
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors).toHaveLength(1);
      expect(r.errors[0]).toMatchObject({ line: 1, column: 21, endColumn: 25 });
      expect(r.errors[0]!.message).toContain("farads");
      expect(r.errors[0]!.hint).toBe("write it without a unit or in F");
    }
  });

  it.each([
    ["R1: resistor a gnd 1nF", 20, "ohms"],
    ["R1: inductor a gnd 1F", 20, "henries"],
    ["R1: vsource a gnd 1A", 19, "volts"],
    ["R1: isource a gnd 1V", 19, "amperes"],
    ["R1: vcvs a gnd b gnd 10V", 22, "no unit"],
    ["R1: vccs a gnd b gnd 1F", 22, "siemens"],
    ["R1: resistor a gnd 1k tol=1Hz", 27, "percentage"],
    ["R1: vsource a gnd 1 phase=3dB", 27, "degrees"],
    ["R1: opamp a b c gbw=1MF", 21, "hertz"],
  ])("%s → error at column %d", (line, column, words) => {
    const r = compile(`${line}\n`);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors[0]).toMatchObject({ line: 1, column });
      expect(r.errors[0]!.message).toContain(words);
    }
  });

  it("accepts fitting units everywhere", () => {
    const r = compile(
      "V1: vsource in gnd 2V phase=90deg\nR1: resistor in out 4k7\u03A9 tol=1%\nC1: capacitor out gnd 1n5F tol=0.05\nL1: inductor out gnd 10mH\nU1: opamp out n o gain=100dB gbw=1MHz rout=50ohm\nR2: resistor n o 1k\nR3: resistor n gnd R47\nsweep 1kHz to 10kHz log 10 per decade\n",
    );
    expect(r.ok).toBe(true);
    if (r.ok) {
      const [v1, r1, c1, l1, u1, , r3] = r.circuit.parts;
      expect(v1).toMatchObject({ value: 2, phaseDeg: 90 });
      expect(r1).toMatchObject({ value: 4700, tol: 0.01 });
      expect(c1).toMatchObject({ value: 1.5e-9, tol: 0.05 });
      expect(l1!.value).toBeCloseTo(0.01, 15);
      expect(u1!.opamp).toEqual({ gain: 100_000, gbw: 1e6, rout: 50 }); // 100 dB = 10^5: common practice
      expect(r3!.value).toBe(0.47);
    }
  });
});

describe("lexer", () => {
  it("drops comments, joins `\\` continuations and keeps each token's own line and column", () => {
    const { lines, errors } = lex(
      "R1: resistor a \\\n   b 10k # load\r\n# only a comment\r\nsweep at 1k\r\n",
    );
    expect(errors).toEqual([]);
    expect(lines).toHaveLength(2);
    expect(lines[0]!.tokens.map((t) => t.text)).toEqual(["R1", ":", "resistor", "a", "b", "10k"]);
    expect(lines[0]!.tokens[4]).toMatchObject({ line: 2, column: 4, endColumn: 5 });
    expect(lines[1]!.line).toBe(4);
  });

  it("treats CRLF, LF and CR alike", () => {
    const text = "R1: resistor a gnd 1k\nR2: resistor a b 1k\nV1: vsource b gnd 1\n";
    const a = compile(text);
    const b = compile(text.replace(/\n/g, "\r\n"));
    const c = compile(text.replace(/\n/g, "\r"));
    expect(a.ok && b.ok && c.ok).toBe(true);
    if (a.ok && b.ok && c.ok) {
      expect(b.circuit).toEqual(a.circuit);
      expect(c.circuit).toEqual(a.circuit);
    }
  });

  it("joins the hyphenated keywords into one word", () => {
    const { lines } = lex(
      "measure pm = phase-margin(T)\nmonte-carlo 10\nmeasure x = crossing(T, half-power)",
    );
    expect(lines[0]!.tokens.map((t) => t.text)).toContain("phase-margin");
    expect(lines[1]!.tokens[0]!.text).toBe("monte-carlo");
    expect(lines[2]!.tokens.map((t) => t.text)).toContain("half-power");
  });

  it("reports stray characters with their column", () => {
    const { errors } = lex("R1: resistor a b 10k $\nR2: resistor a b 10k \u03A9");
    expect(errors).toEqual([
      { line: 1, column: 22, endColumn: 23, message: "unexpected character `$`" },
      expect.objectContaining({ line: 2, column: 22, message: "`\u03A9` must follow its number directly" }),
    ]);
  });

  it("pasted look-alikes get a hint, invisible characters are named by code point, non-breaking spaces are blanks", () => {
    const { lines, errors } = lex("R1: resistor a\u00A0b 1k\nx = \u22123 \u00D7 2\u200B");
    expect(lines[0]!.tokens.map((t) => t.text)).toEqual(["R1", ":", "resistor", "a", "b", "1k"]);
    expect(errors).toEqual([
      {
        line: 2,
        column: 5,
        endColumn: 6,
        message: "unexpected character `\u2212`",
        hint: "write the minus sign as -",
      },
      {
        line: 2,
        column: 8,
        endColumn: 9,
        message: "unexpected character `\u00D7`",
        hint: "write multiplication as *",
      },
      {
        line: 2,
        column: 11,
        endColumn: 12,
        message: "unexpected invisible character U+200B",
        hint: "delete it and type the text again",
      },
    ]);
  });
});
