import { describe, expect, it } from "vitest";
import {
  compareChecks,
  compareMeasures,
  compareRuns,
  compareTraces,
  diffNetlists,
  sampleTrace,
  wrapDeg,
} from "@/lib/compare";
import type { SolveSuccess, TraceResult } from "@/solver/types";

// First-order RC sections (OAFE §16.2, Fig. 16-2 — CHECKS.md §1): H_LP = 1/(1+jf/fc), H_HP = jf/fc/(1+jf/fc).
const FC = 1591.549430919; // R = 10 kΩ, C = 10 nF

function rcTrace(name: string, freqs: number[], kind: "lp" | "hp", fc = FC): TraceResult {
  const re: number[] = [];
  const im: number[] = [];
  for (const f of freqs) {
    const x = f / fc;
    const d = 1 + x * x;
    // 1/(1+jx) = (1 − jx)/(1+x²); jx/(1+jx) = (x² + jx)/(1+x²)
    if (kind === "lp") {
      re.push(1 / d);
      im.push(-x / d);
    } else {
      re.push((x * x) / d);
      im.push(x / d);
    }
  }
  return {
    name,
    kind: "probe",
    re,
    im,
    magnitudeDb: re.map((r, k) => 20 * Math.log10(Math.hypot(r, im[k]!))),
    phaseDeg: re.map((r, k) => (Math.atan2(im[k]!, r) * 180) / Math.PI),
  };
}

function logGrid(start: number, stop: number, perDecade: number): number[] {
  const n = Math.round(Math.log10(stop / start) * perDecade);
  return Array.from({ length: n + 1 }, (_, k) => start * 10 ** (k / perDecade));
}

function success(freqs: number[], traces: TraceResult[], extra: Partial<SolveSuccess> = {}): SolveSuccess {
  return {
    ok: true,
    title: null,
    solverVersion: "test",
    frequencies: freqs,
    traces,
    measures: [],
    checks: [],
    warnings: [],
    stats: { nodes: 2, unknowns: 3, points: freqs.length, solveMs: 0 },
    ...extra,
  };
}

describe("wrapDeg", () => {
  it("wraps to (−180, 180]", () => {
    expect(wrapDeg(180)).toBe(180);
    expect(wrapDeg(-180)).toBe(180);
    expect(wrapDeg(181)).toBeCloseTo(-179, 12);
    expect(wrapDeg(-181)).toBeCloseTo(179, 12);
    expect(wrapDeg(540)).toBe(180);
    expect(wrapDeg(-720)).toBe(0);
    expect(wrapDeg(90)).toBe(90);
  });
});

describe("diffNetlists", () => {
  it("numbers lines in each text and marks added and removed lines", () => {
    const a = "title A\nR1: resistor in out 10k\nC1: capacitor out gnd 10n\n";
    const b = "title A\r\nR1: resistor in out 22k\r\nC1: capacitor out gnd 10n\r\nshow volts(out)\r\n";
    const d = diffNetlists(a, b);
    expect(d).toEqual([
      { kind: "same", text: "title A", oldLine: 1, newLine: 1 },
      { kind: "removed", text: "R1: resistor in out 10k", oldLine: 2, newLine: null },
      { kind: "added", text: "R1: resistor in out 22k", oldLine: null, newLine: 2 },
      { kind: "same", text: "C1: capacitor out gnd 10n", oldLine: 3, newLine: 3 },
      { kind: "added", text: "show volts(out)", oldLine: null, newLine: 4 },
    ]);
  });
});

describe("compareMeasures", () => {
  it("gives Δ and Δ% and stays null-safe", () => {
    const rows = compareMeasures(
      [
        { name: "f0", value: 1591.5494309, unit: "Hz", reason: null },
        { name: "gain", value: 0, unit: "", reason: null },
        { name: "pm", value: null, unit: "deg", reason: "no unity crossing in the sweep" },
        { name: "gone", value: 3, unit: "", reason: null },
      ],
      [
        // f0 of the Wien network with R1 = 10k, C1 = 22n, R2 = 4k7, C2 = 47n: 721.95633785 Hz (CHECKS.md §2, OAFE §15.7.1)
        { name: "f0", value: 721.95633785, unit: "Hz", reason: null },
        { name: "gain", value: 2, unit: "", reason: null },
        { name: "pm", value: 45, unit: "deg", reason: null },
        { name: "new", value: 1, unit: "V", reason: null },
      ],
    );
    expect(rows.map((r) => r.name)).toEqual(["f0", "gain", "pm", "gone", "new"]);
    const [f0, gain, pm, gone, added] = rows;
    expect(f0!.delta).toBeCloseTo(721.95633785 - 1591.5494309, 9);
    expect(f0!.deltaPct).toBeCloseTo(-54.6379, 3);
    expect(gain!.delta).toBe(2);
    expect(gain!.deltaPct).toBeNull(); // division by a zero reference
    expect(pm!.delta).toBeNull();
    expect(pm!.reasonA).toBe("no unity crossing in the sweep");
    expect(gone!.presentIn).toBe("a");
    expect(gone!.b).toBeNull();
    expect(added!.presentIn).toBe("b");
    expect(added!.unit).toBe("V");
  });
});

