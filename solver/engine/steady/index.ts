/**
 * The steady oscillation of a loop (NETLIST.md "Steady oscillation"): start-up from the growing
 * poles, a describing-function estimate, then harmonic balance with N harmonics by damped Newton
 * (first with the fundamental alone, then with all N). Unconverged → no figures, the reason instead.
 */
import type { Circuit, SteadyDef, SteadyResult } from "../../types";
import { cutNodeName } from "../loops";
import type { TraceSampler } from "../refine";
import { describingEstimate, type Estimate } from "./describing-function";
import { HbSystem } from "./hb-system";
import { type NewtonOutcome, newton } from "./newton";
import { buildPorts, type Port } from "./ports";
import { readProbes, steadyProbeList } from "./readings";
import { notStarting, startInfo } from "./small-signal";
import { scaleSwingPorts, Transfer } from "./transfer";
import { envelope, startup, summary } from "./verdict";

/** A result without figures: why there is no steady oscillation. */
function without(
  def: SteadyDef,
  reason: string,
  notes: string[],
  extra: Partial<SteadyResult> = {},
): SteadyResult {
  return {
    loop: def.loop,
    frequencyHz: null,
    harmonics: def.harmonics,
    startup: null,
    probes: [],
    residual: null,
    iterations: 0,
    reason,
    summary: reason,
    estimate: null,
    envelope: null,
    notes,
    ...extra,
  };
}

/** A steady result left out on purpose (the reason says why and where it will be solved). */
export function deferredSteady(def: SteadyDef, reason: string): SteadyResult {
  return without(def, reason, []);
}

/** Grow a solution of `from` harmonics into the layout of `to` (higher harmonics start at 0). */
function extend(from: HbSystem, x: Float64Array, to: HbSystem): Float64Array {
  const y = new Float64Array(to.size);
  for (let e = 0; e < from.p; e++)
    for (let i = 0; i < from.block; i++) y[e * to.block + i] = x[e * from.block + i]!;
  return y;
}

export function solveSteady(
  circuit: Circuit,
  def: SteadyDef,
  loopTrace: TraceSampler | undefined,
  scaleHz: number,
): SteadyResult {
  return solveSteadyFrom(circuit, def, loopTrace, scaleHz, null).result;
}

/**
 * The same, optionally started from an earlier solution's unknowns (a Monte Carlo sample starts
 * from the nominal solution: no describing-function search, a few Newton steps); `x` is the
 * solution to start the next one from (null without a result).
 */
export function solveSteadyFrom(
  circuit: Circuit,
  def: SteadyDef,
  loopTrace: TraceSampler | undefined,
  scaleHz: number,
  seed: Float64Array | null,
): { result: SteadyResult; x: Float64Array | null } {
  const r = steadyUnwrapped(circuit, def, loopTrace, scaleHz, seed);
  return "result" in r ? r : { result: r, x: null };
}

