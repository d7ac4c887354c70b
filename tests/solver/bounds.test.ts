// Adversarial inputs of issue 13: each must end in a clear answer (an error with line and column, or
// a result), never an internal fault, a stack overflow or a non-finite number in the JSON. How fast
// they are is measured by `npm run bench` (scripts/bench-bounds.ts), not here.
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver/index";
import { MAX_HINT_WORD, nearest } from "@/solver/lang/hints";
import { MAX_NESTING, MAX_OPERATORS, trimBlanksEnd } from "@/solver/lang/tokens";

const RC = [
  "title bounds",
  "Vin: vsource in gnd 1",
  "R1: resistor in out 1k",
  "C1: capacitor out gnd 10n",
  "sweep 10Hz to 1MHz log 10 per decade",
  "show H = volts(out) / volts(in)",
].join("\n");

describe("adversarial netlists of 100–200 kB", () => {
  it("200 kB of blanks then `1`: one clear error at the `1`, with line and column", () => {
    const text = `${RC}\n${" ".repeat(200_000)}1\n`;
    const r = solveNetlist(text);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ line: 7, column: 200_001 });
    expect(r.errors[0]?.message).not.toMatch(/internal fault/);
    expect(trimBlanksEnd(`${" \t".repeat(100_000)}x${" ".repeat(5)}`)).toHaveLength(200_001);
  });

  it("one 100 kB word: an unknown-statement error without an edit-distance hint", () => {
    const word = "w".repeat(100_000);
    const r = solveNetlist(`${RC}\n${word}\n`);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]).toMatchObject({ line: 7, column: 1 });
    expect(r.errors[0]?.message).not.toMatch(/internal fault/);
    expect(nearest(word, ["sweep", "show"])).toBeNull();
    expect(nearest("W".repeat(40), ["w".repeat(40)])).toBe("w".repeat(40)); // case-only still found
    expect(nearest("swepe", ["sweep", "show"])).toBe("sweep");
    expect(MAX_HINT_WORD).toBe(32);
  });

  it("a probe nested 5 000 parentheses deep: an error naming the depth at line and column", () => {
    const deep = `${"(".repeat(5000)}volts(out)${")".repeat(5000)}`;
    const r = solveNetlist(`${RC}\nshow D = ${deep}\n`);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toEqual([
      expect.objectContaining({
        line: 7,
        column: "show D = ".length + MAX_NESTING + 1,
        message: `parentheses are nested more than ${MAX_NESTING} deep`,
      }),
    ]);
  });

  it("50 000 signs in a row or 20 000 powers: an error at the sign or power past the limit", () => {
    const r = solveNetlist(
      `${RC}\nshow S = ${"- ".repeat(50_000)}volts(out)\nlet q = ${"2^".repeat(20_000)}1\n`,
    );
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const message = `the expression is nested more than ${MAX_NESTING} deep or has more than ${MAX_OPERATORS} operators`;
    expect(r.errors).toEqual([
      expect.objectContaining({ line: 7, column: "show S = ".length + 2 * MAX_NESTING + 1, message }),
      expect.objectContaining({ line: 8, column: "let q = ".length + 2 * MAX_NESTING + 2, message }),
    ]);
    // Ordinary expressions are far from it: a sum of 1 000 terms is fine.
    const sum = solveNetlist(`${RC}\nlet k = ${Array.from({ length: 1000 }, () => "1").join(" + ")}\n`);
    expect(sum.ok).toBe(true);
    const long = solveNetlist(
      `${RC}\nshow L = ${Array.from({ length: 20_000 }, () => "volts(out)").join(" + ")}\n`,
    );
    expect(long.ok).toBe(false);
    if (!long.ok) expect(long.errors[0]).toMatchObject({ line: 7, message });
  });

  it("a valid 3 000-deep let chain is solved: x0 = x1 + 1 … x3000 = 1k gives R = 4 kΩ", () => {
    const lets = Array.from({ length: 3000 }, (_, i) => `let x${i} = x${i + 1} + 1`);
    const text = [
      "title chain",
      ...lets,
      "let x3000 = 1k",
      "Vin: vsource in gnd 1",
      "R1: resistor in out x0",
      "C1: capacitor out gnd 10n",
      "sweep 100Hz to 100kHz log 200 per decade",
      "show H = volts(out) / volts(in)",
      "measure corner = crossing(H, half-power)",
    ].join("\n");
    const r = solveNetlist(text);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // First-order RC low-pass corner fc = 1/(2πRC) (common practice): R = 1000 + 3000 = 4000 Ω, C = 10 nF.
    const fc = 1 / (2 * Math.PI * 4000 * 10e-9);
    const corner = r.measures.find((m) => m.name === "corner")?.value;
    expect(corner).toBeCloseTo(fc, -1);
  });
});

describe("non-finite numbers never reach JSON", () => {
  const base = `${RC.replace("R1: resistor in out 1k", "let r = 1k\nR1: resistor in out r")}\n`;

  it("vary from 1e-300 to 1e300 log: finite values through logarithms, none non-finite in the JSON", () => {
    const r = solveNetlist(`${base}vary r from 1e-300 to 1e300 log 5 points\n`);
    const json = JSON.stringify(r, (_k, v) =>
      typeof v === "number" && !Number.isFinite(v) ? "NONFINITE" : v,
    );
    expect(json).not.toContain("NONFINITE");
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // The values that could be solved keep their exact decades (1e150 and 1e300: the others leave the
    // circuit singular and are reported as warnings).
    expect((r.variants ?? []).map((v) => v.value)).toEqual(expect.arrayContaining([1e150, 1e300]));
  });

  it("a value beyond a double: an error with line and column", () => {
    const r = solveNetlist(`${base}vary r from 1 to 1e309 log 3 points\n`);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]).toMatchObject({ line: 8, column: 18, message: "`1e309` is not a number" });
  });
});
