import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver/index";
import { compile } from "@/solver/lang";
import type { SolveSuccess } from "@/solver/types";

const DIR = path.resolve(__dirname, "../../solver/examples");
const read = (name: string) => readFileSync(path.join(DIR, name), "utf8");

function solved(name: string): SolveSuccess {
  const r = solveNetlist(read(name));
  if (!r.ok) expect.fail(JSON.stringify(r.errors));
  return r;
}
const measure = (r: SolveSuccess, name: string) => {
  const m = r.measures.find((x) => x.name === name);
  if (m?.value == null) expect.fail(`measure ${name} has no value: ${m?.reason}`);
  return m.value;
};

describe("example netlists", () => {
  it("there are at least seven and each compiles without errors or warnings", () => {
    const files = readdirSync(DIR).filter((f) => f.endsWith(".pwn"));
    expect(files.length).toBeGreaterThanOrEqual(7);
    for (const f of files) {
      const r = compile(read(f));
      expect(r.ok, f).toBe(true);
      expect(r.warnings, f).toEqual([]);
    }
  });

  it("Wien bridge: f0, β = 1/3 and the poles for K = 3.05 (CHECKS.md §2, OAFE §15.7.1)", () => {
    const r = solved("wien-bridge.pwn");
    expect(measure(r, "f0")).toBeCloseTo(1591.5494309, 4);
    expect(measure(r, "beta")).toBeCloseTo(1 / 3, 9);
    expect(measure(r, "margin")).toBeCloseTo(3.05 / 3, 9); // K·β at f0
    const upper = r.poles!.find((p) => p.im > 0)!;
    expect(upper.growthPerCycle).toBeCloseTo(1.17014625, 7);
    expect(r.checks.every((c) => c.pass)).toBe(true);
  });

  it("phase-shift oscillator: real network gain at 649.74733436 Hz (CHECKS.md §7)", () => {
    const r = solved("phase-shift.pwn");
    expect(measure(r, "fosc")).toBeCloseTo(649.74733436, 5);
    expect(measure(r, "loopg")).toBeCloseTo(30 / 29, 9); // inverting gain 30 × network 1/29
  });

  it("second-order unity-gain low-pass: |H(f0)| = Q = 0.618187 and f0 = 49 915.524 Hz (CHECKS.md §4, OAFE Ex. 16-3)", () => {
    const r = solved("lowpass-2nd-order.pwn");
    expect(measure(r, "at_f0")).toBeCloseTo(0.618187, 5);
    expect(r.poles![0]!.frequencyHz).toBeCloseTo(49_915.524, 2);
    expect(r.poles![0]!.q).toBeCloseTo(0.618187, 5);
  });

  it("twin-T notch: null at 1591.5494 Hz, lower −3 dB edge 375.713855 Hz (CHECKS.md §6, OAFE §16.6.1)", () => {
    const r = solved("twin-t-notch.pwn");
    expect(measure(r, "null") / 1591.5494309).toBeCloseTo(1, 5);
    expect(measure(r, "lower")).toBeCloseTo(375.713855, 4);
  });

  it("series RLC band-pass: f0, BW and Q (CHECKS.md §8)", () => {
    const r = solved("rlc-bandpass.pwn");
    expect(measure(r, "centre")).toBeCloseTo(5032.92121, 3);
    expect(measure(r, "width")).toBeCloseTo(1591.549431, 3);
    expect(measure(r, "quality")).toBeCloseTo(3.162278, 5);
    // f0 = 1/(2π√(LC)): sensitivity −1/2 to L and to C, 0 to R (follows from the formula).
    expect(r.sensitivity!.map((s) => [s.part, s.value])).toEqual([
      ["L1", expect.closeTo(-0.5, 5)],
      ["C1", expect.closeTo(-0.5, 5)],
      ["R1", expect.closeTo(0, 5)],
    ]);
  });

  it("cable driver: one variant per load, and the 22 nF variant repeats the main run", () => {
    const r = solved("cable-driver-gbw.pwn");
    expect(r.variants!.map((v) => v.value)).toEqual([4.7e-9, 1e-8, 2.2e-8, 4.7e-8]);
    const same = r.variants![2]!.measures.find((m) => m.name === "pm")!.value!;
    expect(same).toBeCloseTo(measure(r, "pm"), 9);
    const pms = r.variants!.map((v) => v.measures.find((m) => m.name === "pm")!.value!);
    for (let i = 1; i < pms.length; i++) expect(pms[i]!).toBeLessThan(pms[i - 1]!); // more load, less margin
  });

  it("line driver with rout: the injected loop keeps the rout·Cl pole (hand formula: tests/solver/loop-injection.test.ts)", () => {
    const r = solved("line-driver-rout.pwn");
    // A cut at the op-amp pin would see only A(s)·β: a single pole, about 90° of margin.
    expect(measure(r, "pm")).toBeLessThan(60);
    expect(r.checks.every((c) => c.pass)).toBe(true);
  });

  it("buffered RC blocks: corner 1591.549 Hz (CHECKS.md §1) and −6.0206 dB for two buffered sections (CHECKS.md §2)", () => {
    const r = solved("buffered-rc-blocks.pwn");
    expect(measure(r, "corner")).toBeCloseTo(1591.5494, 1);
    expect(measure(r, "both")).toBeCloseTo(-6.0206, 2);
  });

  it("the complete example of NETLIST.md compiles and solves: f0 = 1/(2π·16k·10n) = 994.718 Hz, |T(f0)| = K/3", () => {
    const text = `title Test-tone generator, 1 kHz

let R = 16k
let C = 10n                          # f0 = 1/(2*pi*R*C) = 994.7 Hz

Rs: resistor  amp_out mid   R
Cs: capacitor mid     pos   C
Rp: resistor  pos     gnd   R   tol=1%
Cp: capacitor pos     gnd   C   tol=5%
U1: opamp     pos     neg   amp_out          # pins: +in, -in, out (ideal when no options)
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
    const c = compile(text);
    expect(c.ok && c.warnings).toEqual([]);
    const r = solveNetlist(text);
    if (!r.ok) expect.fail(JSON.stringify(r.errors));
    // Equal-part Wien network: zero phase at 1/(2πRC), β = 1/3 there (CHECKS.md §2, OAFE §15.7.1).
    expect(measure(r, "f0")).toBeCloseTo(1 / (2 * Math.PI * 16e3 * 10e-9), 4);
    expect(measure(r, "gain")).toBeCloseTo((1 + 24 / 11) / 3, 9);
    expect(r.checks.map((x) => x.pass)).toEqual([true, true]);
  });
});
