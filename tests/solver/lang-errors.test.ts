import { describe, expect, it } from "vitest";
import { compile } from "@/solver/lang";
import { DIVIDER, errorsOf } from "./lang-helpers";

/** The only error of `text`, checked to be alone. */
function only(text: string) {
  const errors = errorsOf(text);
  expect(errors, JSON.stringify(errors)).toHaveLength(1);
  return errors[0]!;
}

describe("statement-level errors", () => {
  it("unknown statement keyword with did-you-mean", () => {
    expect(only(`${DIVIDER}swep 1k to 2k log 10 per decade\n`)).toEqual({
      line: 4,
      column: 1,
      endColumn: 5,
      message: "unknown statement `swep`",
      hint: "did you mean `sweep`?",
      fix: { line: 4, column: 1, endColumn: 5, text: "sweep", label: "Write sweep" },
    });
  });

  it("a part without its colon, and a line starting with a kind", () => {
    expect(only(`${DIVIDER}R2 resistor out gnd 1k\n`)).toMatchObject({
      line: 4,
      column: 1,
      endColumn: 3,
      hint: "write `R2: resistor …`",
    });
    expect(only(`${DIVIDER}resistor R2 out gnd 1k\n`)).toMatchObject({
      line: 4,
      column: 1,
      message: "a part line starts with the part's name",
    });
  });

  it("stray characters", () => {
    expect(only(`${DIVIDER}R2: resistor out gnd 1k ;\n`)).toMatchObject({
      line: 4,
      column: 25,
      endColumn: 26,
      message: "unexpected character `;`",
    });
  });
});

describe("part errors", () => {
  it("unknown kind with did-you-mean", () => {
    expect(only(`${DIVIDER}R2: resistr out gnd 1k\n`)).toEqual({
      line: 4,
      column: 5,
      endColumn: 12,
      message: "unknown part kind `resistr`",
      hint: "did you mean `resistor`?",
      fix: { line: 4, column: 5, endColumn: 12, text: "resistor", label: "Write resistor" },
    });
  });

  it("too few terminals and a missing value point just past the line", () => {
    expect(only(`${DIVIDER}R2: resistor out\n`)).toMatchObject({
      line: 4,
      column: 17,
      message: "resistor connects 2 nodes (a b), found 1",
    });
    expect(only(`${DIVIDER}R2: resistor out gnd\n`)).toMatchObject({
      line: 4,
      column: 21,
      message: "a resistor needs a value",
    });
  });

  it("an opamp takes no value; extra entries; a unit written apart", () => {
    expect(only(`${DIVIDER}U1: opamp out gnd x 10\n`).message).toContain("an opamp takes no value");
    expect(only(`${DIVIDER}R2: resistor out gnd 1k 2k\n`)).toMatchObject({
      column: 25,
      message: "unexpected `2k`: too many entries for a resistor",
    });
    expect(only(`${DIVIDER}R2: resistor out gnd 10 kHz\n`)).toMatchObject({
      column: 25,
      hint: "write the unit right after the number, e.g. 10kΩ or 1kHz",
    });
  });

  it("unknown option with did-you-mean, and blanks around `=`", () => {
    expect(only(`${DIVIDER}R2: resistor out gnd 1k toll=1%\n`)).toEqual({
      line: 4,
      column: 25,
      endColumn: 29,
      message: "unknown option `toll`",
      hint: "did you mean `tol`?",
      fix: { line: 4, column: 25, endColumn: 29, text: "tol", label: "Write tol" },
    });
    expect(only(`${DIVIDER}R2: resistor out gnd 1k tol =1%\n`)).toMatchObject({
      column: 25,
      endColumn: 30,
      hint: "write `tol=…`",
    });
    expect(only(`${DIVIDER}R2: vcvs out gnd in gnd 2 tol=1%\n`)).toMatchObject({
      column: 27,
      hint: "this kind takes no options",
    });
  });

  it("meg and mil with hints", () => {
    expect(only(`${DIVIDER}R2: resistor out gnd 1meg\n`)).toMatchObject({
      column: 22,
      endColumn: 26,
      hint: "write 1M for mega; M is mega, m is milli",
    });
    expect(only(`${DIVIDER}C2: capacitor out gnd 2mil\n`)).toMatchObject({
      column: 23,
      hint: expect.stringContaining("write m for milli"),
    });
  });

  it("tolerance given as a bare number of 1 or more, and values not above zero", () => {
    expect(only(`${DIVIDER}R2: resistor out gnd 1k tol=5\n`)).toMatchObject({
      column: 29,
      hint: expect.stringContaining("tol=5%"),
    });
    expect(only(`${DIVIDER}R2: resistor out gnd 0\n`)).toMatchObject({
      column: 22,
      message: "a resistor's value must be above zero, got 0",
    });
    expect(only(`${DIVIDER}C2: capacitor out gnd -1n\n`)).toMatchObject({ column: 23, endColumn: 26 });
  });

  it("a ccvs/cccs senses a vsource or inductor only", () => {
    expect(only(`${DIVIDER}Zt: ccvs x gnd R1 1k\nRx: resistor x gnd 1k\n`)).toMatchObject({
      line: 4,
      column: 16,
      endColumn: 18,
      message: expect.stringContaining("`R1` is a resistor"),
    });
    expect(only(`${DIVIDER}Zt: cccs x gnd Vinn 2\nRx: resistor x gnd 1k\n`)).toMatchObject({
      column: 16,
      message: "no part named `Vinn` to sense",
      hint: "did you mean `Vin`?",
    });
  });

  it("duplicate names of parts, lets, traces, measures", () => {
    expect(only(`${DIVIDER}R1: resistor out gnd 1k\n`)).toMatchObject({
      line: 4,
      column: 1,
      endColumn: 3,
      message: "a part named `R1` already exists (line 2)",
    });
    expect(only(`let a = 1\nlet a = 2\n${DIVIDER}`)).toMatchObject({
      line: 2,
      column: 5,
      message: "let `a` is already defined on line 1",
    });
    expect(only(`${DIVIDER}show H = volts(out)\nloop H cut out before C1\n`)).toMatchObject({
      line: 5,
      column: 6,
      message: "a trace named `H` already exists (line 4)",
    });
    expect(only(`${DIVIDER}show H = volts(out)\nmeasure p = peak(H)\nmeasure p = dip(H)\n`)).toMatchObject({
      line: 6,
      column: 9,
    });
  });

  it("statements allowed once", () => {
    expect(only(`title A\ntitle B\n${DIVIDER}`)).toMatchObject({
      line: 2,
      column: 1,
      message: "only one title statement is allowed (the first is on line 1)",
    });
    expect(only(`${DIVIDER}sweep at 1k\nsweep at 2k\n`)).toMatchObject({
      line: 5,
      message: expect.stringContaining("only one sweep"),
    });
  });
});

