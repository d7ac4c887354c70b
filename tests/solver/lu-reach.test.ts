// Solves that skip what cannot change the wanted numbers. dx/ds only where the traces read it:
// the backward pass of the derivative's solve runs over the steps the read unknowns depend on (U's
// reach), which must give those unknowns the same numbers, bit for bit, as the whole pass. The
// transposed solve of a noise adjoint skips the steps its sparse right-hand side leaves at zero.
// Common practice for such restrictions: compare against the straightforward form on seeded
// random inputs and on real circuits.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { AcSolver } from "@/solver/engine/ac";
import { derivativesRead, readTrace } from "@/solver/engine/probes";
import { SparseComplexLU } from "@/solver/engine/sparse-lu";
import { backwardReach } from "@/solver/engine/sparse-lu-solve";
import { sparseFromDense } from "@/solver/engine/sparse-matrix";
import { planSystems } from "@/solver/engine/systems";
import { mulberry32 } from "./engine-circuits";
import { circuitOf } from "./lang-helpers";

/** Two chains of n/2 unknowns (a ladder each) with a few random couplings inside each chain. */
function twoChains(n: number, seed: number) {
  const rnd = mulberry32(seed);
  const re = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const im = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const half = n / 2;
  for (let i = 0; i < n; i++) {
    re[i]![i] = 2 + rnd();
    im[i]![i] = rnd() - 0.5;
    const chainEnd = i < half ? half : n;
    if (i + 1 < chainEnd) {
      re[i]![i + 1] = -1 + 0.1 * rnd();
      re[i + 1]![i] = -1 + 0.1 * rnd();
    }
    const j = (i < half ? 0 : half) + Math.floor(rnd() * half);
    if (rnd() < 0.15 && j !== i) re[i]![j] = 0.05 * (rnd() - 0.5);
  }
  const a = sparseFromDense(re, im);
  return { a, c: Float64Array.from(a.im) };
}

describe("backwardReach", () => {
  it("holds the wanted unknowns' steps and every step U's rows reach from them, descending; not the other chain", () => {
    for (let seed = 31; seed <= 34; seed++) {
      const { a } = twoChains(40, seed);
      const lu = new SparseComplexLU(a);
      // The symbolic order the solves use (rebuilt from the public permutations and the factors).
      const sym = (lu as unknown as { f: { sym: Parameters<typeof backwardReach>[0] } }).f.sym;
      const want = Int32Array.of(3, 7);
      const steps = backwardReach(sym, want);
      const inSet = new Set(steps);
      for (const i of want) expect(inSet.has(sym.colPos[i]!)).toBe(true);
      for (const k of steps) {
        for (let t = sym.uPtr[k]!; t < sym.uPtr[k + 1]!; t++) expect(inSet.has(sym.uIdx[t]!)).toBe(true);
      }
      expect(Array.from(steps)).toEqual(Array.from(steps).sort((x, y) => y - x));
      // Unknowns 20…39 are a chain of their own: none of their steps is needed.
      for (let j = 20; j < 40; j++) expect(inSet.has(sym.colPos[j]!)).toBe(false);
    }
  });
});

describe("solveProduct at the wanted unknowns", () => {
  it("gives them −A⁻¹·M·v bit for bit as the whole solve (4 seeds × 3 sets)", () => {
    for (let seed = 41; seed <= 44; seed++) {
      const n = 60;
      const { a, c } = twoChains(n, seed);
      const lu = new SparseComplexLU(a);
      const rnd = mulberry32(seed);
      const vRe = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const vIm = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const m = { ptr: a.rowPtr, idx: a.colIdx, val: c };
      const fullRe = new Float64Array(n);
      const fullIm = new Float64Array(n);
      expect(lu.solveProduct(m, vRe, vIm, fullRe, fullIm)).toBe(true);
      for (const want of [Int32Array.of(0), Int32Array.of(5, 29), Int32Array.of(31, 45, 59)]) {
        const sym = (lu as unknown as { f: { sym: Parameters<typeof backwardReach>[0] } }).f.sym;
        // Small enough that the restricted pass is the one taken (above 3/4 of n the whole pass is).
        expect(backwardReach(sym, want).length).toBeLessThanOrEqual(0.75 * n);
        const xRe = new Float64Array(n).fill(Number.NaN);
        const xIm = new Float64Array(n).fill(Number.NaN);
        expect(lu.solveProduct(m, vRe, vIm, xRe, xIm, want)).toBe(true);
        for (const i of want) {
          expect(Object.is(xRe[i], fullRe[i])).toBe(true);
          expect(Object.is(xIm[i], fullIm[i])).toBe(true);
        }
        // Only the reached unknowns were written: the other chain keeps its NaN.
        const other = want[0]! < n / 2 ? n - 1 : 0;
        expect(Number.isNaN(xRe[other]!)).toBe(true);
      }
    }
  });
});

/** An RC ladder of n sections (1 kΩ, 10 nF each) read at its far end. */
function ladder(n: number): string {
  const lines = ["Vin: vsource n0 gnd 1"];
  for (let i = 1; i <= n; i++)
    lines.push(`R${i}: resistor n${i - 1} n${i} 1k`, `C${i}: capacitor n${i} gnd 10n`);
  lines.push("sweep 10Hz to 10kHz log 10 per decade", `show H = volts(n${n}) / volts(n0)`);
  return lines.join("\n");
}

