/**
 * Stamps of every part kind, checked on small networks whose answers follow from Ohm's and
 * Kirchhoff's laws (common practice), plus the engine's errors for circuits with no unique solution.
 */
import { describe, expect, it } from "vitest";
import { analyze } from "@/solver/engine";
import type { Circuit, Part, Probe, SolveSuccess } from "@/solver/types";
import { circuit, div, measure, mulberry32, part, show, v } from "./engine-circuits";
import { expectClose } from "./engine-tolerance";

const i = (p: string): Probe => ({ op: "i", part: p });
const at = (hz: number) => ({ at: { hz } });

/** Value of probe `p` at frequency f: returns [re, im]. */
function probeAt(parts: Part[], p: Probe, f = 1000, extra: Partial<Circuit> = {}): [number, number] {
  const r = analyze(
    circuit(parts, { shows: [show("x", p)], sweep: { kind: "list", points: [f] }, ...extra }),
    [],
  );
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return [r.traces[0]!.re[0]!, r.traces[0]!.im[0]!];
}

describe("stamps (common practice: Ohm's and Kirchhoff's laws)", () => {
  it("resistor divider and the passive sign convention of i()", () => {
    const parts = [
      part("vsource", "V1", ["a", "gnd"], 10),
      part("resistor", "R1", ["a", "b"], 3e3),
      part("resistor", "R2", ["b", "gnd"], 2e3),
    ];
    expectClose(probeAt(parts, v("b"))[0], 4); // 10 V · 2k/(3k+2k)
    expectClose(probeAt(parts, i("R1"))[0], 2e-3); // 10 V / 5 kΩ enters R1 at a
    // The source delivers power: the current entering its + terminal is negative.
    expectClose(probeAt(parts, i("V1"))[0], -2e-3);
    expectClose(probeAt(parts, v("a", "b"))[0], 6);
  });

  it("capacitor and inductor impedances 1/(jωC) and jωL", () => {
    const f = 1000;
    const w = 2 * Math.PI * f;
    const cap = [part("vsource", "V1", ["a", "gnd"], 1), part("capacitor", "C1", ["a", "gnd"], 1e-6)];
    const [cr, ci] = probeAt(cap, i("C1"), f);
    expectClose(cr, 0, 0, 1e-15);
    expectClose(ci, w * 1e-6, 1e-12); // i = jωC·v
    const ind = [part("vsource", "V1", ["a", "gnd"], 1), part("inductor", "L1", ["a", "gnd"], 1e-3)];
    const [lr, li] = probeAt(ind, i("L1"), f);
    expectClose(lr, 0, 0, 1e-15);
    expectClose(li, -1 / (w * 1e-3), 1e-12); // i = v/(jωL)
  });

  it("source phase and the current source's direction (from p through the source to n)", () => {
    const vs = [
      part("vsource", "V1", ["a", "gnd"], 2, { phaseDeg: 30 }),
      part("resistor", "R1", ["a", "gnd"], 1),
    ];
    const [re, im] = probeAt(vs, v("a"));
    expectClose(re, 2 * Math.cos(Math.PI / 6), 1e-12);
    expectClose(im, 1, 1e-12);
    // 1 mA flows out of the source's n terminal into node a, so v(a) = +1 mA · 1 kΩ.
    const is = [part("isource", "I1", ["gnd", "a"], 1e-3), part("resistor", "R1", ["a", "gnd"], 1e3)];
    expectClose(probeAt(is, v("a"))[0], 1);
    expectClose(probeAt(is, i("I1"))[0], 1e-3);
  });

  it("controlled sources: vcvs, vccs, ccvs, cccs", () => {
    const base = [part("vsource", "V1", ["in", "gnd"], 1), part("resistor", "Rin", ["in", "gnd"], 1e3)];
    const vcvs = [
      ...base,
      part("vcvs", "E1", ["o", "gnd", "in", "gnd"], 5),
      part("resistor", "RL", ["o", "gnd"], 1e3),
    ];
    expectClose(probeAt(vcvs, v("o"))[0], 5);
    // gm·v(in) leaves node o through the part into gnd: v(o) = −gm·RL.
    const vccs = [
      ...base,
      part("vccs", "G1", ["o", "gnd", "in", "gnd"], 2e-3),
      part("resistor", "RL", ["o", "gnd"], 1e3),
    ];
    expectClose(probeAt(vccs, v("o"))[0], -2);
    expectClose(probeAt(vccs, i("G1"))[0], 2e-3);
    // i(V1) = −1 mA (delivering); ccvs r = 1 kΩ → v(o) = −1 V.
    const ccvs = [
      ...base,
      part("ccvs", "H1", ["o", "gnd"], 1e3, { sense: "V1" }),
      part("resistor", "RL", ["o", "gnd"], 1e3),
    ];
    expectClose(probeAt(ccvs, v("o"))[0], -1);
    // cccs k = 3: 3·(−1 mA) flows from o through the part to gnd → v(o) = +3 V across 1 kΩ.
    const cccs = [
      ...base,
      part("cccs", "F1", ["o", "gnd"], 3, { sense: "V1" }),
      part("resistor", "RL", ["o", "gnd"], 1e3),
    ];
    expectClose(probeAt(cccs, v("o"))[0], 3);
  });

  it("op-amp: ideal inverting gain, finite gain A0, and output resistance", () => {
    const inv = (opamp?: Part["opamp"], load = 1e12) => [
      part("vsource", "V1", ["in", "gnd"], 1),
      part("resistor", "Ri", ["in", "n"], 1e3),
      part("resistor", "Rf", ["n", "o"], 10e3),
      part("opamp", "U1", ["gnd", "n", "o"], 0, opamp ? { opamp } : {}),
      part("resistor", "RL", ["o", "gnd"], load),
    ];
    expectClose(probeAt(inv(), v("o"))[0], -10, 1e-12); // −Rf/Ri
    // Finite gain: G = −(Rf/Ri)/(1 + (1 + Rf/Ri)/A0) (common practice)
    expectClose(probeAt(inv({ gain: 1000 }), v("o"))[0], -10 / (1 + 11 / 1000), 1e-12);
    // Open loop with rout: a unity follower loaded by RL = rout halves A0·v_in… use gain 100, no feedback.
    const ol = [
      part("vsource", "V1", ["in", "gnd"], 1e-3),
      part("opamp", "U1", ["in", "gnd", "o"], 0, { opamp: { gain: 100, rout: 50 } }),
      part("resistor", "RL", ["o", "gnd"], 50),
    ];
    expectClose(probeAt(ol, v("o"))[0], 0.05, 1e-12); // 100 · 1 mV · 50/(50+50)
  });

  it("op-amp with gbw alone integrates: A(s) = 2πF/s, so the open-loop gain is 1 at F", () => {
    const ol = [
      part("vsource", "V1", ["in", "gnd"], 1),
      part("opamp", "U1", ["in", "gnd", "o"], 0, { opamp: { gbw: 1e6 } }),
    ];
    const [re, im] = probeAt(ol, v("o"), 1e6);
    expectClose(re, 0, 0, 1e-12);
    expectClose(im, -1, 1e-12); // 2πF/(j2πF) = −j
  });
});