describe("let and expression errors", () => {
  it("circular definitions name the chain at the first let met", () => {
    expect(only(`let A = B + 1\nlet B = 2*A\n${DIVIDER}`)).toEqual({
      line: 1,
      column: 5,
      endColumn: 6,
      message: "`A` is defined in terms of itself",
      hint: "A → B → A",
    });
  });

  it("unknown names with did-you-mean at the name's column", () => {
    expect(only(`let Rload = 1k\nlet x = 2 * Rlaod\n${DIVIDER}`)).toEqual({
      line: 2,
      column: 13,
      endColumn: 18,
      message: "unknown name `Rlaod`",
      hint: "did you mean `Rload`?",
      fix: { line: 2, column: 13, endColumn: 18, text: "Rload", label: "Write Rload" },
    });
    expect(only(`${DIVIDER}R2: resistor out gnd Rx\n`)).toMatchObject({
      line: 4,
      column: 22,
      message: "unknown name `Rx`",
    });
  });

  it("built-in names, missing values, side-by-side values, malformed and infinite expressions", () => {
    expect(only(`let pi = 3\n${DIVIDER}`)).toMatchObject({ column: 5, message: "`pi` is a built-in name" });
    expect(only(`let x =\n${DIVIDER}`)).toMatchObject({ column: 8, message: "let `x` has no value" });
    expect(only(`let x = 2 pi\n${DIVIDER}`)).toMatchObject({
      column: 9,
      endColumn: 13,
      hint: "write `*` between them",
    });
    expect(only(`let x = (2 +\n${DIVIDER}`)).toMatchObject({
      column: 9,
      message: "this expression can't be read",
    });
    expect(only(`let x = 1/0\n${DIVIDER}`)).toMatchObject({
      column: 9,
      message: "the expression has no finite value",
    });
    expect(only(`let x = sqrtt(4)\n${DIVIDER}`)).toMatchObject({
      column: 9,
      endColumn: 14,
      hint: "did you mean `sqrt`?",
    });
    expect(only(`let x = snap(E25, 4k)\n${DIVIDER}`)).toMatchObject({
      column: 9,
      message: "snap takes a series and a value",
    });
    expect(only(`let x = 3dB * 2\n${DIVIDER}`)).toMatchObject({
      column: 9,
      message: "decibels can't be used inside an expression",
    });
  });

  it("a value expression in parentheses that is never closed", () => {
    expect(only(`${DIVIDER}R2: resistor out gnd (2*1k\n`)).toMatchObject({
      column: 22,
      message: "this `(` is never closed",
    });
  });
});

