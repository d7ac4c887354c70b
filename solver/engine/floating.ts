import { GROUND } from "../types";
import type { MnaSystem } from "./mna";

/**
 * Nodes with no path to gnd through parts that conduct at frequency f (capacitors are open at
 * 0 Hz; current sources never conduct; an op-amp output connects its out pin to gnd).
 * Union–find over the nodes, O(parts·α).
 */
export function floatingNodes(sys: MnaSystem, f: number): string[] {
  const gnd = sys.nodeCount;
  const parent = Array.from({ length: gnd + 1 }, (_, i) => i);
  const find = (i: number): number => {
    let r = i;
    while (parent[r] !== r) r = parent[r]!;
    while (parent[i] !== r) {
      const next = parent[i]!;
      parent[i] = r;
      i = next;
    }
    return r;
  };
  const idx = (name: string | undefined) =>
    name === undefined || name === GROUND ? gnd : sys.nodeIndex.get(name)!;
  const join = (a: string | undefined, b: string | undefined) => {
    parent[find(idx(a))] = find(idx(b));
  };
  for (const p of sys.parts) {
    const [a, b, ,] = p.nodes;
    switch (p.kind) {
      case "capacitor":
        if (f > 0 && p.value !== 0) join(a, b);
        break;
      case "resistor":
      case "inductor":
      case "vsource":
      case "vcvs":
      case "ccvs":
        join(a, b);
        break;
      case "opamp":
        join(p.nodes[2], GROUND);
        break;
      default:
        break;
    }
  }
  const root = find(gnd);
  const out: string[] = [];
  for (const [name, i] of sys.nodeIndex) if (find(i) !== root) out.push(name);
  return out;
}

/**
 * A loop of parts that each fix a voltage between their terminals at frequency f (vsource, vcvs,
 * ccvs, an op-amp's output without `rout` to gnd, an inductor at 0 Hz): their voltages are
 * over-determined and their currents undetermined, so the equations are singular whatever the
 * values. Returns the names of the first such loop found, in loop order, or [] when none.
 * Spanning forest by union–find plus a path search in the forest, O(parts·α + nodes).
 */
export function voltageLoop(sys: MnaSystem, f: number): string[] {
  const gnd = sys.nodeCount;
  const parent = Array.from({ length: gnd + 1 }, (_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]!]!;
      i = parent[i]!;
    }
    return i;
  };
  const idx = (name: string | undefined) =>
    name === undefined || name === GROUND ? gnd : sys.nodeIndex.get(name)!;
  const adj: { to: number; part: string }[][] = Array.from({ length: gnd + 1 }, () => []);
  for (const p of sys.parts) {
    let ends: [string | undefined, string | undefined] | null = null;
    if (p.kind === "vsource" || p.kind === "vcvs" || p.kind === "ccvs") ends = [p.nodes[0], p.nodes[1]];
    else if (p.kind === "inductor" && f === 0) ends = [p.nodes[0], p.nodes[1]];
    else if (p.kind === "opamp" && !(p.opamp?.rout && p.opamp.rout > 0)) ends = [p.nodes[2], GROUND];
    if (!ends) continue;
    const a = idx(ends[0]);
    const b = idx(ends[1]);
    if (find(a) === find(b)) return [...forestPath(adj, a, b), p.name];
    parent[find(a)] = find(b);
    adj[a]!.push({ to: b, part: p.name });
    adj[b]!.push({ to: a, part: p.name });
  }
  return [];
}

/** Parts on the forest path from a to b (both in one tree). */
function forestPath(adj: { to: number; part: string }[][], a: number, b: number): string[] {
  const via = new Map<number, { from: number; part: string }>([[a, { from: -1, part: "" }]]);
  const queue = [a];
  while (queue.length > 0 && !via.has(b)) {
    const u = queue.shift()!;
    for (const e of adj[u]!) {
      if (via.has(e.to)) continue;
      via.set(e.to, { from: u, part: e.part });
      queue.push(e.to);
    }
  }
  const out: string[] = [];
  for (let u = b; u !== a && via.has(u); u = via.get(u)!.from) out.push(via.get(u)!.part);
  return out.reverse();
}
