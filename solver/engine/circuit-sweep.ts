/**
 * One sweep of one circuit: every frequency of every system, the traces, then the measures, checks,
 * noise densities and steady oscillation read from them. Also the samplers through which measures
 * solve the circuit at frequencies between the sweep's points.
 */
import type {
  CheckResult,
  Circuit,
  MeasureResult,
  NetlistError,
  NoiseResult,
  SourceSpan,
  SteadyResult,
  TraceResult,
  Warning,
} from "../types";
import type { AcSolver } from "./ac";
import { evaluateChecks } from "./checks";
import { spanError } from "./errors";
import { floatingNodes } from "./floating";
import { computeMeasures } from "./measures";
import type { MnaSystem } from "./mna";
import { kelvinOf, NoiseProbe, NoiseSweep } from "./noise";
import type { NoiseSampler } from "./noise-measures";
import { type Reading, readTrace } from "./probes";
import type { TraceSampler } from "./refine";
import { deferredSteady, solveSteady } from "./steady";
import { steadyMeasure } from "./steady/measures";
import { planSystems, runError, type SystemRun } from "./systems";
import { groupDelayOf, makeTrace } from "./trace";

/** The result of one sweep of one circuit: everything a variant or a sample needs. */
interface SweepOutcome {
  traces: TraceResult[];
  measures: MeasureResult[];
  checks: CheckResult[];
  samplers: Map<string, TraceSampler>;
  system: MnaSystem;
  /** The `noise` statements' densities over the sweep (only when `full`). */
  noise: NoiseResult[];
  steady?: SteadyResult;
}

export function sampler(
  run: SystemRun,
  name: string,
  reading: Reading,
  freqs: number[],
  re: number[],
  im: number[],
) {
  const s: TraceSampler = {
    name,
    freqs,
    re,
    im,
    at(f, deriv) {
      const err = run.solver.solveAt(f);
      if (err) return runError(run, err);
      if (deriv) run.solver.derivative();
      const d = readTrace(reading, run.solver);
      return deriv ? d : { ...d, dRe: 0, dIm: 0 };
    },
  };
  return s;
}

/** A noise statement evaluated at any frequency: a solve of the main system, then the adjoint. */
export function noiseSampler(solver: AcSolver, probe: NoiseProbe): NoiseSampler {
  return {
    name: probe.def.name,
    input: probe.def.input ?? null,
    at(f) {
      const err = solver.solveAt(f);
      return err ?? probe.evaluate(solver, f);
    },
  };
}

function firstPartOn(sys: MnaSystem, node: string): SourceSpan | undefined {
  return sys.parts.find((p) => p.nodes.includes(node))?.span;
}

/**
 * Sweep one circuit: build the MNA systems (the circuit and one per loop), solve every frequency,
 * read the traces, then the measures and checks. Never throws on user input.
 */
export function sweepCircuit(
  circuit: Circuit,
  freqs: number[],
  warnings: Warning[],
  deferSteady?: string,
  full = false,
): { ok: true; outcome: SweepOutcome } | { ok: false; errors: NetlistError[] } {
  const planned = planSystems(circuit, warnings);
  if (!planned.ok) return planned;
  const { runs, main } = planned.plan;
  const withDelay = full;
  const kelvin = kelvinOf(circuit);
  const mainSolver = runs[0]!.solver;
  const noiseProbes = (circuit.noise ?? []).map((d) => new NoiseProbe(d, mainSolver.sys, kelvin));
  const noiseSweeps = full ? noiseProbes.map((p) => new NoiseSweep(p, freqs.length)) : [];
  const traces: TraceResult[] = [];
  const samplers = new Map<string, TraceSampler>();
  for (const [r, run] of runs.entries()) {
    if (r > 0 && run.traces.length === 0) continue;
    const cols = sweepRun(run, r, freqs, withDelay, r === 0 ? noiseSweeps : []);
    if (!Array.isArray(cols)) return { ok: false, errors: [cols] };
    for (const [t, tr] of run.traces.entries()) {
      const { re, im, delay } = cols[t]!;
      if (re.some((x, k) => !Number.isFinite(x) || !Number.isFinite(im[k]!))) {
        return {
          ok: false,
          errors: [spanError(tr.span, `${tr.name}: the probe divides by zero somewhere in the sweep`)],
        };
      }
      traces.push(makeTrace(tr.name, tr.kind, re, im, delay ?? undefined));
      samplers.set(tr.name, sampler(run, tr.name, tr.reading, freqs, re, im));
    }
  }
  // Shows first, then loops, each in netlist order (the runs are grouped by system).
  const order = new Map(
    [...circuit.shows.map((s) => s.name), ...circuit.loops.map((l) => l.name)].map((n, i) => [n, i]),
  );
  traces.sort((a, b) => (order.get(a.name) ?? 0) - (order.get(b.name) ?? 0));
  const steady = !circuit.steady
    ? undefined
    : deferSteady !== undefined
      ? deferredSteady(circuit.steady, deferSteady)
      : solveSteady(circuit, circuit.steady, samplers.get(circuit.steady.loop), middleHz(freqs));
  const noiseSamplers = new Map(noiseProbes.map((p) => [p.def.name, noiseSampler(mainSolver, p)]));
  const measures = computeMeasures(
    circuit.measures,
    samplers,
    (def) => steadyMeasure(def, steady),
    noiseSamplers,
  );
  const checks = evaluateChecks(circuit.checks, measures);
  const noise = noiseSweeps.map((ns) => ns.result(kelvin));
  return {
    ok: true,
    outcome: { traces, measures, checks, samplers, system: main, noise, ...(steady ? { steady } : {}) },
  };
}

/** A trace's columns over the sweep (`delay` only with group delay). */
interface Columns {
  re: number[];
  im: number[];
  delay: (number | null)[] | null;
}

/**
 * Solve system `r` (0: the circuit, then one per loop) at every frequency and read its traces (and
 * record the noise sweeps on the circuit's own system); the first failure as an error at its place.
 */
function sweepRun(
  run: SystemRun,
  r: number,
  freqs: number[],
  withDelay: boolean,
  noiseSweeps: NoiseSweep[],
): Columns[] | NetlistError {
  const n = freqs.length;
  const cols: Columns[] = run.traces.map(() => ({
    re: new Array<number>(n),
    im: new Array<number>(n),
    delay: withDelay ? new Array<number | null>(n) : null,
  }));
  for (let k = 0; k < n; k++) {
    const f = freqs[k]!;
    const err = run.solver.solveAt(f);
    if (err) {
      const fl = floatingNodes(run.solver.sys, f);
      const span = r > 0 ? run.traces[0]!.span : fl[0] ? firstPartOn(run.solver.sys, fl[0]) : undefined;
      const msg = r > 0 ? `loop ${run.traces[0]!.name}: ${runError(run, err)}` : err;
      return spanError(span, msg);
    }
    if (withDelay) run.solver.derivative();
    for (const ns of noiseSweeps) ns.record(run.solver, f);
    for (const [t, tr] of run.traces.entries()) {
      const v = readTrace(tr.reading, run.solver);
      const col = cols[t]!;
      col.re[k] = v.re;
      col.im[k] = v.im;
      if (col.delay) col.delay[k] = groupDelayOf(v);
    }
  }
  return cols;
}

/** The geometric middle of a sweep (the scale of the pole search). */
export function middleHz(freqs: number[]): number {
  const a = freqs[0] ?? 1;
  const b = freqs[freqs.length - 1] ?? a;
  return Math.sqrt(a * b);
}
