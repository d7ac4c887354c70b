/**
 * The engine against published reference values (/work/shared/spec/CHECKS.md). Every numeric
 * expectation names its source beside it. OAFE = Texas Instruments, "Op Amps For Everyone —
 * Design Reference", R. Mancini (ed.), SLOD006B, 2002.
 */
import { describe, expect, it } from "vitest";
import { analyze } from "@/solver/engine";
import type { Circuit, MeasureDef, Part, SolveSuccess } from "@/solver/types";
import { circuit, div, measure, part, show, v } from "./engine-circuits";
import { expectClose } from "./engine-tolerance";

function solve(c: Circuit): SolveSuccess {
  const r = analyze(c, []);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}
const value = (r: SolveSuccess, name: string) => {
  const m = r.measures.find((x) => x.name === name);
  if (!m) throw new Error(`no measure ${name}`);
  if (m.value === null) throw new Error(`${name}: ${m.reason}`);
  return m.value;
};
const at = (hz: number) => ({ at: { hz } });
const log = (start: number, stop: number, perDecade = 40) => ({
  kind: "log" as const,
  start,
  stop,
  perDecade,
});

/** Wien network: series R1–C1 from `drive` to `pos`, shunt R2 ‖ C2 at `pos`. */
function wien(drive: string, r1: number, c1: number, r2: number, c2: number): Part[] {
  return [
    part("resistor", "Rs", [drive, "mid"], r1),
    part("capacitor", "Cs", ["mid", "pos"], c1),
    part("resistor", "Rp", ["pos", "gnd"], r2),
    part("capacitor", "Cp", ["pos", "gnd"], c2),
  ];
}

describe("§1 first-order RC (OAFE §16.2, Fig. 16-2)", () => {
  const fc = 1591.549430919; // OAFE §16.2: fc = 1/(2πRC), R = 10 kΩ, C = 10 nF
  const rc = (hp: boolean) =>
    circuit(
      [
        part("vsource", "Vin", ["in", "gnd"], 1),
        hp ? part("capacitor", "C1", ["in", "out"], 10e-9) : part("resistor", "R1", ["in", "out"], 10e3),
        hp ? part("resistor", "R1", ["out", "gnd"], 10e3) : part("capacitor", "C1", ["out", "gnd"], 10e-9),
      ],
      {
        shows: [show("H", div(v("out"), v("in")))],
        sweep: log(10, 1e6),
        measures: [
          measure("fc", "crossing", "H", { level: { kind: "half-power" } }),
          measure("deg_fc", "phase", "H", { at: { measure: "fc" } }),
          measure("mag10", "mag", "H", at(10 * fc)),
          measure("db10", "db", "H", at(10 * fc)),
          measure("deg10", "phase", "H", at(10 * fc)),
          measure("at3db", "crossing", "H", { level: { kind: "db", value: -3 } }),
          measure("mag_fc", "mag", "H", at(fc)),
        ],
      },
    );

  it("low-pass: fc, −45°, and the value a decade above", () => {
    const r = solve(rc(false));
    expectClose(value(r, "fc"), fc, 1e-9); // OAFE §16.2: 1591.5494309190 Hz
    expectClose(value(r, "deg_fc"), -45, 1e-9); // OAFE §16.2: −45° at fc
    expectClose(value(r, "mag10"), 0.099503719, 1e-8); // OAFE §16.2 worked in CHECKS §1: 0.0995037190
    expectClose(value(r, "db10"), -20.043214, 1e-7); // CHECKS §1: −20.043214 dB
    expectClose(value(r, "deg10"), -84.289407, 1e-8); // CHECKS §1: −84.289407°
  });

  it("high-pass: the same corner, +45°, −0.043214 dB and +5.710593° a decade above", () => {
    const r = solve(rc(true));
    expectClose(value(r, "fc"), fc, 1e-9); // OAFE §16.2
    expectClose(value(r, "deg_fc"), 45, 1e-9); // OAFE §16.2: +45° at fc for the high-pass
    expectClose(value(r, "db10"), -0.043214, 1e-5); // CHECKS §1
    expectClose(value(r, "deg10"), 5.710593, 1e-6); // CHECKS §1
  });

  it("−3 dB is about 0.707 of the amplitude (common practice)", () => {
    const r = solve(rc(false));
    // biome-ignore lint/suspicious/noApproximativeNumericConstant: the trade's rounded figure is what is checked
    expectClose(value(r, "mag_fc"), 0.707, 1e-3); // common practice: −3 dB ≈ 0.707
    // The literal −3 dB level sits just below the exact half-power corner (−3.0103 dB).
    expect(value(r, "at3db")).toBeLessThan(fc);
    expectClose(value(r, "at3db"), fc, 5e-3);
  });
});

