import { describe, expect, it } from "vitest";
import * as solver from "@/solver";
import { solveNetlist } from "@/solver";
import { expectClose } from "./engine-tolerance";

/** The example of NETLIST.md (an invented 1 kHz test-tone generator). */
const EXAMPLE = `title Test-tone generator, 1 kHz

let R = 16k
let C = 10n                          # f0 = 1/(2*pi*R*C) = 994.7 Hz

Rs: resistor  amp_out mid   R
Cs: capacitor mid     pos   C
Rp: resistor  pos     gnd   R   tol=1%
Cp: capacitor pos     gnd   C   tol=5%
U1: opamp     pos     neg   amp_out
Rf: resistor  neg     amp_out 24k
Rg: resistor  neg     gnd   11k              # K = 1 + Rf/Rg = 3.18

sweep 10Hz to 100kHz log 200 per decade
show  bridge = volts(pos) / volts(amp_out)
loop  T cut amp_out before Rs
measure f0   = zero-phase(bridge)
measure gain = mag(T) at f0
check gain >= 1
check f0 between 950Hz and 1.05kHz
`;

describe("solver entry", () => {
  it("exports the public API", () => {
    expect(typeof solver.solveNetlist).toBe("function");
    expect(typeof solver.compile).toBe("function");
    expect(typeof solver.analyze).toBe("function");
    expect(typeof solver.snap).toBe("function");
    expect(solver.SOLVER_VERSION).toMatch(/^\d+\.\d+\.\d+$/);
    expect(solver.GROUND).toBe("gnd");
    expect(Object.keys(solver).sort()).toEqual(
      [
        "GROUND",
        "SOLVER_VERSION",
        "SparseComplexLU",
        "analyze",
        "compactResult",
        "compile",
        "expandResult",
        "parse",
        "rewriteLegacyNetlist",
        "snap",
        "solveNetlist",
      ].sort(),
    );
  });

  it("points a sweep over the service's limit at the sweep statement", () => {
    const text =
      "R1: resistor a gnd 1k\nV1: vsource a gnd\nshow volts(a)\nsweep 10Hz to 1MHz log 1000 per decade\n";
    const r = solveNetlist(text, { maxPoints: 1000 });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    // 5 decades × 1000 per decade + 1 = 5001 points.
    expect(r.errors).toEqual([
      expect.objectContaining({ line: 4, column: 1, message: expect.stringContaining("5001 points") }),
    ]);
  });

  it("stores a result as re/im only and reads it back identical, variants included", () => {
    const r = solveNetlist(`${EXAMPLE}\nvary Rf over 22k, 24k, 26k\n`);
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    expect(r.variants).toHaveLength(3);
    const stored = solver.compactResult(r);
    expect(stored.traces[0]).not.toHaveProperty("magnitudeDb");
    expect(stored.variants?.[0]?.traces[0]).not.toHaveProperty("phaseDeg");
    // Through JSON, as the database keeps it: the same result to the last bit.
    const back = solver.expandResult(JSON.parse(JSON.stringify(stored)));
    expect(back).toEqual(JSON.parse(JSON.stringify(r)));
    expect(JSON.stringify(stored).length).toBeLessThan(0.6 * JSON.stringify(r).length);
    // A result saved in full form reads back unchanged.
    expect(solver.expandResult(r)).toEqual(r);
  });

  it("solves the language reference's example end to end", () => {
    const r = solveNetlist(EXAMPLE);
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    expect(r.title).toBe("Test-tone generator, 1 kHz");
    expect(r.frequencies.length).toBe(801);
    expect(r.stats.points).toBe(801);
    expect(r.traces.map((t) => [t.name, t.kind])).toEqual([
      ["bridge", "probe"],
      ["T", "loop"],
    ]);
    // f0 = 1/(2πRC), R = 16 kΩ, C = 10 nF (OAFE §15.7.1 Eq. 15-9)
    expectClose(r.measures[0]?.value, 1 / (2 * Math.PI * 16e3 * 10e-9), 1e-9);
    // Loop gain K/3 with K = 1 + 24k/11k (OAFE Eq. 15-8; common practice)
    expectClose(r.measures[1]?.value, (1 + 24 / 11) / 3, 1e-9);
    expect(r.checks.map((c) => c.pass)).toEqual([true, true]);
    // The result is plain JSON: no NaN or Infinity anywhere.
    const round = JSON.parse(JSON.stringify(r));
    expect(round).toEqual(r);
  });

  it("passes language errors through with line and column", () => {
    const r = solveNetlist("R1: resistor a gnd 10kF\n");
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const unit = r.errors.find((e) => e.message.includes("farads"));
    expect(unit).toMatchObject({ line: 1, column: 20 });
  });

  it("refuses a sweep above the service's point limit", () => {
    const r = solveNetlist(EXAMPLE, { maxPoints: 500 });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]?.message).toBe("the sweep has 801 points; this service allows at most 500");
  });

  it("names the floating node of a netlist", () => {
    const r = solveNetlist(
      "V1: vsource in gnd 1\nR1: resistor in gnd 1k\nC1: capacitor x y 1n\nshow volts(x)\n",
    );
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]?.message).toContain("no path to gnd");
    expect(r.errors[0]?.line).toBe(3);
  });
});
