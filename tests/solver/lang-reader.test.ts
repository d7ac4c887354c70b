import { describe, expect, it } from "vitest";
import { lex } from "@/solver/lang";
import { parseNetlist } from "@/solver/lang/parser";

// The parser reads a netlist line by line as the lexer reads it, unless the text may hold a `block`
// or `preset` line (then it reads all lines first, for the kinds they add). Both ways must give the
// same tree and the same errors in the same order: the lexer's first, as when the text was lexed whole.
const TEXTS = [
  "Vin: vsource in gnd 1\nR1: resistor in out 10k\nC1: capacitor out gnd 10n\nsweep 10Hz to 10kHz log 10 per decade\nshow volts(out)",
  // a stray character where the parser also reports the end of the line: same line and column
  "Vin: vsource in gnd 1\nR1: resistor in out;\nC1: capacitor out gnd 10n $\n",
  // continued lines, comments, CRLF and CR, a title with `\#`, an expression, a duplicate name
  "title Bench \\# 2 # note\r\nlet R = 2*pi\r\nR1: resistor a \\\r\n  b (R*1k) # load\rR1: resistor b gnd 1k\nV1: vsource a gnd 1\n",
  // number and unit errors, ground written 0, an expression without parentheses
  "V1: vsource a 0 1\nR1: resistor a b 1meg\nR2: resistor b gnd 2*R\nC1: capacitor b gnd 10uH\nR3: resistor b gnd 1k \u2212\n",
];

describe("reading lines one by one or all first", () => {
  it.each(TEXTS)("gives the same tree and errors: %j", (text) => {
    const streamed = parseNetlist(text);
    const whole = parseNetlist(`${text}\n# with block and preset in a comment: lines read all first`);
    expect(streamed).toEqual(whole);
    const lexed = lex(text).errors;
    expect(streamed.errors.slice(0, lexed.length)).toEqual(lexed);
  });

  it("keeps the lexer's error before the parser's at the same place", () => {
    const { errors } = parseNetlist("Vin: vsource in gnd 1\nR1: resistor in out;\n");
    expect(errors.map((e) => [e.line, e.column, e.message])).toEqual([
      [2, 20, "unexpected character `;`"],
      [2, 20, "a resistor needs a value"],
    ]);
  });
});