describe("§2 Wien network (OAFE §15.7.1, Eqs. 15-7…15-9)", () => {
  const f0 = 1591.5494309; // OAFE §15.7.1: ω0 = 1/(RC), R = 10 kΩ, C = 10 nF
  const base = (parts: Part[], extra: MeasureDef[] = []) =>
    circuit([part("vsource", "Vin", ["in", "gnd"], 1), ...parts], {
      shows: [show("beta", div(v("pos"), v("in")))],
      sweep: log(10, 1e6),
      measures: [
        measure("f0", "zero-phase", "beta"),
        measure("b0", "mag", "beta", { at: { measure: "f0" } }),
        measure("db0", "db", "beta", { at: { measure: "f0" } }),
        ...extra,
      ],
    });

  it("equal parts: real 1/3 (−9.542425 dB) at f0, and its value at 2·f0", () => {
    const r = solve(base(wien("in", 10e3, 10e-9, 10e3, 10e-9)));
    expectClose(value(r, "f0"), f0, 1e-9); // OAFE Eq. 15-9
    expectClose(value(r, "b0"), 1 / 3, 1e-9); // OAFE Eq. 15-8: β(ω0) = 1/3
    expectClose(value(r, "db0"), -9.542425, 1e-6); // CHECKS §2: −9.542425 dB
    const k = r.frequencies.findIndex((f) => f >= 2 * f0);
    expect(k).toBeGreaterThan(0);
    // At exactly 2·f0 (solved there): β = 0.2666666667 − j0.1333333333 (CHECKS §2, from Eq. 15-7).
    const two = solve(
      base(wien("in", 10e3, 10e-9, 10e3, 10e-9), [
        measure("mag2", "mag", "beta", at(2 * f0)),
        measure("deg2", "phase", "beta", at(2 * f0)),
      ]),
    );
    expectClose(value(two, "mag2"), Math.hypot(0.2666666667, 0.1333333333), 1e-9);
    expectClose(value(two, "deg2"), -26.565051, 1e-7); // CHECKS §2
  });

  it("unequal parts: f0 = 721.95633785 Hz, β = 0.189968767224", () => {
    const r = solve(base(wien("in", 10e3, 22e-9, 4.7e3, 47e-9)));
    expectClose(value(r, "f0"), 721.95633785, 1e-9); // OAFE Eq. 15-9 with R1C1 ≠ R2C2 (CHECKS §2)
    expectClose(value(r, "b0"), 0.189968767224, 1e-10); // OAFE Eq. 15-8 (CHECKS §2)
  });

  it("loaded network −9.54 dB versus buffered sections −6.02 dB at the common corner (common practice)", () => {
    // High-pass C–R, a unity vcvs buffer, then low-pass R–C: each section 1/√2 at fc, no loading.
    const buffered = circuit(
      [
        part("vsource", "Vin", ["in", "gnd"], 1),
        part("capacitor", "C1", ["in", "a"], 10e-9),
        part("resistor", "R1", ["a", "gnd"], 10e3),
        part("vcvs", "B1", ["b", "gnd", "a", "gnd"], 1),
        part("resistor", "R2", ["b", "out"], 10e3),
        part("capacitor", "C2", ["out", "gnd"], 10e-9),
      ],
      {
        shows: [show("H", div(v("out"), v("in")))],
        measures: [measure("db0", "db", "H", at(f0))],
      },
    );
    expectClose(value(solve(buffered), "db0"), -6.0206, 1e-4); // CHECKS §2: 1/√2·1/√2 = −6.0206 dB
    const loaded = solve(base(wien("in", 10e3, 10e-9, 10e3, 10e-9)));
    expectClose(value(loaded, "db0"), -9.5424, 1e-4); // CHECKS §2: loaded −9.5424 dB
  });
});

