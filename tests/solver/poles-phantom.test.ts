/**
 * Poles without phantoms (issue 8, item 3): networks with ideal op-amps whose natural frequencies
 * are known in closed form report exactly those, nothing else. Before the verification step the
 * two networks with a capacitor on an ideal op-amp's input pair or in its feedback divider listed
 * extra "poles" near 10¹³ rad/s, some in the right half-plane.
 */
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { pencilEigenvalues, smallestSingularValue } from "@/solver/engine/poles";
import type { PoleResult, SolveSuccess } from "@/solver/types";
import { expectClose } from "./engine-tolerance";

function poles(text: string): PoleResult[] {
  const r = solveNetlist(`${text}\nsweep 10Hz to 1MHz log 10 per decade\nshow H = volts(in)\npoles\n`);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return (r as SolveSuccess).poles ?? [];
}

/** Real poles only: their σ values, ascending. */
const sigmas = (p: PoleResult[]) => p.map((x) => x.re).sort((a, b) => a - b);

describe("ideal op-amp networks: exactly the true poles", () => {
  it("inverting integrator with a load capacitor: one pole, exactly s = 0 (v_out = −v_in/(sRC); common practice)", () => {
    const p = poles(`Vin: vsource in gnd 1
R1: resistor in neg 10k
C1: capacitor neg out 10n
U1: opamp gnd neg out
Cl: capacitor out gnd 100n`);
    expect(p).toHaveLength(1);
    expect(p[0]).toMatchObject({ re: 0, im: 0, q: null, growthPerCycle: null });
  });

  it("lossy integrator: one pole at −1/(Rf·C) = −1000 rad/s (common practice)", () => {
    const p = poles(`Vin: vsource in gnd 1
R1: resistor in neg 10k
C1: capacitor neg out 10n
Rf: resistor neg out 100k
U1: opamp gnd neg out`);
    expect(p).toHaveLength(1);
    expectClose(p[0]!.re, -1000, 1e-12);
  });

  it("two buffered RC sections (followers): −1/(R1C1) and −1/(R2C2), nothing else (common practice)", () => {
    const p = poles(`Vin: vsource in gnd 1
R1: resistor in a 10k
C1: capacitor a gnd 10n
U1: opamp a b b
R2: resistor b c 1k
C2: capacitor c gnd 1u
U2: opamp c d d
Cl: capacitor d gnd 1u
Rl: resistor d gnd 1k`);
    const s = sigmas(p);
    expect(s).toHaveLength(2);
    expectClose(s[0]!, -10000, 1e-12); // 1/(10 kΩ·10 nF)
    expectClose(s[1]!, -1000, 1e-12); // 1/(1 kΩ·1 µF)
    for (const x of p) expect(x.im).toBe(0);
  });

  it("non-inverting stage, capacitor across the inputs: only the input RC's −1/(R1·C2) (v+ = v− leaves Ci idle)", () => {
    const p = poles(`Vin: vsource in gnd 1
R1: resistor in p 10k
C2: capacitor p gnd 10n
Ci: capacitor p neg 1n
R2: resistor neg out 10k
R3: resistor neg gnd 10k
U1: opamp p neg out`);
    expect(p).toHaveLength(1);
    expectClose(p[0]!.re, -10000, 1e-12);
  });

  it("non-inverting stage with R2‖C2 feedback and R3‖C3 to gnd: −1/(R1C1) and −1/(R2C2) only", () => {
    // The gain 1 + Z2/Z3 has a pole where R2‖C2's admittance 1/R2 + sC2 vanishes; R3‖C3 gives a zero.
    const p = poles(`Vin: vsource in gnd 1
R1: resistor in p 10k
C1: capacitor p gnd 10n
U1: opamp p neg out
R2: resistor out neg 10k
C2: capacitor out neg 1n
R3: resistor neg gnd 1k
C3: capacitor neg gnd 1u`);
    const s = sigmas(p);
    expect(s).toHaveLength(2);
    expectClose(s[0]!, -100000, 1e-11);
    expectClose(s[1]!, -10000, 1e-12);
  });

  it("equal-part Sallen–Key low-pass with gain A0 = 2: ω0 = 1/RC, Q = 1/(3 − A0) = 1 (CHECKS §4), one pair", () => {
    const p = poles(`Vin: vsource in gnd 1
R1: resistor in a 10k
R2: resistor a b 10k
Cg: capacitor b gnd 10n
Cf: capacitor a out 10n
U1: opamp b neg out
R4: resistor out neg 10k
R3: resistor neg gnd 10k`);
    expect(p).toHaveLength(2);
    for (const x of p) {
      expectClose(x.frequencyHz, 10000 / (2 * Math.PI), 1e-10); // ω0 = 1/RC = 10⁴ rad/s
      expectClose(x.q!, 1, 1e-10);
      expectClose(Math.abs(x.im), 5000 * Math.sqrt(3), 1e-10); // ω0·√(1 − 1/(4Q²))
    }
  });

  it("Sallen–Key stage plus an ideal inverting integrator: the pair and s = 0, no right-half-plane phantoms", () => {
    const p = poles(`Vin: vsource   in  gnd 1
R1:  resistor  in  a   1.87k
R2:  resistor  a   b   4.42k
Cg:  capacitor b   gnd 820p
Cf:  capacitor a   out 1.5n
U1:  opamp     b   out out
R3:  resistor  out c   10k
C3:  capacitor c   y   10n
U2:  opamp     gnd c   y`);
    expect(p).toHaveLength(3);
    expect(p[0]).toMatchObject({ re: 0, im: 0 });
    expectClose(p[1]!.frequencyHz, 49915.524, 1e-8); // CHECKS §4: 1/(2π√(R1R2·Cg·Cf))
    expectClose(p[1]!.q, 0.618187, 1e-6); // CHECKS §4
    for (const x of p) expect(x.re).toBeLessThanOrEqual(0);
  });
});

describe("the verification a zeros analysis can reuse", () => {
  it("a general pencil: G + s·C of a 2×2 with det = (s + 1)(s + 3); s = −2 is not singular", () => {
    // G = [[2, 1], [1, 2]], C = I: eigenvalues of −G are −1 and −3 (common practice).
    const pattern = { n: 2, rowPtr: Int32Array.from([0, 2, 4]), colIdx: Int32Array.from([0, 1, 0, 1]) };
    const pencil = { pattern, g: Float64Array.from([2, 1, 1, 2]), c: Float64Array.from([1, 0, 0, 1]) };
    const s = pencilEigenvalues(pencil, 1)!
      .map((x) => x.re)
      .sort((a, b) => a - b);
    expect(s).toHaveLength(2);
    expectClose(s[0]!, -3, 1e-12);
    expectClose(s[1]!, -1, 1e-12);
    expect(smallestSingularValue(pencil, -2, 0)).toBeGreaterThan(0.1);
    expect(smallestSingularValue(pencil, -1, 0)).toBeLessThan(1e-12);
  });
});
