/**
 * The per-sample work of a Monte Carlo run, made cheap: the systems of the circuit (the circuit
 * and one per loop) are planned and ordered once; each sample only rebuilds the numbers of G and C
 * over the same sparsity pattern, refactors with the pivot order already analysed, sweeps just the
 * systems whose traces a measure reads, and keeps no trace arrays (only measures and checks).
 * A noise measure is solved on the sample's own circuit (its resistors' 4kT/R and its transfer),
 * as for the nominal circuit: the main system is rebuilt for the sample, then the noise statement
 * is evaluated at the measure's frequencies (noise-measures.ts).
 */
import type { Circuit, Part, SteadyResult } from "../types";
import { AcSolver } from "./ac";
import { evaluateChecks } from "./checks";
import { middleHz, noiseSampler, sampler } from "./circuit-sweep";
import { computeMeasures } from "./measures";
import { buildMna } from "./mna";
import { kelvinOf, NoiseProbe } from "./noise";
import type { NoiseSampler } from "./noise-measures";
import { readTrace } from "./probes";
import type { TraceSampler } from "./refine";
import { solveSteadyFrom } from "./steady";
import { steadyMeasure } from "./steady/measures";
import { planSystems, type SystemRun } from "./systems";

/** One sample's outcome: measure values in `circuit.measures` order (NaN = no value), checks passed. */
interface SampleOutcome {
  values: Float64Array;
  passed: boolean;
}

interface ActiveRun {
  run: SystemRun;
  /** Index of each toleranced part in run.parts (−1 when absent). */
  slots: Int32Array;
  traces: { reading: SystemRun["traces"][number]["reading"]; re: number[]; im: number[] }[];
}

/**
 * Solves samples of one circuit whose toleranced parts (`names`, in that order) take new values.
 * Build once per thread; `solve(values, offset)` reads names.length values from offset.
 */
export class SampleKernel {
  readonly measureCount: number;
  /** Why the circuit cannot be planned (then every sample fails), or null. */
  readonly error: string | null = null;
  private readonly active: ActiveRun[] = [];
  private readonly samplers = new Map<string, TraceSampler>();
  /** Index in circuit.parts of each toleranced part, when a steady measure needs the steady state. */
  private readonly steadySlots: Int32Array | null = null;
  /** The nominal steady solution each sample starts from (computed at the first sample). */
  private steadySeed: Float64Array | null | undefined;
  /** The circuit's own system (rebuilt per sample) and the noise statements a measure reads. */
  private readonly noise: { run: ActiveRun; defs: NonNullable<Circuit["noise"]> } | null = null;

  constructor(
    private readonly circuit: Circuit,
    private readonly freqs: number[],
    names: string[],
  ) {
    this.measureCount = circuit.measures.length;
    if (circuit.steady && circuit.measures.some((m) => steadyMeasure(m, undefined) !== null)) {
      const index = new Map(circuit.parts.map((p, i) => [p.name, i]));
      this.steadySlots = Int32Array.from(names, (nm) => index.get(nm) ?? -1);
    }
    const planned = planSystems(circuit, []);
    if (!planned.ok) {
      this.error = planned.errors[0]?.message ?? "the circuit could not be planned";
      return;
    }
    const needed = new Set(circuit.measures.map((m) => m.target));
    const noiseDefs = (circuit.noise ?? []).filter((d) => needed.has(d.name));
    const n = freqs.length;
    for (const [r, run] of planned.plan.runs.entries()) {
      const used = run.traces.filter((t) => needed.has(t.name));
      // The circuit's own system (run 0) is rebuilt for noise even when no trace of it is read.
      if (used.length === 0 && !(r === 0 && noiseDefs.length > 0)) continue;
      const index = new Map(run.parts.map((p, i) => [p.name, i]));
      const traces = used.map((t) => {
        const re = new Array<number>(n).fill(0);
        const im = new Array<number>(n).fill(0);
        this.samplers.set(t.name, sampler(run, t.name, t.reading, freqs, re, im));
        return { reading: t.reading, re, im };
      });
      const active = { run, slots: Int32Array.from(names, (nm) => index.get(nm) ?? -1), traces };
      this.active.push(active);
      if (r === 0 && noiseDefs.length > 0) this.noise = { run: active, defs: noiseDefs };
    }
  }