describe("Kirchhoff's current law holds at every node of random networks (common practice)", () => {
  it("sums i() of every part at each node to zero (seeded, 20 networks)", () => {
    for (let seed = 1; seed <= 20; seed++) {
      const rnd = mulberry32(seed);
      const nodes = ["n1", "n2", "n3", "n4", "n5", "n6"];
      const pick = () => (rnd() < 0.2 ? "gnd" : nodes[Math.floor(rnd() * nodes.length)]!);
      // A resistor from every node to gnd keeps the network solvable; then random parts.
      const parts: Part[] = nodes.map((n, k) => part("resistor", `Rg${k}`, [n, "gnd"], 1e3 * (1 + rnd())));
      parts.push(part("vsource", "V1", ["n1", "n2"], 1, { phaseDeg: 20 }));
      parts.push(part("inductor", "L1", ["n3", "n4"], 1e-3));
      for (let k = 0; k < 10; k++) {
        const [a, b] = [pick(), pick()];
        if (a === b) continue;
        const kind = (["resistor", "capacitor", "isource", "vccs", "cccs"] as const)[k % 5]!;
        const value = { resistor: 2e3, capacitor: 1e-7, isource: 1e-3, vccs: 1e-4, cccs: 0.5 }[kind];
        const nodesOf = kind === "vccs" ? [a, b, pick(), pick()] : [a, b];
        parts.push(
          part(kind, `P${k}`, nodesOf, value * (0.5 + rnd()), kind === "cccs" ? { sense: "L1" } : {}),
        );
      }
      const c = circuit(parts, {
        shows: parts.map((p) => show(p.name, i(p.name))),
        sweep: { kind: "list", points: [300, 3000] },
      });
      const r = analyze(c, []);
      if (!r.ok) throw new Error(JSON.stringify(r.errors));
      for (let f = 0; f < 2; f++) {
        const sum = new Map(nodes.map((n) => [n, [0, 0]]));
        let scale = 0;
        for (const [k, p] of parts.entries()) {
          const [ir, ii] = [r.traces[k]!.re[f]!, r.traces[k]!.im[f]!];
          scale = Math.max(scale, Math.hypot(ir, ii));
          for (const [node, sign] of [
            [p.nodes[0]!, 1],
            [p.nodes[1]!, -1],
          ] as const) {
            const acc = sum.get(node);
            if (acc) {
              acc[0] = acc[0]! + sign * ir;
              acc[1] = acc[1]! + sign * ii;
            }
          }
        }
        for (const [, [sr, si]] of sum) expect(Math.hypot(sr!, si!)).toBeLessThan(1e-12 * scale);
      }
    }
  });
});

