/**
 * Parts added, removed or changed between two netlists (the compare page, `phasewright against`):
 * each netlist compiled, parts matched by full name, values compared in SI units.
 */
import { compile } from "@/solver/lang";
import type { NetlistError, Part } from "@/solver/types";

/** A part as the comparison shows it: kind, nodes, value in SI units and its options. */
export interface PartSummary {
  kind: Part["kind"];
  nodes: string[];
  value: number;
  /** Options as written in text, e.g. `tol=1%`, `gbw=1000000`. */
  options: string[];
}

export interface PartChange {
  name: string;
  change: "added" | "removed" | "changed";
  before: PartSummary | null;
  after: PartSummary | null;
  /** What differs for a changed part: "kind", "nodes", "value" and/or "options". */
  fields: ("kind" | "nodes" | "value" | "options")[];
}

function summarize(p: Part): PartSummary {
  const options: string[] = [];
  if (p.tol !== undefined) options.push(`tol=${+(p.tol * 100).toPrecision(12)}%`);
  if (p.phaseDeg !== undefined) options.push(`phase=${p.phaseDeg}`);
  if (p.sense !== undefined) options.push(`sense=${p.sense}`);
  if (p.opamp?.gain !== undefined) options.push(`gain=${p.opamp.gain}`);
  if (p.opamp?.gbw !== undefined) options.push(`gbw=${p.opamp.gbw}`);
  if (p.opamp?.swing !== undefined) options.push(`swing=${p.opamp.swing}`);
  if (p.diode !== undefined) options.push(`is=${p.diode.is}`, `n=${p.diode.n}`);
  if (p.opamp?.rout !== undefined) options.push(`rout=${p.opamp.rout}`);
  return { kind: p.kind, nodes: [...p.nodes], value: p.value, options };
}

/** Equal, or within 1e-12 of each other relative to the larger (values and grids of two solves). */
export function sameValue(x: number, y: number): boolean {
  return x === y || Math.abs(x - y) <= 1e-12 * Math.max(Math.abs(x), Math.abs(y));
}

/** Parts added, removed or changed between two netlists, by full part name (block parts as `X1.R1`). */
export function compareParts(
  a: string,
  b: string,
): { parts: PartChange[]; errors: { a: NetlistError[]; b: NetlistError[] } } {
  const ca = compile(a);
  const cb = compile(b);
  const errors = { a: ca.ok ? [] : ca.errors, b: cb.ok ? [] : cb.errors };
  if (!ca.ok || !cb.ok) return { parts: [], errors };
  const before = new Map(ca.circuit.parts.map((p) => [p.name, summarize(p)]));
  const after = new Map(cb.circuit.parts.map((p) => [p.name, summarize(p)]));
  const parts: PartChange[] = [];
  for (const [name, old] of before) {
    const now = after.get(name);
    if (!now) {
      parts.push({ name, change: "removed", before: old, after: null, fields: [] });
      continue;
    }
    const fields: PartChange["fields"] = [];
    if (old.kind !== now.kind) fields.push("kind");
    if (old.nodes.join(" ") !== now.nodes.join(" ")) fields.push("nodes");
    if (!sameValue(old.value, now.value)) fields.push("value");
    if (old.options.join(" ") !== now.options.join(" ")) fields.push("options");
    if (fields.length > 0) parts.push({ name, change: "changed", before: old, after: now, fields });
  }
  for (const [name, now] of after) {
    if (!before.has(name)) parts.push({ name, change: "added", before: null, after: now, fields: [] });
  }
  return { parts, errors };
}
