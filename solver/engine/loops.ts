import { type Circuit, GROUND, type LoopCut, type Part, type Warning } from "../types";
import type { Reading } from "./probes";

/** The new node a cut creates: NODE′ (the prime cannot occur in a netlist name). */
export const cutNodeName = (node: string) => `${node}′`;

type LoopBuild =
  | {
      ok: true;
      parts: Part[];
      nodes: string[];
      /** Sources of the system's second right-hand side (double injection), else empty. */
      second: Part[];
      reading: Reading;
      warning: Warning | null;
    }
  | { ok: false; message: string };

const IDEAL_VOLTAGE_OUTPUTS = new Set(["vsource", "vcvs", "ccvs"]);

/**
 * Whether a part other than the `moved` ones fixes the voltage of `node` (an ideal voltage output:
 * vsource, vcvs, ccvs, or an op-amp output without `rout`): then cutting at `node` is exact.
 */
function idealDriverAt(parts: Part[], node: string, moved: ReadonlySet<string>): boolean {
  return parts.some(
    (p) =>
      !moved.has(p.name) &&
      ((IDEAL_VOLTAGE_OUTPUTS.has(p.kind) && (p.nodes[0] === node || p.nodes[1] === node)) ||
        (p.kind === "opamp" && p.nodes[2] === node && !p.opamp?.rout)),
  );
}

/** Terminals of each kind that draw no current (op-amp inputs, controlled sources' sensing pair). */
const SENSING_TERMINALS: Partial<Record<Part["kind"], number[]>> = {
  opamp: [0, 1],
  vcvs: [2, 3],
  vccs: [2, 3],
};

/**
 * Whether cutting at `node` before the `moved` parts is exact: either an ideal voltage output fixes
 * the node, or every moved part touches the node only through terminals that draw no current (an
 * op-amp input, a controlled source's sensing pair), so opening the loop there unloads nothing.
 */
export function exactCutAt(parts: Part[], node: string, moved: ReadonlySet<string>): boolean {
  if (idealDriverAt(parts, node, moved)) return true;
  return parts
    .filter((p) => moved.has(p.name))
    .every((p) => {
      const sensing = SENSING_TERMINALS[p.kind] ?? [];
      return p.nodes.every((x, i) => x !== node || sensing.includes(i));
    });
}

/** A 1∠0° test source of a loop (1 V or 1 A), attributed to the loop's line. */
function testSource(name: string, kind: "vsource" | "isource", nodes: string[], loop: LoopCut): Part {
  return { name, kind, nodes, value: 1, phaseDeg: 0, span: loop.span };
}

/** The warning of a cut that leaves out the driver's loading (the language and the engine give the same). */
export function inexactCutMessage(loop: string, node: string): string {
  return (
    `loop ${loop}: node ${node} is not driven by an ideal voltage output, so the cut leaves out the ` +
    "driver's loading and T is approximate; add method=injection for a loop gain that includes it"
  );
}

/**
 * The circuit of one loop-gain trace. Every independent source of the netlist is zeroed (vsource
 * → 0 V, a short; isource → 0 A, an open), so T is the small-signal return ratio, and the listed
 * parts' terminals on NODE move to NODE′. See solver/engine/README.md.
 *  - `cut` (default): NODE′ is driven by an ideal 1∠0° V test source to gnd; T = v(NODE)/v(NODE′).
 *  - `injection`: NODE′ and NODE are joined again through a series test source (NODE′ → NODE), so
 *    the loop stays closed and loaded as it is; the first right-hand side sets it to 1 V, the
 *    second sets it to 0 V and injects 1 A from gnd into NODE′. T combines both (probes.ts
 *    `evalDoubleInjection`) and is exact whatever drives NODE.
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
  const nodes = [...circuit.nodes, cut];
  if (loop.method === "injection") {
    if (!circuit.parts.some((p) => !moved.has(p.name) && p.nodes.includes(node))) {
      return {
        ok: false,
        message: `loop ${loop.name}: every part on node ${node} is listed, so nothing drives the loop there`,
      };
    }
    const source = `${loop.name}′inject`;
    parts.push(testSource(source, "vsource", [cut, node], loop));
    return {
      ok: true,
      parts,
      nodes,
      second: [testSource(`${loop.name}′current`, "isource", [GROUND, cut], loop)],
      reading: { op: "double-injection", node, cut, source },
      warning: null,
    };
  }
  parts.push(testSource(`${loop.name}′test`, "vsource", [cut, GROUND], loop));
  return {
    ok: true,
    parts,
    nodes,
    second: [],
    reading: { op: "/", left: { op: "v", node }, right: { op: "v", node: cut } },
    warning: exactCutAt(circuit.parts, node, moved)
      ? null
      : { line: loop.span.line, message: inexactCutMessage(loop.name, node) },
  };
}
