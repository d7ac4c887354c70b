import { describe, expect, it } from "vitest";
import {
  diffNetlists,
  foldRows,
  lineSegments,
  lineSubject,
  netlistDiffStats,
  netlistRows,
} from "@/lib/netlist-diff";

const rowsOf = (a: string, b: string) => netlistRows(diffNetlists(a, b));

describe("lineSubject", () => {
  it("names what a line defines, and nothing for comments, blanks and end", () => {
    expect(lineSubject("R1: resistor in out 10k tol=1%")).toBe("part R1");
    expect(lineSubject("  Buf: buffer x out out  # unity")).toBe("part Buf");
    expect(lineSubject("sweep 10Hz to 1MHz log 100 per decade")).toBe("sweep");
    expect(lineSubject("measure fc = crossing(H, half-power)")).toBe("measure fc");
    expect(lineSubject("check fc between 950Hz and 1.05kHz")).toBe("check fc");
    expect(lineSubject("let r = 10k")).toBe("let r");
    expect(lineSubject("show H = volts(out) / volts(in)")).toBe("show H");
    expect(lineSubject("show volts(out)")).toBe("show volts(out)");
    expect(lineSubject("block rc(in, out) r=10k")).toBe("block rc");
    expect(lineSubject("# R1: resistor a b 1k")).toBeNull();
    expect(lineSubject("")).toBeNull();
    expect(lineSubject("end")).toBeNull();
  });
});

describe("lineSegments", () => {
  it("marks only the words that differ, old → new, and gives both lines back", () => {
    const before = "R1: resistor in out 10k tol=1%";
    const after = "R1: resistor in out 12k tol=1%";
    const segs = lineSegments(before, after);
    expect(segs.filter((s) => s.kind === "swap")).toEqual([{ kind: "swap", before: "10k", after: "12k" }]);
    const join = (side: "before" | "after") =>
      segs.map((s) => (s.kind === "kept" ? s.text : s[side])).join("");
    expect(join("before")).toBe(before);
    expect(join("after")).toBe(after);
  });

  it("keeps two neighbouring changed words as one swap", () => {
    const segs = lineSegments("sweep 10Hz to 1MHz log 50 per decade", "sweep 10Hz to 1MHz linear 500 points");
    expect(segs.filter((s) => s.kind === "swap")).toEqual([
      { kind: "swap", before: "log 50 per decade", after: "linear 500 points" },
    ]);
  });
});

describe("netlistRows", () => {
  const A = [
    "title Notch",
    "let r = 10k",
    "R1: resistor in mid r",
    "R2: resistor mid out 10k",
    "C1: capacitor out gnd 10n tol=5%",
    "Vin: vsource in gnd 1",
    "sweep 10Hz to 100kHz log 50 per decade",
    "measure fc = crossing(H, half-power)",
  ].join("\n");
  const B = [
    "title Notch",
    "let r = 4k7",
    "R1: resistor in mid r",
    "C1: capacitor out gnd 10n tol=1%",
    "C2: capacitor mid gnd 47n",
    "Vin: vsource in gnd 1",
    "sweep 10Hz to 100kHz log 100 per decade",
    "measure fc = crossing(H, half-power)",
  ].join("\n");

  it("pairs edited definitions into one changed row each; the rest is added or removed", () => {
    const rows = rowsOf(A, B);
    expect(rows.map((r) => [r.kind, r.kind === "same" ? null : r.subject])).toEqual([
      ["same", null],
      ["changed", "let r"],
      ["same", null],
      ["removed", "part R2"],
      ["changed", "part C1"],
      ["added", "part C2"],
      ["same", null],
      ["changed", "sweep"],
      ["same", null],
    ]);
    const c1 = rows[4];
    expect(c1).toMatchObject({ kind: "changed", oldLine: 5, newLine: 4 });
    if (c1?.kind !== "changed") throw new Error("not a changed row");
    expect(c1.segments.filter((s) => s.kind === "swap")).toEqual([
      { kind: "swap", before: "tol=5%", after: "tol=1%" },
    ]);
    expect(netlistDiffStats(rows)).toEqual({ changed: 3, added: 1, removed: 1, same: 4 });
  });

  it("keeps a removed part and a new part of another name apart", () => {
    const rows = rowsOf("R1: resistor a b 1k\n", "R9: resistor a b 1k\n");
    expect(rows.map((r) => r.kind)).toEqual(["removed", "added"]);
  });

  it("never pairs comment lines", () => {
    const rows = rowsOf("# first idea\nR1: resistor a b 1k\n", "# second idea\nR1: resistor a b 1k\n");
    expect(rows.map((r) => r.kind)).toEqual(["removed", "added", "same"]);
  });
});

describe("foldRows", () => {
  it("folds long unchanged stretches and keeps two rows of context beside a change", () => {
    const lines = Array.from({ length: 12 }, (_, i) => `R${i}: resistor a b ${i + 1}k`);
    const changed = [...lines];
    changed[6] = "R6: resistor a b 70k";
    const blocks = foldRows(rowsOf(lines.join("\n"), changed.join("\n")));
    expect(blocks.map((b) => [b.kind, b.rows.length])).toEqual([
      ["fold", 4],
      ["rows", 5],
      ["fold", 3],
    ]);
  });

  it("shows a single unchanged line rather than folding it", () => {
    const a = "R1: resistor a b 1k\nR2: resistor a b 2k\nR3: resistor a b 3k\nR4: resistor a b 4k\n";
    const b = "R1: resistor a b 9k\nR2: resistor a b 2k\nR3: resistor a b 3k\nR4: resistor a b 4k\n";
    expect(foldRows(rowsOf(a, b)).map((x) => x.kind)).toEqual(["rows", "rows"]);
  });
});
