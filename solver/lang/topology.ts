/**
 * Structure checks on the flat part list: open ends, shorted parts, loops of parts that each fix a
 * voltage, and nodes with no path to gnd. Graph walks are O(parts + nodes).
 */
import type { NetlistError, Part, Warning } from "../types";

/**
 * Call `join` for each pair of nodes a part ties together by conduction (current sources and sensing
 * inputs don't). A callback, not a list of pairs: this runs once per part, mostly cold, where every
 * array made and dropped per part costs (see the note in tokens.ts above `lex`).
 */
function joinConducting(p: Part, join: (a: string, b: string) => void): void {
  switch (p.kind) {
    case "resistor":
    case "capacitor":
    case "inductor":
    case "vsource":
    case "vcvs":
    case "ccvs":
    case "diode":
      join(p.nodes[0]!, p.nodes[1]!);
      return;
    case "opamp":
      join(p.nodes[2]!, "gnd");
      return;
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
  const nodes = numberNodes(parts);
  openEnds(parts, nodes, warnings);
  voltageLoops(parts, errors);
  groundPaths(parts, nodes, errors);
}

/**
 * The nodes numbered in first-seen order, gnd first (0). The checks below count and join by number
 * in typed arrays rather than in maps by name: they run once per part, mostly cold (see
 * `joinConducting`).
 */
interface NodeNumbers {
  names: string[];
  index: Map<string, number>;
}

function numberNodes(parts: Part[]): NodeNumbers {
  const names = ["gnd"];
  const index = new Map<string, number>();
  index.set("gnd", 0);
  for (let k = 0; k < parts.length; k++) {
    const nodes = parts[k]!.nodes;
    for (let i = 0; i < nodes.length; i++) {
      const n = nodes[i]!;
      if (!index.has(n)) {
        index.set(n, names.length);
        names.push(n);
      }
    }
  }
  return { names, index };
}

function openEnds(parts: Part[], { names, index }: NodeNumbers, warnings: Warning[]): void {
  // Per node: how many parts touch it (part names are unique after flattening) and the first one.
  // Counts, not a set of names per node: gnd alone is touched by most parts.
  const counts = new Int32Array(names.length);
  const firsts: Part[] = new Array(names.length);
  for (let k = 0; k < parts.length; k++) {
    const p = parts[k]!;
    const nodes = p.nodes;
    if (nodes.length > 0 && p.kind !== "vsource") {
      let same = true;
      for (let i = 1; i < nodes.length && same; i++) same = nodes[i] === nodes[0];
      if (same) {
        warnings.push({
          line: p.span.line,
          message: `every terminal of ${p.name} is on node ${nodes[0]}, so it does nothing`,
        });
      }
    }
    for (let i = 0; i < nodes.length; i++) {
      const n = nodes[i]!;
      if (nodes.indexOf(n) < i) continue; // counted already for this part
      const at = index.get(n)!;
      const count = counts[at]!;
      if (count === 0) firsts[at] = p;
      counts[at] = count + 1;
    }
  }
  for (let at = 1; at < names.length; at++) {
    if (counts[at] !== 1) continue;
    const p = firsts[at]!;
    warnings.push({
      line: p.span.line,
      message: `node ${names[at]} connects only to ${p.name}: that terminal is left open`,
    });
  }
}

function voltageLoops(parts: Part[], errors: NetlistError[]): void {
  const adjacency = new Map<string, { to: string; part: Part }[]>();
  const edge = (a: string, b: string, part: Part) => {
    if (!adjacency.has(a)) adjacency.set(a, []);
    adjacency.get(a)!.push({ to: b, part });
  };
  for (let k = 0; k < parts.length; k++) {
    const p = parts[k]!;
    const pair = voltagePair(p);
    if (pair === null) continue;
    const a = pair[0];
    const b = pair[1];
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

function groundPaths(parts: Part[], { names, index }: NodeNumbers, errors: NetlistError[]): void {
  // Union-find over node numbers with full path compression: near-linear in parts + nodes.
  const parent = new Int32Array(names.length);
  for (let i = 0; i < parent.length; i++) parent[i] = i;
  const find = (x: number): number => {
    let r = x;
    while (parent[r] !== r) r = parent[r]!;
    for (let y = x; y !== r; ) {
      const next = parent[y]!;
      parent[y] = r;
      y = next;
    }
    return r;
  };
  const join = (a: string, b: string) => {
    parent[find(index.get(a)!)] = find(index.get(b)!);
  };
  for (let k = 0; k < parts.length; k++) joinConducting(parts[k]!, join);
  if (!parts.some((p) => p.nodes.includes("gnd"))) {
    const looksLikeGround = names.find((n) => /^(gnd|ground)$/i.test(n) && n !== "gnd");
    errors.push({
      ...parts[0]!.span,
      message: "nothing connects to gnd, so no voltage has a reference",
      hint: looksLikeGround
        ? `ground is \`gnd\`, not ${looksLikeGround}`
        : "connect the circuit's reference node to gnd",
    });
    return;
  }
  const ground = find(0);
  const floating = new Map<number, string[]>();
  for (let n = 0; n < names.length; n++) {
    const root = find(n);
    if (root === ground) continue;
    if (!floating.has(root)) floating.set(root, []);
    floating.get(root)!.push(names[n]!);
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