/** The bridge oscillator of the spec's example: Wien network, non-inverting amplifier, loop cut. */
function bridge(rf: number, rg: number, r = 10e3, c = 10e-9, amp: Part["opamp"] = undefined): Circuit {
  return circuit(
    [
      ...wien("amp_out", r, c, r, c),
      part("opamp", "U1", ["pos", "neg", "amp_out"], 0, amp ? { opamp: amp } : {}),
      part("resistor", "Rf", ["neg", "amp_out"], rf),
      part("resistor", "Rg", ["neg", "gnd"], rg),
    ],
    {
      shows: [show("bridge", div(v("pos"), v("amp_out")))],
      loops: [{ name: "T", node: "amp_out", before: ["Rs"], span: { line: 1, column: 1, endColumn: 2 } }],
      sweep: log(10, 100e3, 100),
      measures: [
        measure("f0", "zero-phase", "bridge"),
        measure("fT", "zero-phase", "T"),
        measure("gain", "mag", "T", { at: { measure: "fT" } }),
      ],
      checks: [
        {
          measure: "gain",
          op: ">=",
          value: 1,
          expression: "gain >= 1",
          span: { line: 1, column: 1, endColumn: 2 },
        },
      ],
    },
  );
}

describe("oscillator verdicts by loop gain", () => {
  it("Rf/Rg = 2.2k/1k: loop gain 3.2/3 at f0, meets the Barkhausen criterion (common practice)", () => {
    const r = solve(bridge(2.2e3, 1e3));
    expectClose(value(r, "fT"), 1591.5494309, 1e-9); // OAFE §15.7.1: the loop is real at f0
    expectClose(value(r, "gain"), 3.2 / 3, 1e-9); // K·β = (1 + 2.2)/3, OAFE Eq. 15-8 (common practice)
    expect(r.checks[0]?.pass).toBe(true);
  });

  it("Rf/Rg = 1k/1k: loop gain 2/3, does not oscillate (common practice)", () => {
    const r = solve(bridge(1e3, 1e3));
    expectClose(value(r, "gain"), 2 / 3, 1e-9); // K·β = 2/3 (common practice)
    expect(r.checks[0]?.pass).toBe(false);
    expect(r.checks[0]?.reason).toContain("gain = 0.666667");
  });

  it("a period of 9.8 div × 10 µs/div = 98 µs ≈ 10.2 kHz matches 1/(2πRC) for R = 1.56 kΩ, C = 10 nF (common practice)", () => {
    const r = solve({ ...bridge(2.2e3, 1e3, 1.56e3, 10e-9), sweep: log(1e3, 1e5, 100) });
    const fromScope = 1 / (9.8 * 10e-6); // common practice: f = 1/period read off the screen
    expectClose(value(r, "f0"), 1 / (2 * Math.PI * 1.56e3 * 10e-9), 1e-9); // OAFE Eq. 15-9
    expectClose(value(r, "f0"), fromScope, 0.01); // within the 1 % a screen reading allows (common practice)
  });
});

describe("§3 single-pole op-amp (OAFE §11.3.15 Eq. 11-5, §15 Eq. 15-2)", () => {
  it("non-inverting gain 10 with A0 = 1e5, GBW = 1 MHz: −3 dB at exactly 100 010 Hz, −45°", () => {
    const c = circuit(
      [
        part("vsource", "Vin", ["in", "gnd"], 1),
        part("opamp", "U1", ["in", "neg", "out"], 0, { opamp: { gain: 1e5, gbw: 1e6 } }),
        part("resistor", "Rf", ["neg", "out"], 9e3),
        part("resistor", "Rg", ["neg", "gnd"], 1e3),
      ],
      {
        shows: [show("A", div(v("out"), v("in")))],
        sweep: log(1e-3, 1e8, 20),
        measures: [
          measure("a0", "mag", "A", at(1e-3)),
          measure("bw", "bandwidth", "A"),
          measure("f3", "crossing", "A", { level: { kind: "mag", value: 7.0703607758 } }),
          measure("m3", "mag", "A", at(100010)),
          measure("p3", "phase", "A", at(100010)),
        ],
      },
    );
    const r = solve(c);
    expectClose(value(r, "a0"), 9.99900009999, 1e-10); // OAFE Eq. 11-5: A0/(1+A0β)
    expectClose(value(r, "bw"), 100010, 1e-9); // CHECKS §3: exact half-power at 100 010 Hz
    expectClose(value(r, "f3"), 100010, 1e-9); // CHECKS §3
    expectClose(value(r, "m3"), 7.0703607758, 1e-10); // CHECKS §3
    expectClose(value(r, "p3"), -45, 1e-9); // CHECKS §3: −45.000°
    // The estimate GBW/(1 + Rf/Rg) = 100 kHz (Microchip Developer Help "Closed Loop Gain Bandwidth").
    expectClose(value(r, "bw"), 1e5, 2e-4);
  });

  it("Wien oscillator with A = ωT/s: f_osc = f0/√(1+3a) and K_req = 3 + 3a²/(1+3a) (derivation, no published source)", () => {
    // a = K·f0/fT with fT = 1 MHz, f0 = 1591.549 Hz → 1580.2716 Hz, K_req = 3.0000674 (CHECKS §3).
    const kReq = 3.0000674;
    const r = solve({
      ...bridge((kReq - 1) * 1e3, 1e3, 10e3, 10e-9, { gbw: 1e6 }),
      sweep: log(100, 1e5, 100),
    });
    expectClose(value(r, "fT"), 1580.2716, 1e-7); // CHECKS §3 (derivation, no published source)
    expectClose(value(r, "gain"), 1, 1e-7); // at K = K_req the loop gain is exactly 1 (same derivation)
  });
});

