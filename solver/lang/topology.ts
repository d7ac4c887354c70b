/**
 * Structure checks on the flat part list: open ends, shorted parts, loops of parts that each fix a
 * voltage, and nodes with no path to gnd. Graph walks are O(parts + nodes).
 */
import type { NetlistError, Part, Warning } from "../types";

/** The pairs of nodes a part ties together by conduction (current sources and sensing inputs don't). */
function conductingPairs(p: Part): [string, string][] {
  switch (p.kind) {
    case "resistor":
    case "capacitor":
    case "inductor":
    case "vsource":
    case "vcvs":
    case "ccvs":
    case "diode":
      return [[p.nodes[0]!, p.nodes[1]!]];
    case "opamp":
      return [[p.nodes[2]!, "gnd"]];
    default:
      return [];
  }
}

/** The node pair whose voltage a part fixes, if any. */
function voltagePair(p: Part): [string, string] | null {
  if (p.kind === "vsource" || p.kind === "vcvs" || p.kind === "ccvs") return [p.nodes[0]!, p.nodes[1]!];
  if (p.kind === "opamp" && !(p.opamp?.rout ?? 0)) return [p.nodes[2]!, "gnd"];
  return null;
}

export function checkTopology(parts: Part[], errors: NetlistError[], warnings: Warning[]): void {
  if (parts.length === 0) {
    errors.push({
      line: 1,
      column: 1,
      endColumn: 2,
      message: "the netlist has no parts",
      hint: "add parts such as `R1: resistor in out 10k`",
    });
    return;
  }
  openEnds(parts, warnings);
  voltageLoops(parts, errors);
  groundPaths(parts, errors);
}

function openEnds(parts: Part[], warnings: Warning[]): void {
  // Per node: how many parts touch it (part names are unique after flattening) and the first one.
  // Counts, not a set of names per node: gnd alone is touched by most parts.
  const touching = new Map<string, { count: number; first: Part }>();
  for (const p of parts) {
    const nodes = p.nodes;
    if (nodes.length > 0 && nodes.every((n) => n === nodes[0]) && p.kind !== "vsource") {
      warnings.push({
        line: p.span.line,
        message: `every terminal of ${p.name} is on node ${nodes[0]}, so it does nothing`,
      });
    }
    for (let i = 0; i < nodes.length; i++) {
      const n = nodes[i]!;
      if (nodes.indexOf(n) < i) continue; // counted already for this part
      const seen = touching.get(n);
      if (seen === undefined) touching.set(n, { count: 1, first: p });
      else seen.count++;
    }
  }
  for (const [n, { count, first: p }] of touching) {
    if (n === "gnd" || count !== 1) continue;
    warnings.push({
      line: p.span.line,
      message: `node ${n} connects only to ${p.name}: that terminal is left open`,
    });
  }
}

function voltageLoops(parts: Part[], errors: NetlistError[]): void {
  const adjacency = new Map<string, { to: string; part: Part }[]>();
  const edge = (a: string, b: string, part: Part) => {
    if (!adjacency.has(a)) adjacency.set(a, []);
    adjacency.get(a)!.push({ to: b, part });
  };
  for (const p of parts) {
    const pair = voltagePair(p);
    if (pair === null) continue;
    const [a, b] = pair;
    const path = a === b ? [] : findPath(adjacency, a, b);
    if (path !== null) {
      const names = [...path.map((x) => x.name), p.name];
      const message =
        a === b
          ? `${p.name} fixes the voltage between a node and itself (both ends on ${a})`
          : `${names.join(", ")} each fix a voltage around one closed loop, so their voltages can't all hold`;
      errors.push({ ...p.span, message, hint: "put a resistor in the loop or remove one of these parts" });
      continue;
    }
    edge(a, b, p);
    edge(b, a, p);
  }
}

/** Breadth-first path from a to b; the parts along it, or null when b can't be reached. */
function findPath(adjacency: Map<string, { to: string; part: Part }[]>, a: string, b: string): Part[] | null {
  const from = new Map<string, { node: string; part: Part } | null>([[a, null]]);
  const queue = [a];
  while (queue.length > 0) {
    const n = queue.shift()!;
    if (n === b) {
      const path: Part[] = [];
      for (let step = from.get(b); step; step = from.get(step.node)) path.push(step.part);
      return path.reverse();
    }
    for (const e of adjacency.get(n) ?? []) {
      if (from.has(e.to)) continue;
      from.set(e.to, { node: n, part: e.part });
      queue.push(e.to);
    }
  }
  return null;
}

function groundPaths(parts: Part[], errors: NetlistError[]): void {
  // Union-find with full path compression: near-linear in parts + nodes.
  const parent = new Map<string, string>();
  const find = (x: string): string => {
    let r = x;
    while (parent.get(r) !== r) r = parent.get(r) ?? r;
    for (let y = x; y !== r; ) {
      const next = parent.get(y)!;
      parent.set(y, r);
      y = next;
    }
    return r;
  };
  const add = (x: string) => {
    if (!parent.has(x)) parent.set(x, x);
  };
  add("gnd");
  for (const p of parts) {
    for (const n of p.nodes) add(n);
    for (const [a, b] of conductingPairs(p)) parent.set(find(a), find(b));
  }
  if (!parts.some((p) => p.nodes.includes("gnd"))) {
    const looksLikeGround = [...parent.keys()].find((n) => /^(gnd|ground)$/i.test(n) && n !== "gnd");
    errors.push({
      ...parts[0]!.span,
      message: "nothing connects to gnd, so no voltage has a reference",
      hint: looksLikeGround
        ? `ground is \`gnd\`, not ${looksLikeGround}`
        : "connect the circuit's reference node to gnd",
    });
    return;
  }
  const ground = find("gnd");
  const floating = new Map<string, string[]>();
  for (const n of parent.keys()) {
    const root = find(n);
    if (root === ground) continue;
    if (!floating.has(root)) floating.set(root, []);
    floating.get(root)!.push(n);
  }
  for (const nodes of floating.values()) {
    const first = parts.find((p) => p.nodes.some((n) => nodes.includes(n)))!;
    const list = nodes.map((n) => `\`${n}\``).join(", ");
    errors.push({
      ...first.span,
      message: `${nodes.length === 1 ? "node" : "nodes"} ${list} ${nodes.length === 1 ? "has" : "have"} no path to gnd`,
      hint: "a node needs a path to gnd through resistors, capacitors, inductors or voltage sources; current sources and sensing inputs don't count",
    });
  }
}