function steadyUnwrapped(
  circuit: Circuit,
  def: SteadyDef,
  loopTrace: TraceSampler | undefined,
  scaleHz: number,
  seed: Float64Array | null,
): SteadyResult | { result: SteadyResult; x: Float64Array } {
  const notes: string[] = [];
  const loop = circuit.loops.find((l) => l.name === def.loop);
  if (!loop) return without(def, `no loop named ${def.loop}`, notes);
  const info = startInfo(circuit, loopTrace, scaleHz);
  if (typeof info === "string") return without(def, info, notes);
  if (info.growing === null) return without(def, notStarting(info), notes);
  if (info.loop && info.loop.magnitude < 1)
    notes.push(
      `the poles grow but |${def.loop}| = ${info.loop.magnitude.toPrecision(3)} at zero phase: the cut is approximate here`,
    );
  const sigma = info.growing.re;
  const omega0 = Math.abs(info.growing.im);
  const net = buildPorts(circuit.parts, circuit.nodes);
  if ("reason" in net) return without(def, net.reason, notes);
  notes.push(...net.notes);
  const transfer = new Transfer(net.sys, net.ports);
  if (!scaleSwingPorts(transfer, omega0)) return without(def, "the network has no solution at DC", notes);
  const { sys, out, iterations, est, reason } = solveHarmonics(
    transfer,
    net.ports,
    def.harmonics,
    omega0,
    seed,
  );
  if (!out) return without(def, reason, notes);
  const residual = out.residual;
  if (!out.converged)
    return without(def, `harmonic balance did not converge: ${out.reason}`, notes, { iterations, residual });
  const omega = sys.omega(out.x);
  const frequencyHz = omega / (2 * Math.PI);
  const cut = loop.node;
  const read = readProbes(sys, out.x, net, steadyProbeList(circuit, cut), cut);
  if (typeof read === "string") return without(def, read, notes, { iterations, residual });
  const cutProbe = read[0]!;
  const amplitude = cutProbe.amplitudes[0] ?? 0;
  if (!(amplitude > 1e-12))
    return without(def, "harmonic balance found only the zero solution (no oscillation)", notes, {
      iterations,
      residual,
    });
  const start = startup(sigma, amplitude, def.from, frequencyHz);
  notes.push(
    `harmonic balance: ${def.harmonics} harmonics, ${sys.samples} samples per period, ${iterations} Newton steps, residual ${residual.toExponential(1)}`,
    `phases are referred to the fundamental at ${cut} (0°); ${cutNodeName(cut)} is not used: the loop is closed`,
  );
  const result: SteadyResult = {
    loop: def.loop,
    frequencyHz,
    harmonics: def.harmonics,
    startup: start,
    probes: read,
    residual,
    iterations,
    reason: null,
    summary: summary(amplitude, cut, frequencyHz, cutProbe.thdPercent, start),
    estimate: est && {
      frequencyHz: est.omega / (2 * Math.PI),
      amplitude: est.amplitude,
      node: portName(net.ports[est.port]!),
    },
    envelope: envelope(sigma, amplitude, def.from),
    notes,
  };
  return { result, x: out.x };
}

/**
 * Newton from the seed (when given), else from each limiter's describing-function estimate in turn
 * (the others linear) until one converges: first the fundamental alone, then all harmonics.
 */
function solveHarmonics(
  transfer: Transfer,
  ports: Port[],
  harmonics: number,
  omega0: number,
  seed: Float64Array | null,
): { sys: HbSystem; out: NewtonOutcome | null; iterations: number; est: Estimate | null; reason: string } {
  let sys = new HbSystem(transfer, ports, harmonics);
  let out = seed && seed.length === sys.size ? newton(sys, seed) : null;
  let iterations = out?.iterations ?? 0;
  let est: Estimate | null = null;
  // Each limiter in turn as the describing-function port (the others linear), until one converges.
  let reason = "";
  for (let e = 0; e < ports.length && !out?.converged; e++) {
    const df = describingEstimate(transfer, e, omega0);
    if ("reason" in df) {
      reason ||= df.reason;
      continue;
    }
    est = df;
    // Harmonic balance with the fundamental alone (the describing-function solution), then all N.
    const one = new HbSystem(transfer, ports, 1);
    const x0 = new Float64Array(one.size);
    df.fundamentals.forEach((f, j) => {
      x0[j * one.block + 1] = f.re;
      if (j > 0) x0[j * one.block + 2] = f.im;
    });
    x0[2] = df.omega;
    sys = one;
    out = newton(one, x0);
    iterations += out.iterations;
    // All N at once; if Newton stalls there (a hard limit), by steps of 2k+1 harmonics from the last solution.
    let from = one;
    let x = out.x;
    for (let k = 1; out.converged && from.harmonics < harmonics; ) {
      const next = new HbSystem(transfer, ports, harmonics);
      const tried = newton(next, extend(from, x, next));
      iterations += tried.iterations;
      if (tried.converged || k >= harmonics) {
        sys = next;
        out = tried;
        break;
      }
      k = Math.min(harmonics, 2 * k + 1);
      const step = new HbSystem(transfer, ports, k);
      const partial = newton(step, extend(from, x, step));
      iterations += partial.iterations;
      sys = step;
      out = partial;
      from = step;
      x = partial.x;
    }
  }
  return { sys, out, iterations, est, reason };
}

function portName(port: Port): string {
  return port.kind === "swing"
    ? `${port.part.name} (output before its limit)`
    : `volts(${port.a}, ${port.b})`;
}