describe("§4 Sallen–Key low-pass with a unity-gain buffer (OAFE §16.3.2.1, Figs. 16-15/16)", () => {
  it("OAFE Ex. 16-3 second stage: f0 = 49 915.524 Hz, Q = 0.618187 = |H(jω0)|, −90°", () => {
    const c = circuit(
      [
        part("vsource", "Vin", ["in", "gnd"], 1),
        part("resistor", "R1", ["in", "a"], 1.87e3),
        part("resistor", "R2", ["a", "b"], 4.42e3),
        part("capacitor", "Cg", ["b", "gnd"], 820e-12),
        part("capacitor", "Cf", ["a", "out"], 1.5e-9),
        part("opamp", "U1", ["b", "out", "out"]),
      ],
      {
        shows: [show("H", div(v("out"), v("in")))],
        sweep: log(100, 10e6, 50),
        measures: [
          measure("f0", "crossing", "H", { level: { kind: "deg", value: -90 } }),
          measure("q", "mag", "H", { at: { measure: "f0" } }),
        ],
      },
    );
    const r = solve(c);
    expectClose(value(r, "f0"), 49915.524, 1e-8); // OAFE Ex. 16-3 (CHECKS §4)
    expectClose(value(r, "q"), 0.618187, 1e-6); // CHECKS §4: √(R1R2CgCf)/(Cg(R1+R2))
  });

  it("equal parts with gain A0 = 2 (R4 = R3): Q = 1/(3 − A0) = 1, so |H(jω0)| = A0·Q = 2", () => {
    const c = circuit(
      [
        part("vsource", "Vin", ["in", "gnd"], 1),
        part("resistor", "R1", ["in", "a"], 10e3),
        part("resistor", "R2", ["a", "b"], 10e3),
        part("capacitor", "Cg", ["b", "gnd"], 10e-9),
        part("capacitor", "Cf", ["a", "out"], 10e-9),
        part("opamp", "U1", ["b", "n", "out"]),
        part("resistor", "R4", ["n", "out"], 10e3),
        part("resistor", "R3", ["n", "gnd"], 10e3),
      ],
      {
        shows: [show("H", div(v("out"), v("in")))],
        sweep: log(10, 1e6, 50),
        measures: [
          measure("f0", "crossing", "H", { level: { kind: "deg", value: -90 } }),
          measure("h0", "mag", "H", { at: { measure: "f0" } }),
        ],
      },
    );
    const r = solve(c);
    expectClose(value(r, "f0"), 1591.5494309, 1e-9); // OAFE §16.3.2.1: f0 = 1/(2πRC)
    expectClose(value(r, "h0"), 2, 1e-9); // OAFE §16.3.2.1: Q = 1/(3 − A0) (confirmed, CHECKS §4)
  });
});