describe("compareChecks", () => {
  it("matches checks by measure and expression and finds the ones that flipped", () => {
    const rows = compareChecks(
      [
        { name: "gain", expression: "gain >= 1", pass: false, reason: "gain is 0.95" },
        { name: "f0", expression: "f0 between 950Hz and 1.05kHz", pass: true, reason: null },
      ],
      [
        { name: "gain", expression: "gain >= 1", pass: true, reason: null },
        { name: "f0", expression: "f0 between 950Hz and 1.05kHz", pass: true, reason: null },
        { name: "gain", expression: "gain <= 1.2", pass: false, reason: "gain is 1.4" },
      ],
    );
    expect(rows).toHaveLength(3);
    expect(rows.filter((r) => r.flipped).map((r) => r.expression)).toEqual(["gain >= 1"]);
    expect(rows[0]!.reasonA).toBe("gain is 0.95");
    expect(rows[2]!.a).toBeNull();
    expect(rows[2]!.flipped).toBe(false);
  });
});

describe("sampleTrace", () => {
  it("interpolates in log frequency and takes the short way round a phase wrap", () => {
    const s = sampleTrace([100, 1000], [0, -20], [170, -170], Math.sqrt(100 * 1000));
    expect(s!.db).toBeCloseTo(-10, 12); // geometric midpoint → arithmetic mean in log f
    expect(s!.deg).toBeCloseTo(180, 12); // 170° → −170° passes through 180°, not 0°
    expect(sampleTrace([100, 1000], [0, -20], [0, 0], 99)).toBeNull();
    expect(sampleTrace([100, 1000], [0, -20], [0, 0], 1000)!.db).toBe(-20);
  });
});

describe("compareTraces", () => {
  it("gives HP − LP = 20·log10(f/fc) dB and +90° on the same grid (OAFE §16.2, CHECKS.md §1)", () => {
    const f = logGrid(10, 1e6, 20);
    const [t] = compareTraces(f, [rcTrace("h", f, "lp")], f, [rcTrace("h", f, "hp")]);
    expect(t!.interpolated).toBe(false);
    // HP/LP = jf/fc exactly, so the difference is a straight line in dB and a constant 90°.
    f.forEach((fk, k) => {
      expect(t!.diffDb[k]).toBeCloseTo(20 * Math.log10(fk / FC), 9);
      expect(t!.diffDeg[k]).toBeCloseTo(90, 9);
    });
    // At 10·fc the LP reads −20.043214 dB / −84.289407° and the HP −0.043214 dB / +5.710593° (CHECKS.md §1).
    const g = [10 * FC];
    const [u] = compareTraces(g, [rcTrace("h", g, "lp")], g, [rcTrace("h", g, "hp")]);
    expect(u!.aDb[0]).toBeCloseTo(-20.043214, 6);
    expect(u!.aDeg[0]).toBeCloseTo(-84.289407, 6);
    expect(u!.bDb[0]).toBeCloseTo(-0.043214, 6);
    expect(u!.bDeg[0]).toBeCloseTo(5.710593, 6);
    expect(u!.diffDb[0]).toBeCloseTo(20, 9);
  });

  it("interpolates the first run onto the second run's grid when the grids differ", () => {
    const fa = logGrid(10, 1e6, 100);
    const fb = [FC, 10 * FC, 5e5, 2e6];
    const [t] = compareTraces(fa, [rcTrace("h", fa, "lp")], fb, [rcTrace("h", fb, "lp", FC / 2)]);
    expect(t!.interpolated).toBe(true);
    expect(t!.frequencies).toEqual(fb);
    // a at fc: −3.0103 dB, −45° (CHECKS.md §1); interpolation error stays well under 1e-3 dB at 100/decade.
    expect(t!.aDb[0]).toBeCloseTo(-3.0103, 3);
    expect(t!.aDeg[0]).toBeCloseTo(-45, 2);
    expect(t!.aDb[1]).toBeCloseTo(-20.043214, 3);
    expect(t!.aDeg[1]).toBeCloseTo(-84.289407, 2);
    // b has its corner at fc/2, so at fc: 1/(1+2j) → −6.9897 dB, −63.4349° (closed form, common practice).
    expect(t!.diffDb[0]).toBeCloseTo(-6.9897 + 3.0103, 3);
    expect(t!.diffDeg[0]).toBeCloseTo(-63.4349 + 45, 2);
    // 2 MHz lies outside the first sweep: no value rather than an extrapolation.
    expect(t!.aDb[3]).toBeNull();
    expect(t!.diffDb[3]).toBeNull();
    expect(t!.diffDeg[3]).toBeNull();
  });

  it("wraps the phase difference to (−180, 180]", () => {
    const f = [100, 200];
    const a: TraceResult = {
      name: "x",
      kind: "loop",
      re: [],
      im: [],
      magnitudeDb: [0, 0],
      phaseDeg: [170, -175],
    };
    const b: TraceResult = {
      name: "x",
      kind: "loop",
      re: [],
      im: [],
      magnitudeDb: [1, 2],
      phaseDeg: [-170, 175],
    };
    const [t] = compareTraces(f, [a], f, [b]);
    expect(t!.diffDeg[0]).toBeCloseTo(20, 12);
    expect(t!.diffDeg[1]).toBeCloseTo(-10, 12);
    expect(t!.diffDb).toEqual([1, 2]);
  });

  it("skips traces that only one run has", () => {
    const f = [100];
    expect(compareTraces(f, [rcTrace("only_a", f, "lp")], f, [rcTrace("only_b", f, "lp")])).toEqual([]);
  });
});

