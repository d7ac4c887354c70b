import type {
  CheckResult,
  Circuit,
  MeasureResult,
  NetlistError,
  NoiseResult,
  Part,
  Probe,
  SolveResult,
  SourceSpan,
  SteadyResult,
  TraceResult,
  Warning,
} from "../types";
import { AcSolver } from "./ac";
import { evaluateChecks } from "./checks";
import { floatingNodes } from "./floating";
import { buildLoop, cutNodeName } from "./loops";
import { computeMeasures } from "./measures";
import { buildMna, type MnaSystem } from "./mna";
import { kelvinOf, NoiseProbe, NoiseSweep } from "./noise";
import type { NoiseSampler } from "./noise-measures";
import { loopsAtZeroPhase } from "./oscillation";
import { probeProblem, type Reading, readTrace } from "./probes";
import type { TraceSampler } from "./refine";
import { deferredSteady, solveSteady } from "./steady";
import { steadyMeasure } from "./steady/measures";
import { sweepFrequencies } from "./sweep";
import { groupDelayOf, makeTrace } from "./trace";

export const ENGINE_VERSION = "1.0.0";

/** Options of one analysis run. */
export interface AnalyzeOptions {
  /** Refuse sweeps with more points than this (the service's per-request limit). */
  maxPoints?: number;
  /** Leave the steady oscillation out, with this reason (a preview over the service's budget). */
  deferSteady?: string;
}

export const spanError = (span: SourceSpan | undefined, message: string, hint?: string): NetlistError => ({
  line: span?.line ?? 1,
  column: span?.column ?? 1,
  endColumn: span?.endColumn ?? 2,
  message,
  ...(hint ? { hint } : {}),
});

/** One solved system (the circuit, or one loop's circuit) and the traces read from it. */
export interface SystemRun {
  solver: AcSolver;
  traces: { name: string; kind: "probe" | "loop"; reading: Reading; span: SourceSpan }[];
  /** The parts and nodes the system was built from (a Monte Carlo sample rebuilds it with new values). */
  parts: Part[];
  nodes: string[];
  /** Sources of the second right-hand side (a loop by double injection), passed to buildMna. */
  second: Part[];
}

/** The result of one sweep of one circuit: everything a variant or a sample needs. */
export interface SweepOutcome {
  traces: TraceResult[];
  measures: MeasureResult[];
  checks: CheckResult[];
  samplers: Map<string, TraceSampler>;
  system: MnaSystem;
  /** The `noise` statements' densities over the sweep (only when `full`). */
  noise: NoiseResult[];
  steady?: SteadyResult;
}

/**
 * A solve failure of a run. A loop by double injection is solved closed, so its equations are also
 * singular where the loop gain is exactly 1 at zero phase (a pole on the jω axis): say so.
 */