describe("§6 twin-T notch (OAFE §16.6.1)", () => {
  const twinT = (start: number, stop: number, extra: MeasureDef[]) =>
    circuit(
      [
        part("vsource", "Vin", ["in", "gnd"], 1),
        part("resistor", "Ra", ["in", "m"], 10e3),
        part("resistor", "Rb", ["m", "out"], 10e3),
        part("capacitor", "C2", ["m", "gnd"], 20e-9),
        part("capacitor", "Ca", ["in", "k"], 10e-9),
        part("capacitor", "Cb", ["k", "out"], 10e-9),
        part("resistor", "Rh", ["k", "gnd"], 5e3),
      ],
      { shows: [show("H", div(v("out"), v("in")))], sweep: log(start, stop, 50), measures: extra },
    );

  it("null at 1/(2πRC) and −3 dB points 375.713855 Hz and 6741.911579 Hz", () => {
    const r = solve(
      twinT(10, 1e5, [
        measure("null", "dip", "H"),
        measure("lo", "crossing", "H", { level: { kind: "half-power" } }),
        measure("m2", "mag", "H", at(2 * 1591.5494309)),
        measure("p2", "phase", "H", at(2 * 1591.5494309)),
      ]),
    );
    expectClose(value(r, "null"), 1591.5494309, 1e-9); // OAFE §16.6.1 (CHECKS §6)
    expectClose(value(r, "lo"), 375.713855, 1e-8); // CHECKS §6
    expectClose(value(r, "m2"), Math.hypot(0.1232876712, 0.3287671233), 1e-9); // CHECKS §6: H(2f0)
    expectClose(value(r, "p2"), (Math.atan2(0.3287671233, 0.1232876712) * 180) / Math.PI, 1e-9);
    const hi = solve(twinT(2000, 1e5, [measure("hi", "crossing", "H", { level: { kind: "half-power" } })]));
    expectClose(value(hi, "hi"), 6741.911579, 1e-9); // CHECKS §6
  });
});

describe("§7 three-section phase-shift networks (Telecommunication Circuits & Technology p. 6; OAFE §15.7.2)", () => {
  const ladder = (seriesC: boolean) => {
    const parts: Part[] = [part("vsource", "Vin", ["in", "gnd"], 1)];
    const nodes = ["in", "n1", "n2", "out"];
    for (let i = 0; i < 3; i++) {
      const a = nodes[i]!;
      const b = nodes[i + 1]!;
      parts.push(
        seriesC ? part("capacitor", `Cs${i}`, [a, b], 10e-9) : part("resistor", `Rs${i}`, [a, b], 10e3),
        seriesC
          ? part("resistor", `Rp${i}`, [b, "gnd"], 10e3)
          : part("capacitor", `Cp${i}`, [b, "gnd"], 10e-9),
      );
    }
    return circuit(parts, {
      shows: [show("inv", { op: "neg", arg: div(v("out"), v("in")) })],
      sweep: log(10, 1e6, 50),
      measures: [measure("f", "zero-phase", "inv"), measure("beta", "mag", "inv", { at: { measure: "f" } })],
    });
  };

  it("series-C/shunt-R: −1/29 at 649.74733436 Hz", () => {
    const r = solve(ladder(true));
    expectClose(value(r, "f"), 649.74733436, 1e-9); // ω = 1/(√6RC) (CHECKS §7)
    expectClose(value(r, "beta"), 1 / 29, 1e-9); // inverting gain 29 needed (CHECKS §7)
  });

  it("series-R/shunt-C: −1/29 at 3898.48400617 Hz", () => {
    const r = solve(ladder(false));
    expectClose(value(r, "f"), 3898.48400617, 1e-9); // ω = √6/(RC) (CHECKS §7)
    expectClose(value(r, "beta"), 1 / 29, 1e-9); // CHECKS §7
  });
});

describe("§8 series RLC (ISBN 9781482261783 App. F Eq. F.3; the rest common practice)", () => {
  it("f0, Q, BW, f1, f2 of L = 10 mH, C = 100 nF, R = 100 Ω", () => {
    const c = circuit(
      [
        part("vsource", "Vin", ["in", "gnd"], 1),
        part("inductor", "L1", ["in", "a"], 10e-3),
        part("capacitor", "C1", ["a", "b"], 100e-9),
        part("resistor", "R1", ["b", "gnd"], 100),
      ],
      {
        shows: [show("H", div(v("b"), v("in")))],
        sweep: log(100, 1e6, 50),
        measures: [
          measure("f0", "peak", "H"),
          measure("bw", "bandwidth", "H"),
          measure("q", "q", "H"),
          measure("f1", "crossing", "H", { level: { kind: "half-power" } }),
        ],
      },
    );
    const r = solve(c);
    expectClose(value(r, "f0"), 5032.92121, 1e-9); // f0 = 1/(2π√(LC)) (common practice)
    expectClose(value(r, "q"), 3.162278, 1e-6); // Eq. F.3: Q = (1/R)√(L/C)
    expectClose(value(r, "bw"), 1591.549431, 1e-9); // BW = R/(2πL) (common practice)
    expectClose(value(r, "f1"), 4299.669653, 1e-9); // f1 = −R/(4πL) + √(…) (common practice)
    expectClose(value(r, "f1") + value(r, "bw"), 5891.219084, 1e-9); // f2 (common practice)
  });
});
