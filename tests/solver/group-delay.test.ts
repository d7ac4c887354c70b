/**
 * Group delay (LANGUAGE-NEXT §4), exact from dX/ds, against closed forms. OAFE = Texas
 * Instruments, "Op Amps For Everyone — Design Reference", SLOD006B, 2002.
 */
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { groupDelayOf } from "@/solver/engine/trace";
import type { SolveSuccess } from "@/solver/types";
import { expectClose } from "./engine-tolerance";

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}
const value = (r: SolveSuccess, name: string) => {
  const m = r.measures.find((x) => x.name === name);
  if (m?.value == null) throw new Error(`${name}: ${m?.reason}`);
  return m.value;
};

describe("group delay", () => {
  it("first-order RC section: τ = RC/(1 + (ωRC)²) on every point and as a measure (common practice: −d/dω of −atan(ωRC))", () => {
    const rc = 10e3 * 10e-9;
    const r = solve(`Vin: vsource in gnd 1
R1: resistor in out 10k
C1: capacitor out gnd 10n
sweep 10Hz to 100kHz log 20 per decade
show H = volts(out) / volts(in)
measure d0 = group-delay(H) at 1.59155kHz
measure d1 = group-delay(H) at 20kHz
`);
    const tau = (f: number) => rc / (1 + (2 * Math.PI * f * rc) ** 2);
    const h = r.traces[0]!;
    expect(h.groupDelay).toHaveLength(r.frequencies.length);
    for (const [k, f] of r.frequencies.entries()) expectClose(h.groupDelay![k]!, tau(f), 1e-10);
    expectClose(value(r, "d0"), tau(1591.55), 1e-10);
    expectClose(value(r, "d1"), tau(20e3), 1e-10);
    expect(r.measures[0]!.unit).toBe("s");
  });

  it("second-order Bessel section: a and b computed from θ2(s) = s² + 3s + 3, checked against OAFE §16.9 Table 16-4 (n = 2: a = 1.3617, b = 0.6180); τ(0) = a/ωc and τ(ω) of 1/(1 + aΩj − bΩ²)", () => {
    // Computed here: the Bessel polynomial θ2(s) = s² + 3s + 3 (H = 3/θ2(s), maximally flat delay;
    // common practice) normalized so that |H(jω)| = 1/√2 at ω = 1 rad/s. Its −3 dB frequency ω3 is
    // found numerically (bisection); substituting s = ω3·S gives H = 1/(1 + ω3·S + (ω3²/3)·S²),
    // so a = ω3 and b = ω3²/3.
    const h2 = (w: number) => 9 / ((3 - w * w) ** 2 + (3 * w) ** 2); // |3/θ2(jω)|²
    let [lo, hi] = [0.1, 10];
    for (let i = 0; i < 200; i++) {
      const mid = (lo + hi) / 2;
      if (h2(mid) > 0.5) lo = mid;
      else hi = mid;
    }
    const w3 = (lo + hi) / 2;
    // The same ω3 by hand: (3 − ω²)² + 9ω² = 18 ⇔ ω⁴ + 3ω² − 9 = 0 ⇔ ω² = (√45 − 3)/2.
    expect(w3 * w3).toBeCloseTo((Math.sqrt(45) - 3) / 2, 12);
    const [a, b] = [w3, (w3 * w3) / 3];
    // Quoted (from memory) as OAFE's Table 16-4 prints them: only compared, to their 4 digits.
    expect(a.toFixed(4)).toBe("1.3617");
    expect(b.toFixed(4)).toBe("0.6180");
    // Realized as series R–L into a shunt C: H = 1/(1 + sRC + s²LC) with RC = a/ωc, LC = b/ωc², fc = 1 kHz.
    const wc = 2 * Math.PI * 1e3;
    const c = 100e-9;
    const r = solve(`Vin: vsource in gnd 1
R1: resistor in x ${a / (wc * c)}
L1: inductor x out ${b / (wc * wc * c)}
C1: capacitor out gnd 100n
sweep 1Hz to 100kHz log 20 per decade
show H = volts(out) / volts(in)
measure f3 = crossing(H, half-power)
measure t0 = group-delay(H) at 1Hz
measure tc = group-delay(H) at 1kHz
measure t2 = group-delay(H) at 2kHz
`);
    // τ(Ω) = (a/ωc)·(1 + bΩ²)/((1 − bΩ²)² + a²Ω²) (derivative of atan(aΩ/(1 − bΩ²)), common practice).
    const tau = (f: number) => {
      const w = f / 1e3;
      return ((a / wc) * (1 + b * w * w)) / ((1 - b * w * w) ** 2 + a * a * w * w);
    };
    expectClose(value(r, "f3"), 1e3, 1e-9); // a and b are normalized to the −3 dB frequency exactly
    expectClose(value(r, "t0"), a / wc, 1e-6);
    expectClose(value(r, "tc"), tau(1e3), 1e-9);
    expectClose(value(r, "t2"), tau(2e3), 1e-9);
  });

  it("keeps its value deep in a stop band, where |X|² would underflow, and is null once X is subnormal (first-order RC, common practice)", () => {
    const rc = 1e-4;
    const w = 2 * Math.PI * 20e3;
    // X = a/(1 + jωRC), X' = dX/ds = −a·RC/(1 + jωRC)²; τ = RC/(1 + (ωRC)²) whatever the scale a.
    const dual = (a: number) => {
      const dRe = 1;
      const dIm = w * rc;
      const d2 = dRe * dRe + dIm * dIm;
      const re = (a * dRe) / d2;
      const im = (-a * dIm) / d2;
      // 1/(1 + jωRC)² = (1 − jωRC)²/d2²
      const sqRe = (dRe * dRe - dIm * dIm) / (d2 * d2);
      const sqIm = (-2 * dRe * dIm) / (d2 * d2);
      return { re, im, dRe: -a * rc * sqRe, dIm: -a * rc * sqIm };
    };
    const tau = rc / (1 + (w * rc) ** 2);
    expectClose(groupDelayOf(dual(1))!, tau, 1e-12);
    // |X| ≈ 1e−162: |X|² is 0 in doubles, yet X and X' are ordinary numbers.
    expectClose(groupDelayOf(dual(1e-160))!, tau, 1e-12);
    expect(groupDelayOf(dual(1e-310))).toBeNull();
    expect(groupDelayOf({ re: 0, im: 0, dRe: 1, dIm: 0 })).toBeNull();
  });

  it("is null with a reason at a transmission zero", () => {
    const r = solve(`Vin: vsource in gnd 1
R1: resistor in out 1k
C1: capacitor out gnd 1u
show V = volts(out) - volts(out)
measure d = group-delay(V) at 1kHz
`);
    expect(r.measures[0]!.value).toBeNull();
    expect(r.measures[0]!.reason).toContain("its phase has no slope");
  });
  it("is 0, not cancellation noise, on a flat trace behind a buffer; a small real delay is kept", () => {
    // A divider driven by an ideal follower whose input has an RC: v(b)/v(out) is exactly ½ at
    // every frequency, but dX/ds comes from two derivatives of ~RC size that cancel (±2e−21 s of
    // rounding before). With 1 pF across the lower resistor the delay is real: R∥R·C = 0.5 ns at
    // low frequency (a first-order pole at 1/(R/2·C); common practice).
    const text = (extra: string) => `Vin: vsource in gnd 1
R1: resistor in a 1k
C1: capacitor a gnd 10n
U1: opamp a out out
R2: resistor out b 1k
R3: resistor b gnd 1k
${extra}
sweep 10Hz to 100kHz log 10 per decade
show B = volts(b) / volts(out)
measure d = group-delay(B) at 1kHz
`;
    const flat = solve(text(""));
    const b = flat.traces.find((t) => t.name === "B")!;
    expect(b.groupDelay!.every((x) => x === 0)).toBe(true);
    expect(value(flat, "d")).toBe(0);
    const real = solve(text("Cp: capacitor b gnd 1p"));
    expectClose(value(real, "d"), 0.5e-9 / (1 + (2 * Math.PI * 1e3 * 0.5e-9) ** 2), 1e-9);
  });
});
