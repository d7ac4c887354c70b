/**
 * The nonlinear parts of a steady oscillation as ports of the linear rest of the network.
 *
 * Every limiter is a port with an input u into the linear network and a control variable w read
 * from it; the part imposes u(t) = f(w(t)) at every instant:
 *  - diodes between one pair of nodes (either way round) form one port: u is the current leaving
 *    the first node through the diodes, w the voltage across them, f the sum of their Shockley laws;
 *  - an op-amp with `swing` becomes an ideal voltage source of value u at its output (behind `rout`),
 *    and with w = u + c·(A(s)·(v+ − v−) − u), c > 0, u = clip(w, ±swing) holds exactly when the output
 *    is A(s)·(v+ − v−) clipped at ±swing (linear: w = u ⇒ A·vd = u; clipped high: u = swing, w ≥ swing
 *    ⇒ A·vd ≥ swing). c = 1/(1 − A0·D0), D0 = ∂(v+ − v−)/∂u at DC, makes w the output the amplifier
 *    would give without its limit (K·v+ for a non-inverting stage of gain K), a smooth signal, so a
 *    gain of 1e6 does not spoil the harmonics.
 * The linear network is the netlist with its independent sources zeroed (as for loop gain).
 */
import { DEFAULT_KELVIN, thermalVoltage } from "../../physics";
import { GROUND, type Part } from "../../types";
import { buildMna, type MnaSystem } from "../mna";

/** The open-loop gain of an op-amp with `swing` and no `gain` (NETLIST.md). */
export const SWING_DEFAULT_GAIN = 1e6;

export type Port =
  | {
      kind: "diodes";
      a: string;
      b: string;
      /** Each diode: +1 when it conducts from a to b, −1 the other way round. */
      diodes: { part: Part; sign: number }[];
      ia: number;
      ib: number;
    }
  | {
      kind: "swing";
      part: Part;
      swing: number;
      gain: number;
      tau: number;
      /** Unknown index of the source's branch row, and of the op-amp's inputs (−1 = gnd). */
      row: number;
      inP: number;
      inN: number;
      /** Scale c of the control variable (set once the DC response is known). */
      c: number;
    };

export interface PortNetwork {
  sys: MnaSystem;
  ports: Port[];
  notes: string[];
}

/** The diode current i(v) with the exponential continued linearly above 1 A (keeps Newton finite). */
export function diodeCurrent(part: Part, v: number): { i: number; g: number } {
  const d = part.diode ?? { is: 1e-14, n: 1, kelvin: DEFAULT_KELVIN };
  const nvt = d.n * thermalVoltage(d.kelvin);
  const vmax = nvt * Math.log(1 / d.is);
  if (v <= vmax) {
    const e = Math.exp(v / nvt);
    return { i: d.is * (e - 1), g: (d.is * e) / nvt };
  }
  const imax = 1 - d.is;
  const g = 1 / nvt;
  return { i: imax + g * (v - vmax), g };
}

/** The linear network and its ports, or the reason there is nothing to limit the amplitude. */
export function buildPorts(parts: Part[], nodes: string[]): PortNetwork | { reason: string } {
  const linear: Part[] = [];
  const groups = new Map<string, Part[]>();
  const swingParts: Part[] = [];
  const notes: string[] = [];
  const extraNodes: string[] = [];
  for (const p of parts) {
    if (p.kind === "vsource" || p.kind === "isource") linear.push({ ...p, value: 0 });
    else if (p.kind === "diode") {
      const key = [...p.nodes].sort().join("\u0000");
      groups.set(key, [...(groups.get(key) ?? []), p]);
    } else if (p.kind === "opamp" && p.opamp?.swing !== undefined) {
      swingParts.push(p);
      const out = p.nodes[2]!;
      const rout = p.opamp.rout ?? 0;
      const inner = rout > 0 ? `${out}′limit` : out;
      if (rout > 0) {
        extraNodes.push(inner);
        linear.push({ ...p, name: `${p.name}′rout`, kind: "resistor", nodes: [inner, out], value: rout });
      }
      linear.push({ ...p, name: `${p.name}′source`, kind: "vsource", nodes: [inner, GROUND], value: 0 });
    } else linear.push(p);
  }
  if (groups.size === 0 && swingParts.length === 0)
    return {
      reason:
        "nothing in the netlist limits the amplitude: it grows until the supply does; add `swing=` to the op-amp",
    };
  const built = buildMna(linear, [...nodes, ...extraNodes]);
  if (!built.ok) return { reason: built.errors[0]?.message ?? "the network could not be built" };
  const sys = built.system;
  const ix = (name: string) => (name === GROUND ? -1 : (sys.nodeIndex.get(name) ?? -1));
  const ports: Port[] = [];
  for (const list of groups.values()) {
    const [a, b] = list[0]!.nodes as [string, string];
    if (a === b) continue;
    ports.push({
      kind: "diodes",
      a,
      b,
      diodes: list.map((part) => ({ part, sign: part.nodes[0] === a ? 1 : -1 })),
      ia: ix(a),
      ib: ix(b),
    });
  }
  for (const p of swingParts) {
    const o = p.opamp!;
    if (o.gain === undefined)
      notes.push(
        `${p.name}: swing without gain: an open-loop gain of 1e6 is used for the steady oscillation`,
      );
    ports.push({
      kind: "swing",
      part: p,
      swing: o.swing!,
      gain: o.gain ?? SWING_DEFAULT_GAIN,
      tau: o.gbw ? 1 / (2 * Math.PI * o.gbw) : 0,
      row: sys.branchIndex.get(`${p.name}′source`)!,
      inP: ix(p.nodes[0]!),
      inN: ix(p.nodes[1]!),
      c: 1,
    });
  }
  return { sys, ports, notes };
}

/** u = f(w) and its slope du/dw for one port at one instant. */
export function portLaw(port: Port, w: number): { u: number; g: number } {
  if (port.kind === "swing") {
    if (w > port.swing) return { u: port.swing, g: 0 };
    if (w < -port.swing) return { u: -port.swing, g: 0 };
    return { u: w, g: 1 };
  }
  let u = 0;
  let g = 0;
  for (const d of port.diodes) {
    const r = diodeCurrent(d.part, d.sign * w);
    u += d.sign * r.i;
    g += r.g;
  }
  return { u, g };
}