describe("circuits without a unique solution", () => {
  it("names the floating node and the frequency (a capacitor-only node at 0 Hz)", () => {
    const c = circuit(
      [
        part("vsource", "V1", ["a", "gnd"], 1),
        part("capacitor", "C1", ["a", "b"], 1e-9),
        part("capacitor", "C2", ["b", "gnd"], 1e-9, { span: { line: 7, column: 1, endColumn: 3 } }),
      ],
      { shows: [show("x", v("b"))], sweep: { kind: "linear", start: 0, stop: 1000, points: 11 } },
    );
    const r = analyze(c, []);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]?.message).toBe(
      "at 0 Hz the circuit has no unique solution: node b has no path to gnd through parts that conduct at this frequency",
    );
  });

  it("reports bad parts with their place instead of throwing", () => {
    const at7 = { span: { line: 7, column: 1, endColumn: 3 } };
    const c = circuit(
      [
        part("vsource", "V1", ["a", "gnd"], 1),
        part("ccvs", "H1", ["b", "gnd"], 1e3, { sense: "R1", ...at7 }),
        part("resistor", "R1", ["a", "b"], Number.NaN),
      ],
      { shows: [show("x", v("b"))] },
    );
    const r = analyze(c, []);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toContainEqual({
      line: 7,
      column: 1,
      endColumn: 3,
      message: 'H1: the sensed part "R1" is not a vsource or inductor of this circuit',
    });
    expect(r.errors.map((e) => e.message)).toContain("R1: the value is not a finite number");
  });

  it("reports a loop of voltage sources as singular, never NaN", () => {
    const c = circuit(
      [
        part("vsource", "V1", ["a", "gnd"], 1),
        part("vsource", "V2", ["a", "gnd"], 2),
        part("resistor", "R1", ["a", "gnd"], 1e3),
      ],
      { shows: [show("x", v("a"))], sweep: { kind: "list", points: [50] } },
    );
    const r = analyze(c, []);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]?.message).toMatch(/^at 50 Hz the circuit equations are singular/);
  });

  it("warns when the loop's cut node has no ideal voltage driver", () => {
    const c = circuit(
      [
        part("vsource", "V1", ["in", "gnd"], 1),
        part("resistor", "R1", ["in", "a"], 1e3),
        part("resistor", "R2", ["a", "gnd"], 1e3),
      ],
      { loops: [{ name: "T", node: "a", before: ["R2"], span: { line: 4, column: 1, endColumn: 5 } }] },
    );
    const r = analyze(c, []);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(
      r.warnings.some((w) => w.line === 4 && w.message.includes("not driven by an ideal voltage output")),
    ).toBe(true);
  });

  it("a measure without an answer is null with a reason, and its check fails with that reason", () => {
    const c = circuit(
      [
        part("vsource", "V1", ["in", "gnd"], 1),
        part("resistor", "R1", ["in", "o"], 1e3),
        part("resistor", "R2", ["o", "gnd"], 1e3),
      ],
      {
        shows: [show("H", div(v("o"), v("in")))],
        sweep: { kind: "log", start: 10, stop: 1e5, perDecade: 10 },
        measures: [
          measure("fz", "zero-phase", "H"),
          measure("u", "unity", "H"),
          measure("m", "mag", "H", at(100)),
        ],
        checks: [
          {
            measure: "u",
            op: ">",
            value: 1,
            expression: "u > 1",
            span: { line: 9, column: 1, endColumn: 2 },
          },
        ],
      },
    );
    const r = analyze(c, []) as SolveSuccess;
    expect(r.ok).toBe(true);
    // H = 1/2 exactly, real: the phase is 0 throughout and never crosses, |H| never crosses 1.
    expect(r.measures[1]).toEqual({
      name: "u",
      value: null,
      unit: "Hz",
      reason: "|H| does not cross 1 between 10 Hz and 100 kHz",
    });
    expectClose(r.measures[2]!.value, 0.5);
    // A phase that stays exactly at 0° never crosses it.
    expect(r.measures[0]).toMatchObject({
      value: null,
      reason: "∠H does not cross 0° between 10 Hz and 100 kHz",
    });
    expect(r.checks[0]).toEqual({
      name: "u",
      expression: "u > 1",
      pass: false,
      reason: "|H| does not cross 1 between 10 Hz and 100 kHz",
    });
  });

  it("reports the default sweep in a warning and the stats", () => {
    const c = circuit([part("vsource", "V1", ["in", "gnd"], 1), part("resistor", "R1", ["in", "gnd"], 1e3)], {
      defaultSweep: true,
      sweep: { kind: "log", start: 10, stop: 10e6, perDecade: 100 },
    });
    const r = analyze(c, []) as SolveSuccess;
    expect(r.frequencies.length).toBe(601);
    expect(r.frequencies[0]).toBe(10);
    expect(r.frequencies[600]).toBe(10e6);
    expect(r.warnings).toContainEqual({
      line: null,
      message: "no sweep statement: used 10 Hz to 10 MHz, 100 points per decade",
    });
    expect(r.stats).toMatchObject({ nodes: 1, unknowns: 2, points: 601 });
  });
});
