import { describe, expect, it } from "vitest";
import { compareRuns } from "@/lib/compare";
import { solveNetlist } from "@/solver";
import type { SolveSuccess } from "@/solver/types";

const rc = (r: string) => `Vin: vsource in gnd 1
R1: resistor in out ${r}
C1: capacitor out gnd 10n
sweep 10Hz to 100kHz log 10 per decade
show H = volts(out) / volts(in)
noise N = volts(out)
`;
const run = (r: string) => {
  const res = solveNetlist(rc(r));
  if (!res.ok) throw new Error(JSON.stringify(res.errors));
  return { netlist: rc(r), result: res as SolveSuccess };
};

describe("compare: noise and group delay like any trace", () => {
  it("a resistor 4× larger has 6.02 dB more thermal noise in band (√(4kTR): 10·log10 4, CHECKS §10) and 4× the delay at DC", () => {
    const cmp = compareRuns(run("1k"), run("4k"));
    const noise = cmp.traces.find((t) => t.name === "noise N")!;
    expect(noise.diffDb[0]!).toBeCloseTo(10 * Math.log10(4), 4); // at 10 Hz, far below both corners
    const h = cmp.traces.find((t) => t.name === "H")!;
    // τ(0) = RC (first-order low-pass, common practice): 10 µs → 40 µs.
    expect(h.delay!.a[0]!).toBeCloseTo(1e-5, 8);
    expect(h.delay!.diff[0]!).toBeCloseTo(3e-5, 8);
  });
});
