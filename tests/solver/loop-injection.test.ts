/**
 * Loop gain by double injection (`loop … method=injection`), against published and hand-derived values.
 *
 * Sign convention. Middlebrook (R. D. Middlebrook, "Measurement of loop gain in feedback systems",
 * Int. J. Electronics 38(4), 1975 — CHECKS.md §11; citation confirmed, formula from memory) writes
 *   T = (Tv·Ti − 1)/(Tv + Ti + 2), i.e. 1/(1 + T) = 1/(1 + Tv) + 1/(1 + Ti),
 * with T, Tv, Ti positive at DC for negative feedback. Our loop trace is the returned signal over the
 * injected one (NETLIST.md "Loop gain"), which is the same quantity with the opposite sign:
 *   T_ours = −T, Tv_ours = v(NODE)/v(NODE′) = −Tv, Ti_ours = i(driver → node)/i(node → listed parts) = −Ti,
 * so 1/(1 − T_ours) = 1/(1 − Tv_ours) + 1/(1 − Ti_ours). A negative-feedback loop therefore reads
 * T_ours ≈ −|T| (∠ ≈ 180°) at low frequency, as the cut loops always have.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { injectionRatios, readTrace } from "@/solver/engine/probes";
import { planSystems } from "@/solver/engine/systems";
import { compile } from "@/solver/lang";
import { solveNetlistParallel, stopSampleWorkers, workersUnavailableReason } from "@/solver/parallel";
import type { SolveSuccess, TraceResult } from "@/solver/types";
import { expectClose } from "./engine-tolerance";
import { errorsOf } from "./lang-helpers";

const EXAMPLES = path.resolve(__dirname, "../../solver/examples");
const example = (name: string) => readFileSync(path.join(EXAMPLES, name), "utf8");

afterAll(async () => {
  await stopSampleWorkers();
});

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) expect.fail(JSON.stringify(r.errors));
  return r;
}
const trace = (r: SolveSuccess, name: string): TraceResult => {
  const t = r.traces.find((x) => x.name === name);
  if (!t) expect.fail(`no trace ${name}`);
  return t;
};
const measure = (r: SolveSuccess, name: string): number => {
  const m = r.measures.find((x) => x.name === name);
  if (m?.value == null) expect.fail(`measure ${name} has no value: ${m?.reason}`);
  return m.value;
};

/** Complex numbers for the hand formulas. */
type C = { re: number; im: number };
const c = (re: number, im = 0): C => ({ re, im });
const add = (a: C, b: C): C => c(a.re + b.re, a.im + b.im);
const mul = (a: C, b: C): C => c(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return c((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d);
};
const abs = (a: C) => Math.hypot(a.re, a.im);
/** |a − b| ≤ rel·|b|: complex relative closeness. */
function expectComplexClose(a: C, b: C, rel: number, what: string) {
  const err = abs(c(a.re - b.re, a.im - b.im)) / abs(b);
  expect(
    err,
    `${what}: ${a.re}+j${a.im} vs ${b.re}+j${b.im} (relative ${err.toExponential(2)})`,
  ).toBeLessThanOrEqual(rel);
}

// ---------------------------------------------------------------------------------------------
// CHECKS.md §11: −A·vx behind Z1 = 1 kΩ into Z2 = 10 kΩ, A = 1000. The amplifier is a vcvs of gain
// −1000 whose input senses the far side of Z1 (node n, across Z2); the loop is opened at n, the
// listed parts being Z2 (R2) and the amplifier's sensing input (E1's control terminal on n).
// True T = A·Z2/(Z1 + Z2) = 909.090909 (Middlebrook convention), so T_ours = −909.090909;
// Tv = 1000.1, Ti = 10010 (Middlebrook's signs; ours are −1000.1 and −10010).
// ---------------------------------------------------------------------------------------------
const MIDDLEBROOK = `title Double-injection check (CHECKS.md 11)
E1: vcvs     out gnd n gnd -1000
R1: resistor out n   1k
R2: resistor n   gnd 10k
sweep at 1kHz
loop Tc cut n before R2,E1
loop T  cut n before R2,E1 method=injection
`;

describe("CHECKS.md §11 example (Middlebrook 1975; formula from memory)", () => {
  it("T_ours = −909.090909…, where the plain cut reads the unloaded −1000 and warns", () => {
    const r = solve(MIDDLEBROOK);
    const t = trace(r, "T");
    expectClose(t.re[0], -1000 / 1.1, 1e-12); // −A·Z2/(Z1+Z2) = −909.0909090909…
    expect(Math.abs(t.im[0]!)).toBeLessThan(1e-9); // a resistive network: real
    expectClose(trace(r, "Tc").re[0], -1000, 1e-12); // the cut drops Z2's load on Z1
    expect(r.warnings.filter((w) => w.message.includes("not driven by an ideal voltage output"))).toEqual([
      expect.objectContaining({ line: 6, message: expect.stringContaining("add method=injection") }),
    ]);
  });

  it("Tv = 1000.1 and Ti = 10010 (Middlebrook's signs)", () => {
    const compiled = compile(MIDDLEBROOK);
    if (!compiled.ok) expect.fail(JSON.stringify(compiled.errors));
    const planned = planSystems(compiled.circuit, []);
    if (!planned.ok) expect.fail(JSON.stringify(planned.errors));
    const run = planned.plan.runs.find((x) => x.traces.some((tr) => tr.name === "T"))!;
    const reading = run.traces[0]!.reading;
    if (reading.op !== "double-injection") expect.fail("T should be read by double injection");
    expect(run.solver.solveAt(1000)).toBeNull();
    const { tv, ti } = injectionRatios(reading, run.solver);
    expectClose(-tv.re, 1000.1, 1e-12); // A + Z1/Z2
    expectClose(-ti.re, 10010, 1e-12); // (1 + A)·Z2/Z1
    // Middlebrook's combination of the two gives the true T (from memory, CHECKS.md §11).
    const T = (1000.1 * 10010 - 1) / (1000.1 + 10010 + 2);
    expectClose(T, 909.0909090909, 1e-12);
    expectClose(readTrace(reading, run.solver).re, -T, 1e-12);
  });
});

// ---------------------------------------------------------------------------------------------
// Ideal driver: the bridge oscillator example, whose loop is opened at an ideal op-amp's output.
// There the cut is exact, so both methods must give the same trace (the double-injection formula
// reduces to v(NODE)/v(NODE′) when the driver's output current takes all the injected current).
// ---------------------------------------------------------------------------------------------
describe("an ideal voltage output drives the node: injection equals the cut", () => {
  const wien = example("wien-bridge.pwn");
  const injected = wien.replace("loop  T cut out before Rs", "loop  T cut out before Rs method=injection");

  it("over the whole sweep to 1e-9, with the same measures and no warning", () => {
    expect(injected).not.toBe(wien);
    const both = solve(`${wien}loop Tj cut out before Rs method=injection\n`);
    const a = trace(both, "T");
    const b = trace(both, "Tj");
    expect(b.re).toHaveLength(461); // 100 Hz…20 kHz at 200 per decade
    for (let k = 0; k < a.re.length; k++) {
      expectComplexClose(c(b.re[k]!, b.im[k]!), c(a.re[k]!, a.im[k]!), 1e-9, `${both.frequencies[k]} Hz`);
    }
    expect(compile(injected).warnings).toEqual([]);
  });

  it("measures, poles and Monte Carlo statistics agree with the cut's; shows use the series source", () => {
    const cut = solve(wien);
    const inj = solve(injected);
    // Equal-part Wien network: zero phase at 1/(2πRC), β = 1/3, |T| = K/3 there (CHECKS.md §2).
    expectClose(measure(inj, "f0"), 1591.5494309, 1e-9);
    expectClose(measure(inj, "margin"), 3.05 / 3, 1e-9);
    expectClose(measure(inj, "beta"), 1 / 3, 1e-9); // the oscillator's show, read with the 1 V series source
    // Its show is a ratio of responses (volts(pos)/volts(out)): independent of the excitation, so no
    // warning; an absolute show is read relative to the 1 V series source, and that is said.
    expect(inj.warnings).toEqual([]);
    const absolute = solve(`${injected}show level = volts(pos)\n`);
    expect(absolute.warnings).toEqual([
      {
        line: 18,
        message: expect.stringMatching(
          /^the circuit has no independent source: .* 1 V series test source at out/,
        ),
      },
    ]);
    expect(inj.poles).toEqual(cut.poles);
    const mcCut = cut.monteCarlo!;
    const mcInj = inj.monteCarlo!;
    expect(mcInj.yield).toBe(mcCut.yield);
    for (const [i, m] of mcInj.measures.entries()) {
      const ref = mcCut.measures[i]!;
      expect(m.name).toBe(ref.name);
      expectClose(m.mean, ref.mean!, 1e-9);
      expectClose(m.std, ref.std!, 1e-6); // a difference of near-equal samples
      expectClose(m.percentiles.p50, ref.percentiles.p50!, 1e-9);
    }
  });

  it("at the exact oscillation limit (K = 3) the closed loop is singular at f0: injection says so, the cut does not", () => {
    const limit = (text: string) =>
      text
        .replace("Rf: resistor  neg  out  20.5k tol=1%", "Rf: resistor  neg  out  20k")
        .replace(/^monte-carlo.*$/m, "");
    // K·β = 1 at f0 = 1/(2πRC) (CHECKS.md §2): the cut reads it, the injection's equations are singular there.
    expectClose(measure(solve(limit(wien)), "f0"), 1591.5494309, 1e-9);
    const f0 = solve(limit(injected)).measures.find((m) => m.name === "f0")!;
    expect(f0.value).toBeNull();
    expect(f0.reason).toMatch(
      /^at 1\.59155 kHz the circuit equations are singular.*method=cut has no such point$/,
    );
  });

  it("worker threads give the same JSON as the in-thread path", async () => {
    const r = await solveNetlistParallel(injected, { threads: 2 });
    expect(workersUnavailableReason()).toBeNull();
    expect(JSON.stringify({ ...r, stats: null })).toBe(JSON.stringify({ ...solve(injected), stats: null }));
  }, 60_000);
});

// ---------------------------------------------------------------------------------------------
// A real op-amp (finite gain, gbw, rout) driving a capacitive cable: solver/examples/line-driver-rout.pwn.
//
// Hand derivation. With Vin zeroed (in+ at 0 V), the op-amp is a Thevenin source e = A(s)·(0 − v(neg))
// behind rout, A(s) = A0/(1 + s·A0/(2π·GBW)) (NETLIST.md "Parts"). The output node amp carries
// ZL = Rl ‖ 1/(s·Cl) ‖ (Rf + Rg), and v(neg) = β·v(amp) with β = Rg/(Rf + Rg) (no input current).
// So e = G·vx with G = −A·β, where vx is the voltage the listed parts (Cl, Rl, Rf) see.
// For any driver e = G·vx behind Zs into ZL, in our convention
//   Tv = vy/vx = G − Zs/ZL                   (series 1 V: i = vx/ZL, vy = e − Zs·i),
//   Ti = i_driver/i_load = (G − 1)·ZL/Zs     (shunt 1 A at node voltage v: (e − v)/Zs over v/ZL),
// and (Tv·Ti − 1)/(Tv + Ti − 2) = G·ZL/(Zs + ZL) exactly (with a = Zs/ZL the numerator is
// G(G − 1 − a)/a and the denominator (1 + a)(G − 1 − a)/a). Hence
//   T = −A(s)·β·ZL/(rout + ZL),
// the return ratio of the op-amp's source; the cut instead gives −A(s)·β (rout unloaded).
// Closed loop, independently from the main circuit's solve: v(amp)/v(in) = A·k/(1 + A·k·β) with
// k = ZL/(rout + ZL), i.e. (1/β)·T/(T − 1).
// ---------------------------------------------------------------------------------------------
describe("a real op-amp whose output resistance sees the load: injection against a hand derivation", () => {
  const A0 = 100e3;
  const GBW = 1e6;
  const ROUT = 50;
  const CL = 47e-9;
  const RL = 10e3;
  const RF = 9e3;
  const RG = 1e3;
  const beta = RG / (RF + RG);
  const hand = (f: number) => {
    const s = c(0, 2 * Math.PI * f);
    const A = div(c(A0), add(c(1), mul(s, c(A0 / (2 * Math.PI * GBW)))));
    const yl = add(add(c(1 / RL), mul(s, c(CL))), c(1 / (RF + RG)));
    const zl = div(c(1), yl);
    const k = div(zl, add(c(ROUT), zl));
    return { T: mul(c(-beta), mul(A, k)), cut: mul(c(-beta), A) };
  };
  const text = example("line-driver-rout.pwn");
  const r = solve(text);

  it("the example has no warning and its loop is measured by injection", () => {
    expect(text).toContain("method=injection");
    expect(compile(text).warnings).toEqual([]);
    expect(r.warnings).toEqual([]);
  });

  it("T matches −A·β·ZL/(rout + ZL) over the sweep (1e-9); the cut matches −A·β and differs", () => {
    const t = trace(r, "T");
    const cutRun = solve(text.replace(" method=injection", ""));
    const tc = trace(cutRun, "T");
    let largest = 0;
    for (const [k, f] of r.frequencies.entries()) {
      const h = hand(f);
      expectComplexClose(c(t.re[k]!, t.im[k]!), h.T, 1e-9, `injection at ${f} Hz`);
      expectComplexClose(c(tc.re[k]!, tc.im[k]!), h.cut, 1e-9, `cut at ${f} Hz`);
      largest = Math.max(largest, abs(c(t.re[k]! - tc.re[k]!, t.im[k]! - tc.im[k]!)) / abs(h.T));
    }
    expect(largest).toBeGreaterThan(0.5); // the rout·Cl pole is inside the sweep
    expect(cutRun.warnings.map((w) => w.line)).toEqual([16]); // one warning, said once
  });

  it("the closed-loop gain of the main circuit is (1/β)·T/(T − 1) with the injected T", () => {
    const a = trace(r, "A");
    const t = trace(r, "T");
    for (let k = 0; k < a.re.length; k++) {
      const T = c(t.re[k]!, t.im[k]!);
      const expected = mul(c(1 / beta), div(T, add(T, c(-1))));
      expectComplexClose(c(a.re[k]!, a.im[k]!), expected, 1e-9, `${r.frequencies[k]} Hz`);
    }
  });

  it("unity crossing and phase margin match the hand formula's (bisection on it here)", () => {
    // |T_hand| falls through 1 once between 10 kHz and 1 MHz: bisect on ln f.
    let lo = Math.log(10e3);
    let hi = Math.log(1e6);
    for (let i = 0; i < 200; i++) {
      const mid = (lo + hi) / 2;
      if (abs(hand(Math.exp(mid)).T) > 1) lo = mid;
      else hi = mid;
    }
    const fu = Math.exp((lo + hi) / 2);
    const tu = hand(fu).T;
    const pm = Math.abs((Math.atan2(tu.im, tu.re) * 180) / Math.PI); // angle between ∠T and 0°
    expectClose(measure(r, "crossover"), fu, 1e-9);
    expectClose(measure(r, "pm"), pm, 1e-7);
    expect(pm).toBeGreaterThan(40);
    expect(pm).toBeLessThan(50); // the cut would claim about 90°
  });

  it("dT/ds of an injection trace (used to refine peaks and dips) matches a central difference", () => {
    const compiled = compile(text);
    if (!compiled.ok) expect.fail(JSON.stringify(compiled.errors));
    const planned = planSystems(compiled.circuit, []);
    if (!planned.ok) expect.fail(JSON.stringify(planned.errors));
    const run = planned.plan.runs.find((x) => x.traces.some((tr) => tr.name === "T"))!;
    const reading = run.traces[0]!.reading;
    const at = (f: number, deriv: boolean) => {
      expect(run.solver.solveAt(f)).toBeNull();
      if (deriv) run.solver.derivative();
      return readTrace(reading, run.solver);
    };
    for (const f of [3e3, 60e3, 400e3]) {
      const d = at(f, true);
      const h = 1e-5;
      const up = at(f * (1 + h), false);
      const down = at(f * (1 - h), false);
      // dT/ds ≈ ΔT/(j·Δω)
      const fd = div(c(up.re - down.re, up.im - down.im), c(0, 2 * Math.PI * 2 * f * h));
      expectComplexClose(c(d.dRe, d.dIm), fd, 1e-6, `dT/ds at ${f} Hz`);
    }
  });

  it("a cut before the op-amp's input unloads nothing: exact without a warning, equal to injection", () => {
    // The inverting input draws no current, so opening the loop there leaves every load in place:
    // T at `neg` before U1 is the same return ratio −A·β·ZL/(rout + ZL) (common practice: the loop
    // gain of a single loop is the same wherever it is broken, if the break does not change loading).
    const atInput = text.replace(
      "loop  T cut amp before Cl,Rl,Rf method=injection",
      "loop  T cut neg before U1",
    );
    expect(atInput).not.toBe(text);
    const cutRun = solve(atInput);
    expect(cutRun.warnings).toEqual([]);
    const tc = trace(cutRun, "T");
    for (const [k, f] of cutRun.frequencies.entries()) {
      expectComplexClose(c(tc.re[k]!, tc.im[k]!), hand(f).T, 1e-9, `cut at the input, ${f} Hz`);
    }
    expectClose(measure(cutRun, "pm"), measure(r, "pm"), 1e-9);
  });

  it("vary and sensitivity re-solve the injected loop", () => {
    const varied = solve(`${text}vary Cl over 10n, 47n\n`);
    const v47 = varied.variants!.find((v) => v.value === 47e-9)!;
    expectClose(v47.measures.find((m) => m.name === "pm")!.value, measure(r, "pm"), 1e-9);
    const v10 = varied.variants!.find((v) => v.value === 10e-9)!;
    expect(v10.measures.find((m) => m.name === "pm")!.value!).toBeGreaterThan(measure(r, "pm")); // less load
    const withSens = solve(`${text}sensitivity pm\n`);
    const sCl = withSens.sensitivity!.find((s) => s.part === "Cl")!.value!;
    // Central difference by hand: the same netlist solved with Cl·(1 ± 1e-4).
    const pmWith = (cl: number) =>
      measure(solve(text.replace("Cl:  capacitor amp  gnd 47n", `Cl:  capacitor amp  gnd ${cl}`)), "pm");
    const expected = (pmWith(47e-9 * (1 + 1e-4)) - pmWith(47e-9 * (1 - 1e-4))) / (2e-4 * measure(r, "pm"));
    expectClose(sCl, expected, 1e-6);
    expect(sCl).toBeLessThan(0); // more capacitance, less margin
  });
});

describe("syntax", () => {
  const BASE = "V1: vsource in gnd 1\nU1: opamp in n o rout=50\nR1: resistor o n 1k\nR2: resistor n gnd 1k\n";

  it("method=cut is the default and may be written; method=injection is carried to the circuit", () => {
    const written = compile(`${BASE}loop T cut o before R1 method=cut\n`);
    const plain = compile(`${BASE}loop T cut o before R1\n`);
    const inj = compile(`${BASE}loop T cut o before R1 method=injection\n`);
    if (!written.ok || !plain.ok || !inj.ok) expect.fail("expected all three to compile");
    expect(written.circuit.loops[0]!.method).toBe("cut");
    expect(plain.circuit.loops[0]!.method).toBeUndefined();
    expect(inj.circuit.loops[0]!.method).toBe("injection");
    expect(plain.warnings).toEqual(written.warnings);
    expect(plain.warnings).toHaveLength(1);
    expect(inj.warnings).toEqual([]);
  });

  it("an unknown method is an error at its value with a did-you-mean hint", () => {
    expect(errorsOf(`${BASE}loop T cut o before R1 method=wrong\n`)).toEqual([
      {
        line: 5,
        column: 31,
        endColumn: 36,
        message: "unknown loop method `wrong`",
        hint: "method=cut or method=injection",
      },
    ]);
    expect(errorsOf(`${BASE}loop T cut o before R1 method=injektion\n`)).toEqual([
      expect.objectContaining({ line: 5, column: 31, hint: "did you mean `injection`?" }),
    ]);
  });

  it("an unknown option, and a part listed without its comma", () => {
    expect(errorsOf(`${BASE}loop T cut o before R1 metod=cut\n`)).toEqual([
      expect.objectContaining({
        line: 5,
        column: 24,
        endColumn: 29,
        message: "unknown option `metod`",
        hint: "did you mean `method`?",
      }),
    ]);
    expect(errorsOf(`${BASE}loop T cut o before R1 R2\n`)).toEqual([
      expect.objectContaining({
        line: 5,
        column: 24,
        message: "unexpected `R2` at the end of the statement",
      }),
    ]);
  });

  it("injection needs the driver left on the node", () => {
    expect(errorsOf(`${BASE}loop T cut o before R1,U1 method=injection\n`)).toEqual([
      expect.objectContaining({
        line: 5,
        column: 12,
        endColumn: 13,
        message: "every part on `o` is listed, so nothing drives the loop there",
      }),
    ]);
  });
});
