/**
 * `zeros PROBE` (LANGUAGE-NEXT §5) against closed forms. OAFE = Texas Instruments, "Op Amps For
 * Everyone — Design Reference", SLOD006B, 2002.
 */
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import type { SolveSuccess } from "@/solver/types";
import { expectClose } from "./engine-tolerance";

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}

describe("zeros", () => {
  it("balanced twin-T (CHECKS §6, OAFE §16.6.1): zeros at s = ±j/RC, 10 kΩ, 10 nF → ±j·10 000 rad/s (1591.549 Hz)", () => {
    const r = solve(`Vin: vsource in gnd 1
R1: resistor in a 10k
R2: resistor a out 10k
C3: capacitor a gnd 20n
C1: capacitor in b 10n
C2: capacitor b out 10n
R3: resistor b gnd 5k
sweep 10Hz to 100kHz log 20 per decade
zeros volts(out)
poles
`);
    const onAxis = r.zeros!.filter((z) => Math.abs(z.re) < 1e-6 * Math.abs(z.im));
    expect(onAxis).toHaveLength(2);
    for (const z of onAxis) {
      expectClose(Math.abs(z.im), 1e4, 1e-9); // CHECKS §6: 1/(RC)
      expectClose(z.frequencyHz, 1591.549431, 1e-9);
      expect(z.q).toBeNull();
      expect(z.probe).toBe("volts(out)");
    }
    // Unloaded, H = (1 + (sRC)²)/(1 + 4sRC + (sRC)²) (CHECKS §6): the third-order network's further
    // zero cancels one of its poles, so the transfer has exactly these two.
    expect(r.zeros).toHaveLength(2);
  });

  it("RC high-pass read as a current: the capacitor's current has a zero at the origin; a low-pass has none", () => {
    const hp = solve(
      "Vin: vsource in gnd 1\nC1: capacitor in out 10n\nR1: resistor out gnd 10k\nzeros amps(C1)\nzeros volts(out)\n",
    );
    expect(hp.zeros!.map((z) => z.frequencyHz)).toEqual([0, 0]);
    const lp = solve(
      "Vin: vsource in gnd 1\nR1: resistor in out 10k\nC1: capacitor out gnd 10n\nzeros volts(out)\n",
    );
    expect(lp.zeros).toEqual([]);
  });

  it("lead network R1 ∥ C1 into R2: a real zero at −1/(R1·C1) (common practice: H = R2(1 + sR1C1)/(R1 + R2 + sR1R2C1))", () => {
    const r = solve(
      "Vin: vsource in gnd 1\nR1: resistor in out 10k\nC1: capacitor in out 100n\nR2: resistor out gnd 1k\nzeros volts(out)\n",
    );
    expect(r.zeros).toHaveLength(1);
    expectClose(r.zeros![0]!.re, -1 / (10e3 * 100e-9), 1e-9);
    expect(r.zeros![0]!.im).toBe(0);
  });

  it("needs exactly one independent source (an error with a hint)", () => {
    const r = solveNetlist(
      "V1: vsource a gnd 1\nV2: vsource b gnd 1\nR1: resistor a b 1k\nR2: resistor b gnd 1k\nzeros volts(b)\n",
    );
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors[0]!.message).toContain("exactly one independent source");
      expect(r.errors[0]!.line).toBe(5);
      expect(r.errors[0]!.hint).toBeTruthy();
    }
  });
});
