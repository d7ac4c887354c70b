/** Measures: refinement beyond the sweep grid, wraps, margins, null answers. */
import { describe, expect, it } from "vitest";
import { analyze } from "@/solver/engine";
import type { Circuit, MeasureDef, Part, SolveSuccess } from "@/solver/types";
import { circuit, div, measure, part, show, v } from "./engine-circuits";
import { expectClose } from "./engine-tolerance";

const span = { line: 1, column: 1, endColumn: 2 };

function solve(c: Circuit): SolveSuccess {
  const r = analyze(c, []);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}
const value = (r: SolveSuccess, name: string) => r.measures.find((m) => m.name === name)!;

describe("refinement solves again instead of interpolating", () => {
  it("an RC corner from a sweep of 2 points per decade is still exact to 1e-9 (OAFE §16.2)", () => {
    const c = circuit(
      [
        part("vsource", "V1", ["in", "gnd"], 1),
        part("resistor", "R1", ["in", "out"], 10e3),
        part("capacitor", "C1", ["out", "gnd"], 10e-9),
      ],
      {
        shows: [show("H", div(v("out"), v("in")))],
        sweep: { kind: "log", start: 10, stop: 1e6, perDecade: 2 },
        measures: [measure("fc", "crossing", "H", { level: { kind: "half-power" } })],
      },
    );
    expect(solve(c).frequencies).toHaveLength(11);
    expectClose(value(solve(c), "fc").value, 1591.549430919, 1e-9); // OAFE §16.2: 1/(2πRC)
  });

  it("a resonance peak from 3 points per decade is exact to 1e-9 (series RLC, common practice)", () => {
    const c = circuit(
      [
        part("vsource", "V1", ["in", "gnd"], 1),
        part("inductor", "L1", ["in", "a"], 10e-3),
        part("capacitor", "C1", ["a", "b"], 100e-9),
        part("resistor", "R1", ["b", "gnd"], 100),
      ],
      {
        shows: [show("H", div(v("b"), v("in")))],
        sweep: { kind: "log", start: 100, stop: 1e6, perDecade: 3 },
        measures: [measure("f0", "peak", "H"), measure("bw", "bandwidth", "H")],
      },
    );
    const r = solve(c);
    expectClose(value(r, "f0").value, 5032.92121, 1e-9); // f0 = 1/(2π√(LC)) (CHECKS §8)
    expectClose(value(r, "bw").value, 1591.549431, 1e-9); // BW = R/(2πL) (CHECKS §8)
  });

  it("a low-pass's bandwidth counts from 0 Hz: it is the upper edge (NETLIST.md)", () => {
    const c = circuit(
      [
        part("vsource", "V1", ["in", "gnd"], 1),
        part("resistor", "R1", ["in", "out"], 10e3),
        part("capacitor", "C1", ["out", "gnd"], 10e-9),
      ],
      {
        shows: [show("H", div(v("out"), v("in")))],
        sweep: { kind: "log", start: 0.01, stop: 1e6, perDecade: 10 },
        measures: [measure("bw", "bandwidth", "H"), measure("q", "q", "H")],
      },
    );
    const r = solve(c);
    expectClose(value(r, "bw").value, 1591.549430919, 1e-9); // OAFE §16.2 (the peak is at 0.01 Hz ≈ DC)
    expectClose(value(r, "q").value, 0.01 / 1591.549430919, 1e-9);
  });
});

/** Three buffered RC sections and an inverting gain K closing the loop at node a. */
function threeSection(k: number, extra: MeasureDef[]): Circuit {
  const parts: Part[] = [];
  let from = "a";
  for (let i = 1; i <= 3; i++) {
    parts.push(
      part("resistor", `R${i}`, [from, `x${i}`], 10e3),
      part("capacitor", `C${i}`, [`x${i}`, "gnd"], 10e-9),
      // The last stage drives a: the loop is closed.
      part("vcvs", `B${i}`, [i === 3 ? "a" : `y${i}`, "gnd", `x${i}`, "gnd"], i === 3 ? -k : 1),
    );
    from = `y${i}`;
  }
  return circuit(parts, {
    loops: [{ name: "T", node: "a", before: ["R1"], span }],
    sweep: { kind: "log", start: 10, stop: 1e6, perDecade: 20 },
    measures: extra,
  });
}

