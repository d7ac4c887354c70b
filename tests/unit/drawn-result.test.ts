import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { drawnResult } from "@/lib/drawn-result";
import { solveNetlist } from "@/solver";

// An example of the repository with a `vary` family, so variant traces are covered too.
const netlist = readFileSync(path.join(__dirname, "../../solver/examples/cable-driver-gbw.pwn"), "utf8");

describe("drawnResult: what the run page hands its charts", () => {
  const solved = solveNetlist(netlist);
  if (!solved.ok) throw new Error(solved.errors.map((e) => e.message).join("; "));

  it("drops every trace's re/im, the variants' too, and keeps what is drawn unchanged", () => {
    const drawn = drawnResult(solved);
    expect(solved.variants?.length).toBeGreaterThan(0);
    for (const t of [...drawn.traces, ...(drawn.variants ?? []).flatMap((v) => v.traces)]) {
      expect(Object.keys(t)).not.toContain("re");
      expect(Object.keys(t)).not.toContain("im");
    }
    expect(drawn.traces.map((t) => [t.name, t.magnitudeDb, t.phaseDeg])).toEqual(
      solved.traces.map((t) => [t.name, t.magnitudeDb, t.phaseDeg]),
    );
    expect(drawn.frequencies).toBe(solved.frequencies);
    expect(drawn.measures).toBe(solved.measures);
    // The input is not changed (the page may still hand the full result elsewhere).
    expect(solved.traces[0]?.re.length).toBe(solved.frequencies.length);
  });

  it("is measurably smaller once serialised", () => {
    const full = JSON.stringify(solved).length;
    const drawn = JSON.stringify(drawnResult(solved)).length;
    expect(drawn).toBeLessThan(full * 0.8);
  });
});