  /** The noise statements on the sample's rebuilt system (its resistors' values, its transfer). */
  private noiseSamplers(): Map<string, NoiseSampler> {
    if (!this.noise) return new Map();
    const solver = this.noise.run.run.solver;
    const kelvin = kelvinOf(this.circuit);
    return new Map(
      this.noise.defs.map((d) => [d.name, noiseSampler(solver, new NoiseProbe(d, solver.sys, kelvin))]),
    );
  }

  /** The steady oscillation of one sample (started from the nominal solution), when a measure reads it. */
  private steadyOf(values: Float64Array, offset: number): SteadyResult | undefined {
    const c = this.circuit;
    if (!this.steadySlots || !c.steady) return undefined;
    const scale = middleHz(this.freqs);
    const loop = this.samplers.get(c.steady.loop);
    if (this.steadySeed === undefined) this.steadySeed = solveSteadyFrom(c, c.steady, loop, scale, null).x;
    const parts: Part[] = c.parts.slice();
    this.steadySlots.forEach((s, j) => {
      if (s >= 0) parts[s] = { ...parts[s]!, value: values[offset + j]! };
    });
    return solveSteadyFrom({ ...c, parts }, c.steady, loop, scale, this.steadySeed).result;
  }

  /** Solve one sample; a string says why it could not be solved. */
  solve(values: Float64Array, offset: number): SampleOutcome | string {
    if (this.error) return this.error;
    for (const a of this.active) {
      const parts: Part[] = a.run.parts.slice();
      for (let j = 0; j < a.slots.length; j++) {
        const s = a.slots[j]!;
        if (s >= 0) parts[s] = { ...parts[s]!, value: values[offset + j]! };
      }
      const built = buildMna(parts, a.run.nodes, a.run.second);
      if (!built.ok) return built.errors[0]?.message ?? "the sample could not be built";
      // A value of 0 drops a stamp and changes the pattern: that sample gets its own ordering.
      if (!a.run.solver.rebind(built.system)) a.run.solver = new AcSolver(built.system);
      const solver = a.run.solver;
      const freqs = this.freqs;
      // Rebuilt only for noise: nothing of it is read over the sweep.
      if (a.traces.length === 0) continue;
      for (let k = 0; k < freqs.length; k++) {
        const err = solver.solveAt(freqs[k]!);
        if (err) return err;
        for (const t of a.traces) {
          const v = readTrace(t.reading, solver);
          if (!Number.isFinite(v.re) || !Number.isFinite(v.im)) return "the probe divides by zero";
          t.re[k] = v.re;
          t.im[k] = v.im;
        }
      }
    }
    const steady = this.steadyOf(values, offset);
    const measures = computeMeasures(
      this.circuit.measures,
      this.samplers,
      (def) => steadyMeasure(def, steady),
      this.noiseSamplers(),
    );
    const checks = evaluateChecks(this.circuit.checks, measures);
    const out = new Float64Array(this.measureCount);
    for (let i = 0; i < out.length; i++) out[i] = measures[i]?.value ?? Number.NaN;
    return { values: out, passed: checks.every((c) => c.pass) };
  }
}

/** The outcomes of samples from..to−1, flat: values[(s−from)·m + i], passed/failed per sample. */
export interface SampleBatch {
  from: number;
  to: number;
  values: Float64Array;
  passed: Uint8Array;
  failed: Uint8Array;
}

/**
 * Solve samples from..to−1 of `draws` (names.length values per sample, sample-major).
 * `onProgress(done)` is called every `every` samples.
 */
export function solveSampleRange(
  kernel: SampleKernel,
  draws: Float64Array,
  width: number,
  from: number,
  to: number,
  onProgress?: (done: number) => void,
  every = 25,
): SampleBatch {
  const m = kernel.measureCount;
  const count = Math.max(0, to - from);
  const batch: SampleBatch = {
    from,
    to,
    values: new Float64Array(count * m).fill(Number.NaN),
    passed: new Uint8Array(count),
    failed: new Uint8Array(count),
  };
  for (let s = from; s < to; s++) {
    const o = kernel.solve(draws, s * width);
    const row = s - from;
    if (typeof o === "string") batch.failed[row] = 1;
    else {
      batch.values.set(o.values, row * m);
      batch.passed[row] = o.passed ? 1 : 0;
    }
    if (onProgress && (row + 1) % every === 0) onProgress(row + 1);
  }
  onProgress?.(count);
  return batch;
}
