/**
 * The systems of a circuit: the circuit's own MNA system and one per loop, and which traces are read
 * from each. The circuit's sweep (circuit-sweep.ts) and the Monte Carlo kernel (samples.ts) solve them.
 */
import type { Circuit, NetlistError, Part, Probe, SourceSpan, Warning } from "../types";
import { AcSolver } from "./ac";
import { spanError } from "./errors";
import { buildLoop, cutNodeName } from "./loops";
import { buildMna, type MnaSystem } from "./mna";
import { derivativesRead, probeProblem, type Reading } from "./probes";

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

/** The systems of a circuit (the circuit, then one per loop) and the traces each one is read for. */
interface SystemPlan {
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
  placeShows(circuit, runs, warnings, errors);
  if (errors.length > 0) return { ok: false, errors };
  // dx/ds is read only through the traces: each system derives it at the unknowns they read.
  for (const run of runs) {
    const { dx, dx2 } = derivativesRead(
      run.traces.map((t) => t.reading),
      run.solver,
    );
    run.solver.deriveOnly(dx, dx2);
  }
  return { ok: true, plan: { runs, main: main.system } };
}

/**
 * Add each show to the system it is read from. A circuit without an independent source (an
 * oscillator) has only the zero response; its shows are read with the first loop's test signal as
 * the excitation (see README.md).
 */
function placeShows(circuit: Circuit, runs: SystemRun[], warnings: Warning[], errors: NetlistError[]): void {
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
}

/**
 * How a probe scales with the circuit's excitation: 0 for ratios of responses (independent of the
 * source's level), 1 for a voltage or current, null when the terms of a sum scale differently.
 */
function excitationDegree(p: Probe): number | null {
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
