import type { Circuit, MeasureDef, Part, Probe, Show, Sweep } from "@/solver/types";

const span = { line: 1, column: 1, endColumn: 2 };

/** A part by hand: kind, name, nodes, value (tests build Circuits without the language). */
export function part(
  kind: Part["kind"],
  name: string,
  nodes: string[],
  value = 0,
  extra: Partial<Part> = {},
): Part {
  return { name, kind, nodes, value, span, ...extra };
}

export const v = (node: string, ref?: string): Probe => (ref ? { op: "v", node, ref } : { op: "v", node });
export const div = (left: Probe, right: Probe): Probe => ({ op: "/", left, right });

export function show(name: string, probe: Probe): Show {
  return { name, probe, text: name, span };
}

export function measure(
  name: string,
  fn: MeasureDef["fn"],
  target: string,
  extra: Partial<MeasureDef> = {},
): MeasureDef {
  return { name, fn, target, span, ...extra };
}

/** A Circuit with the nodes collected from the parts. */
export function circuit(parts: Part[], extra: Partial<Circuit> = {}): Circuit {
  const nodes: string[] = [];
  for (const p of parts) for (const n of p.nodes) if (n !== "gnd" && !nodes.includes(n)) nodes.push(n);
  const sweep: Sweep = { kind: "log", start: 10, stop: 1e6, perDecade: 50 };
  return {
    title: null,
    parts,
    nodes,
    sweep,
    defaultSweep: false,
    shows: [],
    loops: [],
    measures: [],
    checks: [],
    vary: null,
    monteCarlo: null,
    poles: false,
    sensitivity: [],
    temperature: 300.15,
    steady: null,
    ...extra,
  };
}

/** A deterministic PRNG (mulberry32) for seeded random tests. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
