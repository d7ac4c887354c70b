import { type Circuit, GROUND, type LoopCut, type Part, type Probe, type Warning } from "../types";

/** The new node a cut creates: NODE′ (the prime cannot occur in a netlist name). */
export const cutNodeName = (node: string) => `${node}′`;

export type LoopBuild =
  | { ok: true; parts: Part[]; nodes: string[]; probe: Probe; warning: Warning | null }
  | { ok: false; message: string };

const IDEAL_VOLTAGE_OUTPUTS = new Set(["vsource", "vcvs", "ccvs"]);

/**
 * The circuit of one loop-gain trace: the listed parts' terminals on NODE move to NODE′, NODE′ is
 * driven by an ideal 1∠0° V test source to gnd, and every independent source of the netlist is
 * zeroed (vsource → 0 V, a short; isource → 0 A, an open), so T = v(NODE)/v(NODE′) is the
 * small-signal return ratio. See solver/engine/README.md.
 */
export function buildLoop(circuit: Circuit, loop: LoopCut): LoopBuild {
  const node = loop.node;
  if (node === GROUND) return { ok: false, message: `loop ${loop.name}: gnd cannot be cut` };
  if (!circuit.nodes.includes(node))
    return { ok: false, message: `loop ${loop.name}: no node named ${node}` };
  const cut = cutNodeName(node);
  const moved = new Set(loop.before);
  for (const name of loop.before) {
    const p = circuit.parts.find((q) => q.name === name);
    if (!p) return { ok: false, message: `loop ${loop.name}: no part named ${name}` };
    if (!p.nodes.includes(node))
      return { ok: false, message: `loop ${loop.name}: ${name} does not touch node ${node}` };
  }
  const parts: Part[] = circuit.parts.map((p) => {
    let q = p;
    if (moved.has(p.name)) q = { ...q, nodes: p.nodes.map((x) => (x === node ? cut : x)) };
    if (p.kind === "vsource" || p.kind === "isource") q = { ...q, value: 0 };
    return q;
  });
  parts.push({
    name: `${loop.name}′test`,
    kind: "vsource",
    nodes: [cut, GROUND],
    value: 1,
    phaseDeg: 0,
    span: loop.span,
  });
  const ideal = parts.some(
    (p) =>
      !moved.has(p.name) &&
      ((IDEAL_VOLTAGE_OUTPUTS.has(p.kind) && (p.nodes[0] === node || p.nodes[1] === node)) ||
        (p.kind === "opamp" && p.nodes[2] === node && !p.opamp?.rout)),
  );
  const warning: Warning | null = ideal
    ? null
    : {
        line: loop.span.line,
        message:
          `loop ${loop.name}: node ${node} is not driven by an ideal voltage output, so the cut leaves out ` +
          "the driver's loading and T is approximate",
      };
  return {
    ok: true,
    parts,
    nodes: [...circuit.nodes, cut],
    probe: { op: "/", left: { op: "v", node }, right: { op: "v", node: cut } },
    warning,
  };
}
