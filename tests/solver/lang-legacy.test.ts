import { describe, expect, it } from "vitest";
import { compile, rewriteLegacyNetlist, solveNetlist } from "@/solver";

/** The earlier spellings `v(…)`, `i(…)` and ground `0`: errors with a fix, and the rewrite of old netlists. */
const OLD = `title Divider, 50% — it's "old"   # v(x) in a comment stays
Vin: vsource in 0 1 phase=0
R1: resistor in out 10k tol=1%
R2: resistor out 0 10k
show H = v(out) / v(in)
show v(in,out)
show Z = v(in) / i(R1)
loop T cut out before R2
`;

function errorsOf(text: string) {
  const r = compile(text);
  return r.ok ? [] : r.errors;
}

describe("earlier spellings are errors with their rewrite", () => {
  it("v(NODE): the hint shows the rewrite and the fix renames the word only", () => {
    const [e, ...rest] = errorsOf("Vin: vsource in gnd 1\nR1: resistor in gnd 1k\nshow v(in)\n");
    expect(rest).toEqual([]);
    expect(e).toEqual({
      line: 3,
      column: 6,
      endColumn: 7,
      message: "`v(…)` is not a probe; probes read `volts(…)` and `amps(…)`",
      hint: "write `volts(in)`",
      fix: { line: 3, column: 6, endColumn: 7, text: "volts", label: "Write `volts(in)`" },
    });
  });

  it("v(A,B) and i(PART) on one line are both reported", () => {
    const errors = errorsOf(
      "Vin: vsource in gnd 1\nR1: resistor in x 1k\nR2: resistor x gnd 1k\nshow v(in,x) / i(R1)\n",
    );
    expect(errors.map((e) => [e.line, e.column, e.hint, e.fix?.text])).toEqual([
      [4, 6, "write `volts(in, x)`", "volts"],
      [4, 16, "write `amps(R1)`", "amps"],
    ]);
  });

  it("ground `0` in every node position, never in values or options", () => {
    const errors = errorsOf(
      "Vin: vsource in 0 0 phase=0\nR1: resistor in 0 1k tol=0\nshow volts(in, 0)\nloop T cut 0 before R1\n",
    );
    const ground = errors.filter((e) => e.message === "ground is `gnd`");
    expect(ground.map((e) => [e.line, e.column])).toEqual([
      [1, 17],
      [2, 17],
      [3, 16],
      [4, 12],
    ]);
    expect(ground[0]).toEqual({
      line: 1,
      column: 17,
      endColumn: 18,
      message: "ground is `gnd`",
      hint: "write `gnd` instead of `0`",
      fix: { line: 1, column: 17, endColumn: 18, text: "gnd", label: "Write `gnd`" },
    });
  });

  it("other all-digit node names are still nodes", () => {
    const r = solveNetlist(
      "Vin: vsource 1 gnd 1\nR1: resistor 1 2 1k\nR2: resistor 2 gnd 1k\nshow volts(2)\n",
    );
    expect(r.ok && r.traces[0]!.re[0]).toBeCloseTo(0.5, 12);
  });
});

describe("rewriteLegacyNetlist", () => {
  it("rewrites probes and ground terminals only, byte for byte elsewhere", () => {
    expect(rewriteLegacyNetlist(OLD)).toBe(`title Divider, 50% — it's "old"   # v(x) in a comment stays
Vin: vsource in gnd 1 phase=0
R1: resistor in out 10k tol=1%
R2: resistor out gnd 10k
show H = volts(out) / volts(in)
show volts(in,out)
show Z = volts(in) / amps(R1)
loop T cut out before R2
`);
  });

  it("keeps CRLF, a byte-order mark, continued lines and block bodies", () => {
    const old =
      "\uFEFFblock half(a, b)\r\n  R: resistor a 0 1k\r\n  Q: resistor a b 1k\r\nend\r\nV: vsource x 0 1\r\nH: half x y\r\nshow v(x) \\\r\n  / v(y)\r\n";
    expect(rewriteLegacyNetlist(old)).toBe(
      "\uFEFFblock half(a, b)\r\n  R: resistor a gnd 1k\r\n  Q: resistor a b 1k\r\nend\r\nV: vsource x gnd 1\r\nH: half x y\r\nshow volts(x) \\\r\n  / volts(y)\r\n",
    );
  });

  it("the rewritten netlist solves to the same numbers as the new spelling written by hand", () => {
    const rewritten = rewriteLegacyNetlist(OLD);
    expect(errorsOf(rewritten)).toEqual([]);
    const r = solveNetlist(rewritten);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.traces.map((t) => t.name)).toEqual(["H", "volts(in,out)", "Z", "T"]);
    // 10k/10k divider: H = 0.5; volts(in,out) = 0.5 V; Z = 1 V / 50 µA = 20 kΩ.
    expect(r.traces[0]!.re[0]).toBeCloseTo(0.5, 12);
    expect(r.traces[1]!.re[0]).toBeCloseTo(0.5, 12);
    expect(r.traces[2]!.re[0]).toBeCloseTo(20_000, 6);
  });

  it("is idempotent and leaves new-form netlists and non-netlists alone", () => {
    const once = rewriteLegacyNetlist(OLD);
    expect(rewriteLegacyNetlist(once)).toBe(once);
    expect(rewriteLegacyNetlist("")).toBe("");
    expect(rewriteLegacyNetlist("let x = 0\nfoo 0 v(\n")).toBe("let x = 0\nfoo 0 v(\n");
  });
});