describe("compareRuns", () => {
  const A = [
    "title Bridge check",
    "let R = 10k",
    "R1: resistor in mid R",
    "C1: capacitor mid out 10n tol=5%",
    "R2: resistor out gnd 10k",
    "V1: vsource in gnd 1",
    "show h = volts(out) / volts(in)",
    "",
  ].join("\n");
  const B = [
    "title Bridge check",
    "let R = 4k7",
    "R1: resistor in mid R",
    "C1: capacitor mid out 10n tol=1%",
    "V1: vsource in gnd 1",
    "C2: capacitor out gnd 47n",
    "show h = volts(out) / volts(in)",
    "",
  ].join("\n");

  it("lists parts added, removed and changed with old and new values", () => {
    const f = [FC];
    const cmp = compareRuns(
      {
        netlist: A,
        result: success(f, [rcTrace("h", f, "lp")], {
          measures: [{ name: "f0", value: 1000, unit: "Hz", reason: null }],
          checks: [{ name: "f0", expression: "f0 < 1.2kHz", pass: true, reason: null }],
        }),
      },
      {
        netlist: B,
        result: success(f, [rcTrace("h", f, "hp")], {
          measures: [{ name: "f0", value: 1250, unit: "Hz", reason: null }],
          checks: [{ name: "f0", expression: "f0 < 1.2kHz", pass: false, reason: "f0 is 1.25 kHz" }],
        }),
      },
    );
    expect(cmp.partErrors).toEqual({ a: [], b: [] });
    const byName = Object.fromEntries(cmp.parts.map((p) => [p.name, p]));
    expect(byName.R1!.change).toBe("changed");
    expect(byName.R1!.fields).toEqual(["value"]);
    expect(byName.R1!.before!.value).toBe(10000);
    expect(byName.R1!.after!.value).toBeCloseTo(4700, 9);
    expect(byName.C1!.fields).toEqual(["options"]);
    expect(byName.C1!.before!.options).toEqual(["tol=5%"]);
    expect(byName.C1!.after!.options).toEqual(["tol=1%"]);
    expect(byName.R2!.change).toBe("removed");
    expect(byName.C2!.change).toBe("added");
    expect(byName.C2!.after!.value).toBeCloseTo(47e-9, 20);
    expect(byName.V1).toBeUndefined();
    // Unchanged: title, R1, V1, show. Changed: let (10k → 4k7), C1 (tol), R2 → C2.
    expect(cmp.diffStats).toEqual({ added: 3, removed: 3, same: 4 });
    expect(cmp.measures[0]!.deltaPct).toBeCloseTo(25, 12);
    expect(cmp.flippedChecks.map((c) => c.expression)).toEqual(["f0 < 1.2kHz"]);
    expect(cmp.traces[0]!.diffDeg[0]).toBeCloseTo(90, 9);
  });

  it("reports compile errors instead of parts when a netlist does not compile", () => {
    const cmp = compareRuns({ netlist: A, result: null }, { netlist: "R1: resistor in\n", result: null });
    expect(cmp.parts).toEqual([]);
    expect(cmp.partErrors.a).toEqual([]);
    expect(cmp.partErrors.b.length).toBeGreaterThan(0);
    expect(cmp.partErrors.b[0]!.line).toBe(1);
    expect(cmp.traces).toEqual([]);
    expect(cmp.measures).toEqual([]);
  });
});
