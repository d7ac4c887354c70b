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