export function runError(run: SystemRun, err: string): string {
  const loop = run.traces.find((t) => t.kind === "loop");
  if (loop?.reading.op !== "double-injection") return err;
  return (
    `${err}; loop ${loop.name} is measured by injection on the closed loop, which is singular where ` +
    "T = 1 exactly (an oscillator at its limit): method=cut has no such point"
  );
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
function noiseSampler(solver: AcSolver, probe: NoiseProbe): NoiseSampler {
  return {
    name: probe.def.name,
    input: probe.def.input ?? null,
    at(f) {
      const err = solver.solveAt(f);
      return err ?? probe.evaluate(solver, f);
    },
  };
}

/** The probe with every volts(from…) read at node `to` instead. */
function renameNode(p: Probe, from: string, to: string): Probe {
  switch (p.op) {
    case "num":
    case "i":
      return p;
    case "v": {
      const node = p.node === from ? to : p.node;
      return p.ref === undefined ? { op: "v", node } : { op: "v", node, ref: p.ref === from ? to : p.ref };
    }
    case "neg":
      return { op: "neg", arg: renameNode(p.arg, from, to) };
    default:
      return { op: p.op, left: renameNode(p.left, from, to), right: renameNode(p.right, from, to) };
  }
}

function firstPartOn(sys: MnaSystem, node: string): SourceSpan | undefined {
  return sys.parts.find((p) => p.nodes.includes(node))?.span;
}

/** The systems of a circuit (the circuit, then one per loop) and the traces each one is read for. */
export interface SystemPlan {
  runs: SystemRun[];
  main: MnaSystem;
}

/**
 * Build the MNA systems of a circuit (the circuit and one per loop) and decide which system each
 * trace is read from. Never throws on user input.
 */
export function planSystems(
  circuit: Circuit,
  warnings: Warning[],
): { ok: true; plan: SystemPlan } | { ok: false; errors: NetlistError[] } {
  const main = buildMna(circuit.parts, circuit.nodes);
  if (!main.ok) return main;
  const errors: NetlistError[] = [];
  const runs: SystemRun[] = [
    {
      solver: new AcSolver(main.system),
      traces: [],
      parts: circuit.parts,
      nodes: circuit.nodes,
      second: [],
    },
  ];
  for (const loop of circuit.loops) {
    const lb = buildLoop(circuit, loop);
    if (!lb.ok) {
      errors.push(spanError(loop.span, lb.message));
      continue;
    }
    const sys = buildMna(lb.parts, lb.nodes, lb.second);
    if (!sys.ok) {
      errors.push(...sys.errors);
      continue;
    }
    // The language gives the same warning for a netlist it compiled: say it once.
    const w = lb.warning;
    if (w && !warnings.some((x) => x.line === w.line && x.message === w.message)) warnings.push(w);
    runs.push({
      solver: new AcSolver(sys.system),
      traces: [{ name: loop.name, kind: "loop", reading: lb.reading, span: loop.span }],
      parts: lb.parts,
      nodes: lb.nodes,
      second: lb.second,
    });
  }
  // A circuit without an independent source (an oscillator) has only the zero response; its
  // shows are read with the first loop's test signal as the excitation (see README.md).
  const excited = circuit.parts.some((p) => (p.kind === "vsource" || p.kind === "isource") && p.value !== 0);
  const firstLoop = circuit.loops[0];
  let showRun = runs[0]!;
  let rename = (p: Probe) => p;
  if (!excited && circuit.shows.length > 0) {
    if (!firstLoop || runs.length < 2) {
      errors.push(
        spanError(
          circuit.shows[0]!.span,
          "the circuit has no independent source, so every voltage and current is zero",
          "add a vsource or isource, or a loop cut whose test signal excites the circuit",
        ),
      );
    } else {
      showRun = runs[1]!;
      rename = (p) => renameNode(p, firstLoop.node, cutNodeName(firstLoop.node));
      // With double injection the shows read the 1 V series injection (the first right-hand side).
      // Ratios such as volts(pos)/volts(amp_out) do not depend on the excitation: no warning for them.
      if (!circuit.shows.every((sh) => excitationDegree(sh.probe) === 0))
        warnings.push({
          line: firstLoop.span.line,
          message:
            firstLoop.method === "injection"
              ? `the circuit has no independent source: shows are read with loop ${firstLoop.name}'s 1 V series ` +
                `test source at ${firstLoop.node} as the excitation, volts(${firstLoop.node}) being read on the side ` +
                "of the listed parts"
              : `the circuit has no independent source: shows are read with loop ${firstLoop.name}'s test signal ` +
                `as the excitation (the loop opened at ${firstLoop.node}, volts(${firstLoop.node}) being the injected side)`,
        });
    }
  }
  for (const show of circuit.shows) {
    const probe = rename(show.probe);
    const problem = probeProblem(probe, showRun.solver.sys);
    if (problem) errors.push(spanError(show.span, `show ${show.name}: ${problem}`));
    else showRun.traces.push({ name: show.name, kind: "probe", reading: probe, span: show.span });
  }
  if (errors.length > 0) return { ok: false, errors };
  return { ok: true, plan: { runs, main: main.system } };
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
    const n = freqs.length;
    const cols = run.traces.map(() => ({
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
        return { ok: false, errors: [spanError(span, msg)] };
      }
      if (withDelay) run.solver.derivative();
      if (r === 0) for (const ns of noiseSweeps) ns.record(run.solver, f);
      for (const [t, tr] of run.traces.entries()) {
        const v = readTrace(tr.reading, run.solver);
        const col = cols[t]!;
        col.re[k] = v.re;
        col.im[k] = v.im;
        if (col.delay) col.delay[k] = groupDelayOf(v);
      }
    }
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

/** The geometric middle of a sweep (the scale of the pole search). */
export function middleHz(freqs: number[]): number {
  const a = freqs[0] ?? 1;
  const b = freqs[freqs.length - 1] ?? a;
  return Math.sqrt(a * b);
}

/**
 * Analyse an elaborated circuit: sweep, traces, loop gains, measures and checks (NETLIST.md).
 * `warnings` (from the language) are carried into the result; engine warnings are appended.
 * Never throws on user input: failures come back as `{ok: false, errors}`.
 */
export function analyze(
  circuit: Circuit,
  warnings: Warning[] = [],
  options: AnalyzeOptions = {},
): SolveResult {
  try {
    return analyzeUnguarded(circuit, warnings, options);
  } catch (error) {
    return { ok: false, errors: [internalError(error)], warnings };
  }
}

/** An unexpected fault as a netlist error at line 1 (the solver never throws on user input). */
export function internalError(error: unknown): NetlistError {
  const detail = error instanceof Error ? error.message : String(error);
  return spanError(undefined, "the circuit could not be solved (an internal fault)", detail);
}

function analyzeUnguarded(circuit: Circuit, warnings: Warning[], options: AnalyzeOptions): SolveResult {
  const t0 = performance.now();
  const warn = [...warnings];
  if (circuit.defaultSweep) {
    warn.push({ line: null, message: "no sweep statement: used 10 Hz to 10 MHz, 100 points per decade" });
  }
  const freqs = sweepFrequencies(circuit.sweep);
  if (typeof freqs === "string")
    return { ok: false, errors: [spanError(circuit.sweepSpan, freqs)], warnings: warn };
  if (options.maxPoints !== undefined && freqs.length > options.maxPoints) {
    return {
      ok: false,
      errors: [
        spanError(
          circuit.sweepSpan,
          `the sweep has ${freqs.length} points; this service allows at most ${options.maxPoints}`,
          "use fewer points per decade or a narrower range",
        ),
      ],
      warnings: warn,
    };
  }
  const run = sweepCircuit(circuit, freqs, warn, options.deferSteady, true);
  if (!run.ok) return { ok: false, errors: run.errors, warnings: warn };
  const { outcome } = run;
  return {
    ok: true,
    title: circuit.title,
    solverVersion: ENGINE_VERSION,
    frequencies: freqs,
    traces: outcome.traces,
    measures: outcome.measures,
    checks: outcome.checks,
    ...(circuit.loops.length > 0 ? { zeroPhase: loopsAtZeroPhase(circuit, outcome.samplers) } : {}),
    warnings: warn,
    ...(outcome.noise.length > 0 ? { noise: outcome.noise } : {}),
    ...(outcome.steady ? { steady: outcome.steady } : {}),
    stats: {
      nodes: circuit.nodes.length,
      unknowns: outcome.system.n,
      points: freqs.length,
      solveMs: Math.round((performance.now() - t0) * 1000) / 1000,
    },
  };
}

/**
 * How a probe scales with the circuit's excitation: 0 for ratios of responses (independent of the
 * source's level), 1 for a voltage or current, null when the terms of a sum scale differently.
 */
export function excitationDegree(p: Probe): number | null {
  switch (p.op) {
    case "num":
      return 0;
    case "v":
    case "i":
      return 1;
    case "neg":
      return excitationDegree(p.arg);
    case "+":
    case "-": {
      const a = excitationDegree(p.left);
      const b = excitationDegree(p.right);
      return a !== null && a === b ? a : null;
    }
    case "*":
    case "/": {
      const a = excitationDegree(p.left);
      const b = excitationDegree(p.right);
      if (a === null || b === null) return null;
      return p.op === "*" ? a + b : a - b;
    }
  }
}