describe("margins and phase crossings", () => {
  it("buffered sections: ∠T = 0 at √3/(2πRC) = 2756.6445 Hz where |T| = K/8; PM and GM (CHECKS §7; common practice)", () => {
    const r = solve(
      threeSection(4, [
        measure("f180", "zero-phase", "T"),
        measure("gm", "gain-margin", "T"),
        measure("pm", "phase-margin", "T"),
        measure("fu", "unity", "T"),
      ]),
    );
    expectClose(value(r, "f180").value, 2756.6445, 1e-7); // CHECKS §7: √3/(2πRC), β = −1/8
    expectClose(value(r, "gm").value, 20 * Math.log10(8 / 4), 1e-9); // |T| = K/8 there (CHECKS §7)
    // |T| = 1 where (1 + x²)^(3/2) = K; PM = |180° − 3·atan x| (derivation, common practice)
    const x = Math.sqrt(4 ** (2 / 3) - 1);
    expectClose(value(r, "fu").value, x / (2 * Math.PI * 10e3 * 10e-9), 1e-9);
    expectClose(value(r, "pm").value, 180 - (3 * Math.atan(x) * 180) / Math.PI, 1e-9);
  });

  it("a ±180° wrap is not a zero-phase crossing", () => {
    // Unbuffered series-R/shunt-C ladder: the phase falls from 0° through −180° (a wrap to +180°)
    // to +90°, never crossing 0° again (CHECKS §7: real and negative at 3898.48400617 Hz).
    const parts: Part[] = [part("vsource", "V1", ["in", "gnd"], 1)];
    const nodes = ["in", "n1", "n2", "out"];
    for (let i = 0; i < 3; i++) {
      parts.push(
        part("resistor", `R${i}`, [nodes[i]!, nodes[i + 1]!], 10e3),
        part("capacitor", `C${i}`, [nodes[i + 1]!, "gnd"], 10e-9),
      );
    }
    const r = solve(
      circuit(parts, {
        shows: [show("H", div(v("out"), v("in")))],
        sweep: { kind: "log", start: 10, stop: 1e6, perDecade: 20 },
        measures: [
          measure("z", "zero-phase", "H"),
          measure("w", "crossing", "H", { level: { kind: "deg", value: 180 } }),
        ],
      }),
    );
    expect(value(r, "z")).toEqual({
      name: "z",
      value: null,
      unit: "Hz",
      reason: "∠H does not cross 0° between 10 Hz and 1 MHz",
    });
    expectClose(value(r, "w").value, 3898.48400617, 1e-9); // CHECKS §7
  });

  it("phase values lie in (−180°, 180°]", () => {
    const r = solve(threeSection(4, []));
    const ph = r.traces[0]!.phaseDeg;
    expect(Math.min(...ph)).toBeGreaterThan(-180);
    expect(Math.max(...ph)).toBeLessThanOrEqual(180);
    // T = −K/(1 + jωRC)³: 180° − 3·atan(ωRC) at the first point (10 Hz)
    expectClose(ph[0]!, 180 - (3 * Math.atan(2 * Math.PI * 10 * 1e-4) * 180) / Math.PI, 1e-12);
  });

  it("mag/db/phase at a measure without a value are null with the reason passed on", () => {
    const r = solve(
      threeSection(4, [
        measure("fu", "unity", "T"),
        measure("m", "mag", "T", { at: { measure: "nothing" } }),
      ]),
    );
    expect(value(r, "m")).toMatchObject({ value: null, reason: "no earlier measure named nothing" });
  });
});