describe("solveTransposed with a sparse right-hand side (a noise adjoint)", () => {
  it("solves Aᵀ·z = d with one entry of d; the steps d leaves at zero are skipped and z is 0 there", () => {
    for (let seed = 51; seed <= 54; seed++) {
      const n = 40;
      const { a } = twoChains(n, seed);
      const lu = new SparseComplexLU(a);
      const dRe = new Float64Array(n);
      const dIm = new Float64Array(n);
      dRe[7] = 1;
      const zRe = new Float64Array(n);
      const zIm = new Float64Array(n);
      lu.solveTransposed(dRe, dIm, zRe, zIm);
      // Residual of Aᵀ·z = d, column by column of A.
      const rRe = Array.from(dRe, (v) => -v);
      const rIm = Array.from(dIm, (v) => -v);
      for (let i = 0; i < n; i++) {
        for (let p = a.rowPtr[i]!; p < a.rowPtr[i + 1]!; p++) {
          const j = a.colIdx[p]!;
          rRe[j] = rRe[j]! + a.re[p]! * zRe[i]! - a.im[p]! * zIm[i]!;
          rIm[j] = rIm[j]! + a.re[p]! * zIm[i]! + a.im[p]! * zRe[i]!;
        }
      }
      for (let j = 0; j < n; j++) expect(Math.abs(rRe[j]!) + Math.abs(rIm[j]!)).toBeLessThan(1e-12);
      // The other chain does not couple to unknown 7: its part of z is exactly zero.
      for (let i = n / 2; i < n; i++) expect(zRe[i] === 0 && zIm[i] === 0).toBe(true);
      expect(zRe.slice(0, n / 2).some((v) => v !== 0)).toBe(true);
    }
  });
});

describe("derivativesRead", () => {
  it("lists the unknowns a reading takes dx/ds from: nodes of a ratio, a resistor's ends, a source's branch", () => {
    const circuit = circuitOf(`Vin: vsource in gnd 1
R1: resistor in mid 1k
C1: capacitor mid gnd 100n
R2: resistor mid out 1k
C2: capacitor out gnd 100n
sweep 10Hz to 10kHz log 5 per decade
show H = volts(out) / volts(in)
show I = amps(R2)
show Z = volts(in) / amps(Vin)`);
    const planned = planSystems(circuit, []);
    if (!planned.ok) throw new Error("plan failed");
    const solver = planned.plan.runs[0]!.solver;
    const { nodeIndex, branchIndex } = solver.sys;
    const idx = (name: string) => nodeIndex.get(name)!;
    const sorted = (xs: number[]) => [...xs].sort((p, q) => p - q);
    const read = (probe: string) => {
      const show = planned.plan.runs[0]!.traces.find((t) => t.name === probe)!;
      return Array.from(derivativesRead([show.reading], solver).dx);
    };
    expect(read("H")).toEqual(sorted([idx("out"), idx("in")]));
    expect(read("I")).toEqual(sorted([idx("mid"), idx("out")]));
    expect(read("Z")).toEqual(sorted([idx("in"), branchIndex.get("Vin")!]));
    expect(derivativesRead([], solver).dx.length).toBe(0);
  });

  it("every example and a 40-section ladder: each trace's value and dX/ds with the restricted derivative equal the full one's, bit for bit", () => {
    const dir = path.resolve(__dirname, "../../solver/examples");
    const texts = readdirSync(dir)
      .filter((f) => f.endsWith(".pwn"))
      .map((f) => [f, readFileSync(path.join(dir, f), "utf8")] as const);
    texts.push(["ladder", ladder(40)]);
    let loops = 0;
    for (const [file, text] of texts) {
      const planned = planSystems(circuitOf(text), []);
      if (!planned.ok) throw new Error(`${file}: plan failed`);
      for (const run of planned.plan.runs) {
        if (run.traces.length === 0) continue;
        if (run.solver.sys.second) loops++;
        const full = new AcSolver(run.solver.sys);
        for (const f of [3, 170, 1591.5, 2.2e4, 9e5]) {
          const a = run.solver.solveAt(f);
          const b = full.solveAt(f);
          expect(a).toBe(b);
          if (a !== null) continue;
          run.solver.derivative();
          full.derivative();
          for (const tr of run.traces) {
            const x = readTrace(tr.reading, run.solver);
            const y = readTrace(tr.reading, full);
            for (const k of ["re", "im", "dRe", "dIm"] as const) {
              if (!Object.is(x[k], y[k]))
                throw new Error(`${file} ${tr.name} at ${f} Hz: ${k} ${x[k]} ≠ ${y[k]}`);
            }
          }
        }
      }
    }
    // The examples include a loop measured by double injection (a second right-hand side).
    expect(loops).toBeGreaterThan(0);
  });

  it("takes the shorter pass on a ladder read at its far end: half the steps or fewer", () => {
    const planned = planSystems(circuitOf(ladder(40)), []);
    if (!planned.ok) throw new Error("plan failed");
    const solver = planned.plan.runs[0]!.solver;
    expect(solver.solveAt(100)).toBeNull();
    const want = derivativesRead(
      planned.plan.runs[0]!.traces.map((t) => t.reading),
      solver,
    ).dx;
    const sym = (solver as unknown as { lu: { f: { sym: Parameters<typeof backwardReach>[0] } } }).lu.f.sym;
    expect(backwardReach(sym, want).length).toBeLessThanOrEqual(solver.sys.n / 2 + 1);
  });
});
