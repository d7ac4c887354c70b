/**
 * Every unknown's harmonics rebuilt from the ports' solution, and the probes of the steady result:
 * the cut node first, then each `show` probe's numerator reading, then the probes of `amplitude` and
 * `thd` measures. Phases are turned so that the cut node's fundamental is at 0°.
 */
import { deg } from "../../angles";
import { type Circuit, GROUND, type Probe, type SteadyProbe } from "../../types";
import { harmonicsOf, powerOfTwoAtLeast, synthesize } from "./fft";
import type { HbSystem } from "./hb-system";
import { diodeCurrent, type PortNetwork } from "./ports";

export interface SteadyProbeRequest {
  text: string;
  probe: Probe;
}

/** The numerator's first reading of a show probe (volts(pos) of volts(pos)/volts(out)). */
function numerator(p: Probe): Probe | null {
  switch (p.op) {
    case "v":
    case "i":
      return p;
    case "num":
      return null;
    case "neg":
      return numerator(p.arg);
    default:
      return numerator(p.left) ?? numerator(p.right);
  }
}

export function probeText(p: Probe): string {
  if (p.op === "v") return p.ref === undefined ? `volts(${p.node})` : `volts(${p.node}, ${p.ref})`;
  if (p.op === "i") return `amps(${p.part})`;
  return "";
}

export function steadyProbeList(circuit: Circuit, cut: string): SteadyProbeRequest[] {
  const out: SteadyProbeRequest[] = [];
  const add = (probe: Probe | null | undefined) => {
    if (!probe || (probe.op !== "v" && probe.op !== "i")) return;
    const text = probeText(probe);
    if (!out.some((o) => o.text === text)) out.push({ text, probe });
  };
  add({ op: "v", node: cut });
  for (const s of circuit.shows) add(numerator(s.probe));
  for (const m of circuit.measures) add(m.probe);
  return out;
}

type Harmonics = { re: Float64Array; im: Float64Array };

/** The solution's harmonics 0…n of every unknown, and what else reading a probe needs. */
interface Solution {
  n: number;
  omega: number;
  net: PortNetwork;
  signals: ReturnType<HbSystem["portSignals"]>;
  /** Harmonic k of unknown i (0 for ground, i < 0), as [re, im]. */
  unknown(i: number, k: number): [number, number];
  /** A node's unknown, −1 for ground. */
  node(name: string): number;
}

function solution(sys: HbSystem, x: Float64Array, net: PortNetwork): Solution | string {
  const omega = sys.omega(x);
  const L = sys.transfers(omega, true);
  if (L === null) return "the network is singular at a harmonic of the oscillation";
  const signals = sys.portSignals(x);
  const mna = net.sys;
  const unknown = (i: number, k: number): [number, number] => {
    if (i < 0) return [0, 0];
    let re = 0;
    let im = 0;
    signals.forEach((s, f) => {
      const r = L[k]!.responses[f]!;
      const ur = s.u.re[k]!;
      const ui = k === 0 ? 0 : s.u.im[k]!;
      re += r.re[i]! * ur - r.im[i]! * ui;
      im += r.re[i]! * ui + r.im[i]! * ur;
    });
    return [re, im];
  };
  const node = (name: string) => (name === GROUND ? -1 : (mna.nodeIndex.get(name) ?? -1));
  return { n: sys.harmonics, omega, net, signals, unknown, node };
}

/** A probe's harmonics: volts(…) from node unknowns, amps(…) as currentOf reads it. */
function readProbe(sol: Solution, p: Probe): Harmonics | string {
  if (p.op === "i") return currentOf(sol, p.part);
  if (p.op !== "v") return "only volts(…) and amps(…) are read in the steady state";
  const { n, unknown, node } = sol;
  const re = new Float64Array(n + 1);
  const im = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) {
    const [ar, ai] = unknown(node(p.node), k);
    const [br, bi] = p.ref === undefined ? [0, 0] : unknown(node(p.ref), k);
    re[k] = ar - br;
    im[k] = ai - bi;
  }
  return { re, im };
}