describe("analysis statement errors", () => {
  it("sweep: order, zero, limit, form", () => {
    expect(only(`${DIVIDER}sweep 1MHz to 10Hz log 10 per decade\n`)).toMatchObject({
      line: 4,
      column: 15,
      message: "the sweep must end above its start",
    });
    expect(only(`${DIVIDER}sweep 0 to 10Hz linear 10 points\n`)).toMatchObject({
      column: 7,
      hint: "start a little above zero, e.g. 1Hz",
    });
    expect(only(`${DIVIDER}sweep 1Hz to 1THz log 10000 per decade\n`)).toMatchObject({
      column: 1,
      message: "this sweep has 120001 points; the limit is 100000",
    });
    expect(only(`${DIVIDER}sweep 1Hz to 1kHz lin 10 points\n`)).toMatchObject({
      column: 19,
      message: "expected `log` or `linear`, found `lin`",
    });
    expect(only(`${DIVIDER}sweep 1Hz to 1kHz log 10 per dekade\n`)).toMatchObject({
      column: 30,
      hint: "did you mean `decade`?",
    });
  });

  it("show: unknown node or part, opamp current, bad probe", () => {
    expect(only(`${DIVIDER}show H = volts(ot) / volts(in)\n`)).toEqual({
      line: 4,
      column: 16,
      endColumn: 18,
      message: "no node named `ot`",
      hint: "did you mean `out`?",
      fix: { line: 4, column: 16, endColumn: 18, text: "out", label: "Write out" },
    });
    expect(only(`${DIVIDER}show Z = volts(in) / amps(R2)\n`)).toMatchObject({
      column: 27,
      message: "no part named `R2`",
      hint: "did you mean `R1`?",
    });
    expect(only(`${DIVIDER}U1: opamp out gnd o\nRo: resistor o gnd 1k\nshow I = amps(U1)\n`)).toMatchObject({
      line: 6,
      column: 15,
      message: expect.stringContaining("not an opamp"),
    });
    expect(only(`${DIVIDER}show H = w(out)\n`)).toMatchObject({
      column: 10,
      message: "`w` can't be read in a probe",
    });
  });

  it("loop: unknown node, a part not on the node, gnd", () => {
    expect(only(`${DIVIDER}loop T cut ouy before C1\n`)).toMatchObject({
      column: 12,
      hint: "did you mean `out`?",
    });
    expect(only(`${DIVIDER}loop T cut out before Vin\n`)).toMatchObject({
      column: 23,
      message: "`Vin` does not touch node `out`",
    });
    expect(only(`${DIVIDER}loop T cut gnd before C1\n`)).toMatchObject({
      column: 12,
      message: "gnd can't be cut",
    });
  });

  it("measure: unknown function, trace, missing level or frequency, misplaced at, order", () => {
    const s = `${DIVIDER}show H = volts(out)\n`;
    expect(only(`${s}measure f = zero-phaze(H)\n`)).toEqual({
      line: 5,
      column: 13,
      endColumn: 23,
      message: "unknown measure function `zero-phaze`",
      hint: "did you mean `zero-phase`?",
      fix: { line: 5, column: 13, endColumn: 23, text: "zero-phase", label: "Write zero-phase" },
    });
    expect(only(`${s}measure f = peak(h)\n`)).toMatchObject({ column: 18, hint: "did you mean `H`?" });
    expect(only(`${s}measure f = crossing(H)\n`)).toMatchObject({
      column: 23,
      message: "crossing needs a level",
    });
    expect(only(`${s}measure f = mag(H)\n`)).toMatchObject({ column: 19, message: "mag needs a frequency" });
    expect(only(`${s}measure f = peak(H) at 1k\n`)).toMatchObject({
      column: 21,
      message: "peak takes no `at`",
    });
    expect(only(`${s}measure g = mag(H) at f\nmeasure f = peak(H)\n`)).toEqual({
      line: 5,
      column: 23,
      endColumn: 24,
      message: "measure `f` is defined on line 6, after this one",
      hint: "move `measure f` above line 5",
    });
    expect(only(`${s}measure g = mag(H) at 1k\nmeasure d = db(H) at g\n`)).toMatchObject({
      line: 6,
      column: 22,
      message: "measure `g` is not a frequency",
    });
    expect(only(`${s}measure f = crossing(H, 0)\n`)).toMatchObject({
      column: 25,
      message: "a magnitude level must be above zero",
    });
  });

  it("check: unknown measure, unit mismatch, reversed limits, bad operator", () => {
    const s = `${DIVIDER}show H = volts(out)\nmeasure fc = crossing(H, -3dB)\n`;
    expect(only(`${s}check fcc > 1k\n`)).toMatchObject({ line: 6, column: 7, hint: "did you mean `fc`?" });
    expect(only(`${s}check fc > 3dB\n`)).toMatchObject({
      column: 12,
      message: "`fc` is in hertz; this limit is in decibels",
    });
    expect(only(`${s}check fc between 2k and 1k\n`)).toMatchObject({
      column: 25,
      message: "the upper limit must be above the lower one",
    });
    expect(only(`${s}check fc = 1k\n`)).toMatchObject({
      column: 10,
      message: "expected <, <=, >, >= or between, found `=`",
    });
  });

  it("vary, monte-carlo, sensitivity", () => {
    expect(only(`${DIVIDER}vary R9 over 1k, 2k\n`)).toMatchObject({
      column: 6,
      message: "no let or part named `R9`",
      hint: "did you mean `R1`?",
    });
    expect(only(`${DIVIDER}vary R1 over 1k, 2nF\n`)).toMatchObject({
      column: 18,
      message: expect.stringContaining("ohms"),
    });
    expect(only(`${DIVIDER}monte-carlo 100 dist=gauss\n`)).toMatchObject({
      column: 22,
      message: "unknown distribution `gauss`",
    });
    expect(only(`${DIVIDER}monte-carlo 0\n`)).toMatchObject({
      column: 13,
      message: expect.stringContaining("from 1 to 100000"),
    });
    expect(only(`${DIVIDER}sensitivity fc\n`)).toMatchObject({
      column: 13,
      message: "no measure named `fc`",
    });
  });
});

