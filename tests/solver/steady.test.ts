import { describe, expect, it } from "vitest";
import { oscillatorVerdict } from "@/components/analyses/oscillator-grade";
import { solveNetlist } from "@/solver";
import { describingGain } from "@/solver/engine/steady/describing-function";
import type { SolveSuccess } from "@/solver/types";
import { integrateBridge } from "./steady-reference";

function solved(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.line}:${e.column} ${e.message}`).join("\n"));
  return r;
}

const measure = (r: SolveSuccess, name: string) => r.measures.find((m) => m.name === name)!;

/** Equal-part bridge (R, C) around an op-amp of gain K = 1 + Rf/Rg, limited by `limiter`. */
function bridge(opts: {
  R?: string;
  C?: string;
  rf: string;
  limiter: string;
  extra?: string;
  opamp?: string;
}) {
  return [
    `let R = ${opts.R ?? "10k"}`,
    `let C = ${opts.C ?? "10n"}`,
    "Rs: resistor out mid R",
    "Cs: capacitor mid pos C",
    "Rp: resistor pos gnd R",
    "Cp: capacitor pos gnd C",
    `U1: opamp pos neg out ${opts.opamp ?? ""}`,
    "Rg: resistor neg gnd 10k",
    opts.rf,
    opts.limiter,
    "sweep 100Hz to 100kHz log 100 per decade",
    "show network = volts(pos) / volts(out)",
    "loop T cut out before Rs",
    opts.extra ?? "steady T",
    "measure fosc = frequency(T)",
    "measure amp = amplitude(volts(out))",
    "measure dist = thd(volts(out))",
    "measure settle = startup(T)",
    "check dist < 5%",
  ].join("\n");
}

/**
 * Describing function of ideal saturation with unit slope and limit a, for a sine of amplitude A ≥ a:
 * N(A) = (2/π)·[asin(a/A) + (a/A)·√(1 − (a/A)²)] (A. Gelb and W. E. Vander Velde, Multiple-Input
 * Describing Functions and Nonlinear System Design, 1968 — CHECKS.md §12).
 */
const saturationDf = (r: number) => (2 / Math.PI) * (Math.asin(r) + r * Math.sqrt(1 - r * r));

/** The fundamental at the limiter's output where K·N(A) = 3 (equal-part bridge: β = 1/3 at f0, CHECKS.md §2). */
function dfAmplitude(K: number, a: number): number {
  let lo = 1e-9;
  let hi = 1; // r = a/A
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (saturationDf(mid) * K > 3) hi = mid;
    else lo = mid;
  }
  const A = a / lo; // amplitude before the limit (K·v+)
  return saturationDf(lo) * A;
}

describe("steady oscillation limited by the op-amp's swing", () => {
  it("evaluates the equivalent gain of a ±a limit as the published describing function", () => {
    const port = {
      kind: "swing" as const,
      part: {
        name: "U1",
        kind: "opamp" as const,
        nodes: [],
        value: 0,
        span: { line: 1, column: 1, endColumn: 2 },
      },
      swing: 1,
      gain: 1e6,
      tau: 0,
      row: 0,
      inP: -1,
      inN: -1,
      c: 1,
    };
    for (const A of [0.5, 1, 1.277822, 2, 5, 20]) {
      const expected = A <= 1 ? 1 : saturationDf(1 / A);
      expect(describingGain(port, A, 4096)).toBeCloseTo(expected, 5);
    }
  });

  it("harmonic balance with one harmonic is the describing-function solution (K = 3.4, ±12 V)", () => {
    // CHECKS.md §12: N = 3/K = 0.882353 → A/a = 1.277822, fundamental 13.5299 V peak, at f0 = 1591.549 Hz.
    expect(dfAmplitude(3.4, 12)).toBeCloseTo(13.5299, 3);
    const r = solved(
      bridge({
        rf: "Rf: resistor neg out 24k",
        limiter: "",
        opamp: "swing=12V",
        extra: "steady T harmonics=1",
      }),
    );
    expect(r.steady!.reason).toBeNull();
    expect(measure(r, "amp").value!).toBeCloseTo(13.5299, 3);
    expect(measure(r, "fosc").value!).toBeCloseTo(1591.549, 1);
    expect(r.steady!.notes.join(" ")).toMatch(/gain of 1e6/);
  });

  it("with 31 harmonics lands within a few % of the describing-function estimate (K = 3.1, ±10 V)", () => {
    const r = solved(
      bridge({
        rf: "Rf: resistor neg out 21k",
        limiter: "",
        opamp: "swing=10V",
        extra: "steady T harmonics=31",
      }),
    );
    const df = dfAmplitude(3.1, 10);
    expect(Math.abs(measure(r, "amp").value! / df - 1)).toBeLessThan(0.03);
    expect(Math.abs(measure(r, "fosc").value! / 1591.549 - 1)).toBeLessThan(0.03);
    expect(r.steady!.residual!).toBeLessThan(1e-8);
  });
});

describe("steady oscillation of a diode-limited bridge", () => {
  const cases = [
    { R: "10k", C: "10n", rf1: "15k", rf2: "7k", Rv: 10e3, Cv: 10e-9, f1: 15e3, f2: 7e3 },
    { R: "10k", C: "1.5n", rf1: "12k", rf2: "10k", Rv: 10e3, Cv: 1.5e-9, f1: 12e3, f2: 10e3 },
  ];
  for (const c of cases) {
    it(`agrees with a time-domain integration to steady state (R = ${c.R}, C = ${c.C})`, () => {
      const text = bridge({
        R: c.R,
        C: c.C,
        rf: `Rf1: resistor neg x ${c.rf1}\nRf2: resistor x out ${c.rf2}`,
        limiter: "D1: diode x out\nD2: diode out x",
      });
      const r = solved(text);
      const hb = {
        f: measure(r, "fosc").value!,
        a: measure(r, "amp").value!,
        thd: measure(r, "dist").value!,
      };
      // The project's own reference: RK4 in the test (steady-reference.ts), same Shockley law at 300.15 K.
      const td = integrateBridge({
        R: c.Rv,
        C: c.Cv,
        Rg: 10e3,
        Rf1: c.f1,
        Rf2: c.f2,
        is: 1e-14,
        n: 1,
        kelvin: 300.15,
      });
      expect(td.frequencyHz).toBeGreaterThan(1e3);
      expect(td.frequencyHz).toBeLessThan(20e3);
      expect(td.amplitude).toBeGreaterThan(0.5);
      expect(td.amplitude).toBeLessThan(15);
      expect(Math.abs(hb.a / td.amplitude - 1)).toBeLessThan(0.005);
      expect(Math.abs(hb.f / td.frequencyHz - 1)).toBeLessThan(0.002);
      expect(Math.abs(hb.thd / td.thdPercent - 1)).toBeLessThan(0.1);
    });
  }

  it("starts with σ = (K − 3)/(2RC) and takes ln(A/1 µV)/σ to settle", () => {
    // CHECKS.md §2: (RCs)² + (3 − K)(RCs) + 1 = 0 → σ = (K − 3)/(2RC); K = 1 + 22k/10k = 3.2, RC = 100 µs: 1000 s⁻¹.
    const r = solved(
      bridge({
        rf: "Rf1: resistor neg x 15k\nRf2: resistor x out 7k",
        limiter: "D1: diode x out\nD2: diode out x",
        extra: "steady T\npoles",
      }),
    );
    const s = r.steady!;
    expect(s.startup!.sigma).toBeCloseTo(1000, 3);
    const a = s.probes[0]!.amplitudes[0]!;
    expect(measure(r, "settle").value!).toBeCloseTo(Math.log(a / 1e-6) / 1000, 9);
    expect(s.startup!.cycles!).toBeCloseTo(s.startup!.seconds! * s.frequencyHz!, 9);
    expect(s.summary).toMatch(
      /^settles at 4\.\d V peak at out, 1\.585 kHz, 4\.1 % distortion; reaches that in about 15 ms \(24 cycles\)$/,
    );
    // The oscillation verdict of the run page says the same: it grows.
    const verdict = oscillatorVerdict(r)!;
    expect(verdict.kind).toBe("starts");
    expect(verdict.detail).toContain(`Steady state: ${s.summary}.`);
    expect(s.probes[0]!.waveform.value.length).toBeGreaterThanOrEqual(256);
  });
});

describe("when there is no steady oscillation", () => {
  it("says it does not start (K = 2.9): measures null with the reason, checks fail with it", () => {
    const r = solved(
      bridge({
        rf: "Rf: resistor neg out 19k",
        limiter: "D1: diode neg out\nD2: diode out neg",
        extra: "steady T\npoles",
      }),
    );
    expect(oscillatorVerdict(r)!.kind).toBe("decays");
    // |T| at zero phase = K/3 = 0.9667 (CHECKS.md §2).
    expect(r.steady!.reason).toBe("loop gain 0.97 at zero phase: it does not start");
    expect(measure(r, "amp")).toMatchObject({
      value: null,
      reason: "loop gain 0.97 at zero phase: it does not start",
    });
    expect(r.checks[0]).toMatchObject({ pass: false });
    expect(r.checks[0]!.reason).toMatch(/does not start/);
  });

  it("says nothing limits it when there is no diode and no swing", () => {
    const r = solved(bridge({ rf: "Rf: resistor neg out 24k", limiter: "" }));
    expect(r.steady!.reason).toBe(
      "nothing in the netlist limits the amplitude: it grows until the supply does; add `swing=` to the op-amp",
    );
    expect(measure(r, "fosc").value).toBeNull();
  });

  it("needs a steady statement for the steady measures, with the place", () => {
    const r = solveNetlist(bridge({ rf: "Rf: resistor neg out 24k", limiter: "", extra: "" }));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]!.message).toMatch(/no `steady` statement/);
  });
});
