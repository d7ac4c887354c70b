/**
 * Noise (LANGUAGE-NEXT §3) against outside references. k = 1.380649e-23 J/K (exact, SI Brochure
 * 9th ed., 2019). OAFE = Texas Instruments, "Op Amps For Everyone — Design Reference", SLOD006B, 2002.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { toSummary } from "@/solver/cli";
import { resultToCsv } from "@/solver/csv";
import { analyze } from "@/solver/engine";
import { NoiseProbe } from "@/solver/engine/noise";
import type { SparseComplexLU } from "@/solver/engine/sparse-lu";
import { planSystems } from "@/solver/engine/systems";
import { compile } from "@/solver/lang";
import type { SolveSuccess } from "@/solver/types";
import { expectClose } from "./engine-tolerance";

const K = 1.380649e-23;
const EXAMPLES = path.join(__dirname, "../../solver/examples");

function solve(text: string, kelvin?: number): SolveSuccess {
  const c = compile(text);
  if (!c.ok) throw new Error(JSON.stringify(c.errors));
  const circuit = kelvin === undefined ? c.circuit : { ...c.circuit, temperature: kelvin };
  const r = analyze(circuit, c.warnings);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}
const value = (r: SolveSuccess, name: string) => {
  const m = r.measures.find((x) => x.name === name);
  if (m?.value == null) throw new Error(`${name}: ${m?.reason}`);
  return m.value;
};

describe("thermal noise √(4kTR) (CHECKS §10; OAFE §10.3.2 Eq. 10-11)", () => {
  it("10 kΩ at 300 K: 12.871592 nV/√Hz, 1 kΩ: 4.070355 nV/√Hz, flat over the sweep", () => {
    for (const [r, want] of [
      ["10k", 12.871592e-9],
      ["1k", 4.070355e-9],
    ] as const) {
      const res = solve(
        `temperature 300K\nVin: vsource in gnd 1\nR1: resistor in out ${r}\nRl: capacitor out gnd 1p\n` +
          "sweep 1Hz to 10Hz log 5 per decade\nnoise N = volts(out)\nmeasure n1 = noise(N) at 1Hz\n",
      );
      expect(res.noise![0]!.temperature).toBe(300);
      expectClose(value(res, "n1"), want, 1e-6); // CHECKS §10
      expectClose(res.noise![0]!.density[0]!, want, 1e-6);
      expect(res.noise![0]!.contributions.map((c) => c.part)).toEqual(["R1"]);
    }
  });

  it("OAFE's example: 100 kΩ, 298 K, 20 Hz–20 kHz → 5.734262 µV rms (CHECKS §10)", () => {
    const res = solve(
      "Vin: vsource in gnd 1\nR1: resistor in out 100k\nsweep 10Hz to 100kHz log 10 per decade\n" +
        "noise N = volts(out)\nmeasure band = noise(N) from 20Hz to 20kHz\n",
      298,
    );
    expectClose(value(res, "band"), 5.734262e-6, 1e-6); // CHECKS §10
  });
});

describe("RC low-pass output noise", () => {
  const rc = (r: string, c: string, measures: string) =>
    `Vin: vsource in gnd 1\nR1: resistor in out ${r}\nC1: capacitor out gnd ${c}\n` +
    `sweep 1Hz to 100MHz log 20 per decade\nnoise N = volts(out)\n${measures}`;

  it("integrates to √(kT/C) whatever R is: 1 nF at 300.15 K → 2.0357 µV (B. Razavi, Design of Analog CMOS Integrated Circuits, ch. 7 — from memory)", () => {
    for (const r of ["100", "1k", "100k"]) {
      const res = solve(rc(r, "1n", "measure total = noise(N) from 1mHz to 1e15\n"));
      // The band's tails hold (2/π)·fc/1 PHz and f1/fc of the power at most: below 1e-6 here.
      expectClose(value(res, "total"), Math.sqrt((K * 300.15) / 1e-9), 2e-6);
      expectClose(value(res, "total"), 2.0357e-6, 5e-5); // the figure as quoted, 5 digits
    }
  });

  it("over a finite band: √(4kTR·fc·(atan(f2/fc) − atan(f1/fc))) (integral of a single-pole response, common practice)", () => {
    const res = solve(rc("10k", "10n", "measure band = noise(N) from 20Hz to 20kHz\n"));
    const fc = 1 / (2 * Math.PI * 10e3 * 10e-9);
    const want = Math.sqrt(4 * K * 300.15 * 10e3 * fc * (Math.atan(20e3 / fc) - Math.atan(20 / fc)));
    expectClose(value(res, "band"), want, 1e-8);
  });
});

describe("non-inverting stage, the standard op-amp noise model (OAFE ch. 10, §10.5)", () => {
  // Rs from the source to in+, Rf from out to in−, Rg from in− to gnd; G = 1 + Rf/Rg. Output density²
  //   en²·G² + (in·Rs)²·G² + (in·Rf)² + 4kT·Rs·G² + 4kT·Rf + 4kT·Rg·(Rf/Rg)²,
  // with en², in² times (1 + fc/f) (OAFE §10.5; the 1/f form density·√(1 + fc/f) as LANGUAGE-NEXT §3).
  const en = 8e-9;
  const inn = 2e-12;
  const fc = 100;
  const [rs, rf, rg] = [5e3, 99e3, 1e3];
  const g = 1 + rf / rg;
  const kt4 = 4 * K * 300.15;
  const opamp2 = (en * g) ** 2 + (inn * rs * g) ** 2 + (inn * rf) ** 2; // times (1 + fc/f)
  const resist2 = kt4 * (rs * g * g + rf + rg * (rf / rg) ** 2);
  const netlist = `Vin: vsource src gnd 1
Rs: resistor src pos 5k
U1: opamp pos neg out en=8n in=2p fc=100
Rf: resistor out neg 99k
Rg: resistor neg gnd 1k
sweep 1Hz to 100kHz log 10 per decade
noise N = volts(out) input Vin
measure n1k = noise(N) at 1kHz
measure n10 = noise(N) at 10Hz
measure i1k = input-noise(N) at 1kHz
measure band = noise(N) from 10Hz to 10kHz
measure iband = input-noise(N) from 10Hz to 10kHz
`;
  it("densities at 10 Hz and 1 kHz, and referred to the input (÷ G)", () => {
    const res = solve(netlist);
    const at = (f: number) => Math.sqrt(opamp2 * (1 + fc / f) + resist2);
    expectClose(value(res, "n1k"), at(1e3), 1e-10);
    expectClose(value(res, "n10"), at(10), 1e-10);
    expectClose(value(res, "i1k"), at(1e3) / g, 1e-10);
    const n = res.noise![0]!;
    expect(n.contributions.map((c) => `${c.part}:${c.source}`)).toEqual([
      "Rs:thermal",
      "U1:en",
      "U1:in",
      "Rf:thermal",
      "Rg:thermal",
    ]);
    const k = res.frequencies.findIndex((f) => Math.abs(f / 1000 - 1) < 1e-9);
    const f = res.frequencies[k]!;
    expectClose(n.contributions[1]!.density[k]!, en * g * Math.sqrt(1 + fc / f), 1e-10);
    expectClose(n.inputDensity![k]!, at(f) / g, 1e-10);
  });

  it("integrated over 10 Hz–10 kHz with the 1/f corners in closed form: ∫(1 + fc/f) df = (f2 − f1) + fc·ln(f2/f1)", () => {
    const res = solve(netlist);
    const [f1, f2] = [10, 10e3];
    const want = Math.sqrt(opamp2 * (f2 - f1 + fc * Math.log(f2 / f1)) + resist2 * (f2 - f1));
    expectClose(value(res, "band"), want, 1e-9);
    expectClose(value(res, "iband"), want / g, 1e-9);
  });
});

describe("noise in the CSV export and the command's summary", () => {
  it("adds N_noise_v_per_rthz and N_input_noise_v_per_rthz columns and a Noise block naming the largest source", () => {
    const res = solve(`Vin: vsource src gnd 1
Rs: resistor src pos 5k
U1: opamp pos neg out en=8n in=2p
Rf: resistor out neg 99k
Rg: resistor neg gnd 1k
sweep 1kHz to 10kHz log 1 per decade
show H = volts(out)
noise N = volts(out) input Vin
`);
    const rows = resultToCsv(res).trim().split("\r\n");
    expect(rows[0]).toBe(
      "frequency_hz,H_re,H_im,H_db,H_deg,H_delay_s,N_noise_v_per_rthz,N_input_noise_v_per_rthz",
    );
    const cells = rows[1]!.split(",").map(Number);
    expectClose(cells[6]!, res.noise![0]!.density[0]!, 1e-15);
    expectClose(cells[7]! * 100, cells[6]!, 1e-12); // G = 100
    const text = toSummary(res);
    expect(text).toContain("Noise N at volts(out)");
    // The op-amp's current noise leads: √((in·Rs·G)² + (in·Rf)²) = √((1 µV)² + (198 nV)²) = 1.01941 µV/√Hz
    // (OAFE §10.5 model, as above), ahead of en·G = 800 nV/√Hz.
    const lines = text.split("\n");
    const first = lines.findIndex((l) => l.startsWith("Noise N"));
    expect(lines[first + 3]).toMatch(/^ {2}U1 in: 1\.0194 µV\/√Hz/);
  });
});

describe("noise statement errors", () => {
  it("a ratio probe, an unknown input and a noise read as a trace are errors with a hint", () => {
    const bad = (s: string) => {
      const c = compile(`Vin: vsource in gnd 1\nR1: resistor in out 1k\nC1: capacitor out gnd 1n\n${s}`);
      expect(c.ok).toBe(false);
      return c.ok ? null : c.errors[0]!;
    };
    expect(bad("noise N = volts(out) / volts(in)\n")?.message).toContain("noise reads one voltage");
    expect(bad("noise N = volts(out) input R1\n")?.message).toContain("not an independent source");
    expect(bad("noise N = volts(out)\nmeasure m = db(N) at 1kHz\n")?.message).toContain("is a noise");
    expect(bad("show H = volts(out)\nmeasure m = noise(H) at 1kHz\n")?.message).toContain(
      "is a trace, not a noise",
    );
  });
});

describe("the adjoint read in the pivot order", () => {
  // Each source reads z at places mapped once per pivot order (noise.ts, `mapTo`). Across a sweep
  // whose order changes at some frequency (the op-amp stage re-pivots once between 10 Hz and
  // 10 MHz), every density must still equal Σ|z_a − z_b|²·white with z from the plain transposed
  // solve in the unknowns' order, bit for bit.
  it("gives the densities of the plain transposed solve at every point, also after a re-pivot", () => {
    const text = `${readFileSync(path.join(EXAMPLES, "lowpass-2nd-order.pwn"), "utf8")}\nnoise N = volts(out) input Vin\n`;
    const c = compile(text);
    if (!c.ok) throw new Error(JSON.stringify(c.errors));
    const planned = planSystems(c.circuit, []);
    if (!planned.ok) throw new Error(JSON.stringify(planned.errors));
    const solver = planned.plan.runs[0]!.solver;
    const probe = new NoiseProbe(c.circuit.noise![0]!, solver.sys, 300);
    const n = solver.sys.n;
    const d = { re: new Float64Array(n), im: new Float64Array(n) };
    d.re[solver.sys.nodeIndex.get("out")!] = 1;
    const z = { re: new Float64Array(n + 1), im: new Float64Array(n + 1) };
    const row = solver.sys.branchIndex.get("Vin")!;
    let points = 0;
    for (let k = 0; k <= 600; k++) {
      const f = 10 * 10 ** (k / 100);
      expect(solver.solveAt(f)).toBeNull();
      const got = probe.evaluate(solver, f);
      (solver as unknown as { lu: SparseComplexLU }).lu.solveTransposed(
        d.re,
        d.im,
        z.re.subarray(0, n),
        z.im.subarray(0, n),
      );
      let total = 0;
      probe.sources.forEach((src, s) => {
        let g2 = 0;
        for (const [a, b] of src.terms) {
          const ia = a < 0 ? n : a;
          const ib = b < 0 ? n : b;
          const r = z.re[ia]! - z.re[ib]!;
          const i = z.im[ia]! - z.im[ib]!;
          g2 += r * r + i * i;
        }
        const v = g2 * src.white * (src.fc === 0 ? 1 : 1 + src.fc / f);
        expect(got.parts[s]).toBe(v);
        total += v;
      });
      expect(got.total).toBe(total);
      expect(got.gain2).toBe(z.re[row]! ** 2 + z.im[row]! ** 2);
      points++;
    }
    expect(points).toBe(601);
    expect(solver.repivots).toBeGreaterThan(0);
  });
});