/**
 * A part's current harmonics: a branch unknown as solved, a resistor's or capacitor's from its
 * voltage, a diode's from the FFT of its current over one period.
 */
function currentOf(sol: Solution, name: string): Harmonics | string {
  const { n, omega, net, unknown, node } = sol;
  const re = new Float64Array(n + 1);
  const im = new Float64Array(n + 1);
  const part = net.sys.partByName.get(name);
  const branch = net.sys.branchIndex.get(name);
  if (branch !== undefined) {
    for (let k = 0; k <= n; k++) [re[k], im[k]] = unknown(branch, k);
    return { re, im };
  }
  if (part && (part.kind === "resistor" || part.kind === "capacitor")) {
    for (let k = 0; k <= n; k++) {
      const [ar, ai] = unknown(node(part.nodes[0]!), k);
      const [br, bi] = unknown(node(part.nodes[1]!), k);
      const [vr, vi] = [ar - br, ai - bi];
      if (part.kind === "resistor") [re[k], im[k]] = [vr / part.value, vi / part.value];
      else [re[k], im[k]] = [-k * omega * part.value * vi, k * omega * part.value * vr];
    }
    return { re, im };
  }
  const e = net.ports.findIndex((q) => q.kind === "diodes" && q.diodes.some((d) => d.part.name === name));
  const port = net.ports[e];
  if (port?.kind === "diodes") {
    const d = port.diodes.find((q) => q.part.name === name)!;
    const wt = sol.signals[e]!.wt;
    const it = wt.map((w) => d.sign * diodeCurrent(d.part, d.sign * w).i);
    return harmonicsOf(it, n + 1);
  }
  return `amps(${name}) cannot be read in the steady state`;
}

/** The probes' harmonics, waveforms and THD at the solution x; a message when one cannot be read. */
export function readProbes(
  sys: HbSystem,
  x: Float64Array,
  net: PortNetwork,
  list: SteadyProbeRequest[],
  cut: string,
): SteadyProbe[] | string {
  const sol = solution(sys, x, net);
  if (typeof sol === "string") return sol;
  const cutH = readProbe(sol, { op: "v", node: cut });
  if (typeof cutH === "string") return cutH;
  const phi = Math.atan2(cutH.im[1]!, cutH.re[1]!);
  const out: SteadyProbe[] = [];
  for (const req of list) {
    const h = readProbe(sol, req.probe);
    if (typeof h === "string") return h;
    out.push(describe(req.text, h, phi, sol.omega));
  }
  return out;
}

function describe(text: string, h: Harmonics, phi: number, omega: number): SteadyProbe {
  const n = h.re.length - 1;
  const re = Float64Array.from(h.re);
  const im = Float64Array.from(h.im);
  im[0] = 0;
  const amplitudes: number[] = [];
  const phasesDeg: number[] = [];
  let distortion = 0;
  for (let k = 1; k <= n; k++) {
    // Turn by −k·φ: the cut node's fundamental at 0°.
    const c = Math.cos(k * phi);
    const s = Math.sin(k * phi);
    const r = h.re[k]! * c + h.im[k]! * s;
    const i = h.im[k]! * c - h.re[k]! * s;
    re[k] = r;
    im[k] = i;
    amplitudes.push(2 * Math.hypot(r, i));
    phasesDeg.push(deg(r, i));
    if (k >= 2) distortion += (2 * Math.hypot(r, i)) ** 2;
  }
  const m = Math.max(256, powerOfTwoAtLeast(4 * n));
  const value = Array.from(synthesize(re, im, m));
  const period = (2 * Math.PI) / omega;
  const fundamental = amplitudes[0] ?? 0;
  return {
    probe: text,
    amplitudes,
    phasesDeg,
    dc: re[0]!,
    thdPercent: fundamental > 0 ? (100 * Math.sqrt(distortion)) / fundamental : 0,
    waveform: { t: value.map((_, i) => (period * i) / m), value },
  };
}