describe("all errors at once", () => {
  it("reports every bad line, sorted by place, and keeps going after each", () => {
    const errors = errorsOf(
      "R1: resistr a b 1k\nR2: resistor a b 1meg\nlet x = y\nsweep 1k to 10 log 5 per decade\nshow H = volts(q)\nfoo\n",
    );
    expect(errors.map((e) => [e.line, e.column])).toEqual([
      [1, 5],
      [2, 18],
      [3, 9],
      [4, 13],
      [5, 16],
      [6, 1],
    ]);
  });

  it("a repeated part name is reported with the other errors, also when its first line fails", () => {
    const errors = errorsOf(
      "R1: resistor a b 1meg\nR1: capacitor a gnd 1n\nV: vsource a gnd 1\nblock s(x)\n  R: resistor x gnd 1k\n  R: resistor x gnd 2k\nend\nX: s a\nshow volts(q)\n",
    );
    expect(errors.map((e) => [e.line, e.column, e.message])).toEqual([
      [1, 18, '`1meg`: "meg" is not a prefix here'],
      [2, 1, "a part named `R1` already exists (line 1)"],
      [6, 3, "a part named `R` already exists (line 5)"],
      [9, 12, "no node named `q`"],
    ]);
  });

  it("never returns ok with errors and never throws on odd inputs", () => {
    for (const text of [
      "",
      "\n\n",
      "#",
      "\\",
      "(",
      "R1:",
      ":",
      "block",
      "end",
      "let",
      "measure",
      "check x between",
      "show",
      "sweep at",
    ]) {
      const r = compile(text);
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.errors.length).toBeGreaterThan(0);
        for (const e of r.errors) expect(e.line).toBeGreaterThanOrEqual(1);
      }
    }
  });
});

describe("words that name built-ins of every JavaScript object are plain words", () => {
  const base = "Vin: vsource a gnd 1\nsweep 10Hz to 10kHz log 10 per decade\nshow H = volts(b)\n";

  it("parts named constructor, toString and valueOf take their written values", () => {
    const r = compile(
      `${base}constructor: resistor a b 1k\ntoString: capacitor b gnd 10n\nvalueOf: resistor b gnd 1M\n`,
    );
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const value = (name: string) => r.circuit.parts.find((p) => p.name === name)?.value;
    expect(value("constructor")).toBe(1000);
    expect(value("toString")).toBeCloseTo(10e-9, 20);
    expect(value("valueOf")).toBe(1e6);
  });

  it("as a unit, a function or a name they are unknown, with the usual messages", () => {
    const units = errorsOf(`${base}R1: resistor a b 1constructor\nC1: capacitor b gnd 10n\n`);
    expect(units[0]).toMatchObject({
      line: 4,
      message: expect.stringContaining("unknown prefix or unit `constructor`"),
    });
    const fn = errorsOf(`let x = constructor(2)\n${base}R1: resistor a b 1k\nC1: capacitor b gnd 10n\n`);
    expect(fn[0]).toMatchObject({ line: 1, message: "unknown function `constructor`" });
    const name = errorsOf(`let y = toString\n${base}R1: resistor a b 1k\nC1: capacitor b gnd 10n\n`);
    expect(name[0]).toMatchObject({ line: 1, message: "unknown name `toString`" });
  });
});
